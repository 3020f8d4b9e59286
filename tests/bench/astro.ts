/**
 * Benchmark of the science core. Prints one JSON line with the sizes and wall-clock seconds.
 * Targets on a 2-core machine: 1 000 000 kinematic distances < 1 s; 10 000 sources × 1 000
 * Monte Carlo draws < 5 s. Run with `npm run bench:astro`.
 */

import { performance } from 'node:perf_hooks';
import { kinematicDistancesBulk, monteCarloDistancesBulk } from '@/lib/astro/kinematic-distance';
import { makeRotationCurve } from '@/lib/astro/rotation-curves';
import { makeRng } from '@/lib/stats/rng';

function sources(n: number, seed: number) {
  const rng = makeRng(seed);
  const l = new Float64Array(n);
  const b = new Float64Array(n);
  const v = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    l[i] = rng.next() * 360;
    b[i] = (rng.next() - 0.5) * 4;
    v[i] = (rng.next() - 0.5) * 300;
  }
  return { l, b, v };
}

const curve = makeRotationCurve('reid-2014');

const kdCount = 1_000_000;
const kdInput = sources(kdCount, 1);
kinematicDistancesBulk(
  kdInput.l.subarray(0, 10_000),
  kdInput.b.subarray(0, 10_000),
  kdInput.v.subarray(0, 10_000),
  curve,
);
const t0 = performance.now();
const kd = kinematicDistancesBulk(kdInput.l, kdInput.b, kdInput.v, curve);
const kdSeconds = (performance.now() - t0) / 1000;
let solved = 0;
for (let i = 0; i < kdCount; i++) if (kd.RKpc[i] === kd.RKpc[i]) solved++;

const mcSources = 10_000;
const draws = 1000;
const mcInput = sources(mcSources, 2);
const t1 = performance.now();
const mc = monteCarloDistancesBulk(mcInput.l, mcInput.b, mcInput.v, 3, curve, { draws, seed: 1 });
const mcSeconds = (performance.now() - t1) / 1000;
let withFar = 0;
for (let i = 0; i < mcSources; i++) if (mc.farFraction[i] > 0) withFar++;

console.log(
  JSON.stringify({
    curve: curve.name,
    kinematicDistances: kdCount,
    kdSeconds: Number(kdSeconds.toFixed(3)),
    kdSolved: solved,
    monteCarloSources: mcSources,
    draws,
    mcSeconds: Number(mcSeconds.toFixed(3)),
    mcWithFarRoot: withFar,
  }),
);
