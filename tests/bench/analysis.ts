/**
 * Benchmark of the ordering analysis: 10 000 complexes of the synthetic demo galaxy, 200 Monte
 * Carlo distance draws each (velocity, streaming, R0 and Θ0 of the Reid et al. 2014 curve,
 * near/far), 2 000 nested-bootstrap resamples, tangent-point and l–v offsets and the pattern fit.
 * Prints one JSON line with the sizes and the wall-clock seconds of runOrderingAnalysis (galaxy
 * generation not included). Target on this 2-core machine: ≤ 15 s. Run with
 * `npm run bench:analysis`.
 */
import { performance } from 'node:perf_hooks';
import { makeRotationCurve } from '@/lib/astro/rotation-curves';
import { runOrderingAnalysis } from '@/lib/ordering';
import { generateGalaxy } from '@/seed/generator';
import { complexesFromGalaxy, settingsFromGalaxy } from '../unit/ordering/from-generator';

const COMPLEXES = 10_000;
const RESAMPLES = 2000;
const MC_DRAWS = 200;
const TARGET_SECONDS = 15;

const galaxy = generateGalaxy({ seed: 2024, complexes: COMPLEXES, interlopers: 0 });
const { complexes } = complexesFromGalaxy(galaxy);
const settings = settingsFromGalaxy(galaxy, {
  curve: makeRotationCurve('reid-2014'),
  R0ErrKpc: 0.16,
  theta0ErrKms: 8,
  resamples: RESAMPLES,
  mcDraws: MC_DRAWS,
});
const members = complexes.reduce((s, c) => s + c.members.length, 0);

const t0 = performance.now();
const result = runOrderingAnalysis(complexes, settings);
const seconds = (performance.now() - t0) / 1000;

console.log(
  JSON.stringify({
    complexes: COMPLEXES,
    members,
    resamples: RESAMPLES,
    mcDraws: MC_DRAWS,
    used: result.exclusions.used,
    youngMinusGasKpc: result.youngMinusGas.medianOffsetKpc,
    seconds: Number(seconds.toFixed(3)),
    targetSeconds: TARGET_SECONDS,
    peakRssMb: Math.round(process.memoryUsage().rss / 1e6),
  }),
);
