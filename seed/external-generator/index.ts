/**
 * A synthetic nearby spiral (invented) for the external-galaxy ordering analysis. Particles on
 * circular orbits in a rising-then-flat rotation curve meet an m-armed log-spiral ridge that
 * rotates rigidly at Ω_p. A cloud is born when its orbit crosses a ridge and is seen as gas for
 * visibleMyr; its HII region appears delayMyr after the crossing, at the orbit's then position,
 * and is seen for visibleMyr. Each particle's crossings are solved along its orbit
 * (`./model`), so the offsets follow from the orbits, not from the analysis's formula. The disc is
 * put on the sky in 3-D with perspective (`./sky`); positional scatter and unrelated sources
 * (uniform in azimuth) are added. delayMyr = 0 is the "no drift" galaxy.
 */
import { KMS_KPC_PER_MYR } from '@/lib/astro/pattern-speed';
import { makeRng } from '@/lib/stats/rng';
import type { TracerKind } from '@/lib/ordering/types';
import type { ExternalGalaxy } from '@/lib/external/types';
import {
  crossingAgeMyr,
  arctanCurveKms,
  circularOrbit,
  ridgeAzimuthAt,
  type SpiralPattern,
} from './model';
import { discToSky, type SkyPlacement } from './sky';

/** Everything the generator takes; see {@link DEFAULT_EXTERNAL_PARAMS} for invented values. */
export type ExternalGeneratorParams = {
  seed: number;
  gasCount: number;
  youngCount: number;
  /** Fraction of each class's sources that are unrelated to the arms. */
  unrelatedFraction: number;
  /** Gaussian positional scatter in the disc, per axis (pc). */
  scatterPc: number;
  RMinKpc: number;
  RMaxKpc: number;
  /** Exponential scale length of the disc's surface density (kpc). */
  scaleLengthKpc: number;
  pattern: SpiralPattern;
  /** Time from a cloud's birth at the ridge to its HII region's appearance (Myr). */
  delayMyr: number;
  /** How long a cloud, and an HII region, stays visible (Myr). */
  visibleMyr: number;
  vFlatKms: number;
  turnoverKpc: number;
  sky: SkyPlacement;
  gasKind: TracerKind;
  youngKind: TracerKind;
};

/** Invented defaults: a two-armed spiral at 12 Mpc seen at 45°. */
export const DEFAULT_EXTERNAL_PARAMS: ExternalGeneratorParams = {
  seed: 1,
  gasCount: 20_000,
  youngCount: 20_000,
  unrelatedFraction: 0.1,
  scatterPc: 40,
  RMinKpc: 2,
  RMaxKpc: 12,
  scaleLengthKpc: 5,
  pattern: { m: 2, pitchDeg: 20, phaseDeg: 30, RRefKpc: 6, patternSpeedKmsKpc: 24 },
  delayMyr: 6,
  visibleMyr: 3,
  vFlatKms: 200,
  turnoverKpc: 1.5,
  sky: {
    centerRaDeg: 201.37,
    centerDecDeg: 22.85,
    distanceMpc: 12,
    inclinationDeg: 45,
    positionAngleDeg: 68,
    rotation: 'counterclockwise',
  },
  gasKind: 'co',
  youngKind: 'hii',
};

/** The synthetic catalog: positions and kinds, the galaxy to analyse it with, and the truth. */
export type ExternalSyntheticGalaxy = {
  raDeg: Float64Array;
  decDeg: Float64Array;
  kind: TracerKind[];
  galaxy: ExternalGalaxy;
  truth: {
    RKpc: Float64Array;
    phiRad: Float64Array;
    /** Myr since the ridge crossing that made the source; NaN for unrelated sources. */
    ageMyr: Float64Array;
    unrelated: Uint8Array;
    corotationKpc: number | null;
  };
  params: ExternalGeneratorParams;
};

/** Generates the galaxy for params (defaults for anything left out). */
export function generateExternalGalaxy(
  overrides: Partial<ExternalGeneratorParams> = {},
): ExternalSyntheticGalaxy {
  const params = { ...DEFAULT_EXTERNAL_PARAMS, ...overrides };
  const rng = makeRng(params.seed);
  const { pattern } = params;
  const vAt = (R: number) => arctanCurveKms(R, params.vFlatKms, params.turnoverKpc);

  const drawRadius = (): number => {
    const a = params.RMinKpc ** 2;
    const b = params.RMaxKpc ** 2;
    for (;;) {
      const R = Math.sqrt(a + rng.next() * (b - a));
      if (rng.next() < Math.exp(-(R - params.RMinKpc) / params.scaleLengthKpc)) return R;
    }
  };

  const R: number[] = [];
  const phi: number[] = [];
  const age: number[] = [];
  const unrelated: number[] = [];
  const kind: TracerKind[] = [];
  // Proposals only near the ridges: no orbit drifts from a ridge faster than the largest
  // |Ω − Ω_p| over the disc, so no crossing in the age range lies farther away (20 % margin).
  let maxDrift = 0;
  for (let r = params.RMinKpc; r <= params.RMaxKpc; r += 0.01)
    maxDrift = Math.max(maxDrift, Math.abs(vAt(r) / r - pattern.patternSpeedKmsKpc));
  const addClass = (count: number, k: TracerKind, fromMyr: number) => {
    const untied = Math.round(count * params.unrelatedFraction);
    const toMyr = fromMyr + params.visibleMyr;
    const halfWindow = Math.min(
      Math.PI / pattern.m,
      1.2 * maxDrift * KMS_KPC_PER_MYR * toMyr + 0.05,
    );
    for (let made = 0; made < count - untied;) {
      const r = drawRadius();
      const ridge = ridgeAzimuthAt(pattern, r);
      const arm = Math.floor(rng.next() * pattern.m);
      const phiNow = ridge(0) + (2 * Math.PI * arm) / pattern.m + (2 * rng.next() - 1) * halfWindow;
      const a = crossingAgeMyr(circularOrbit(vAt(r) / r, phiNow), ridge, pattern.m, fromMyr, toMyr);
      if (a === null) continue;
      R.push(r);
      phi.push(phiNow);
      age.push(a);
      unrelated.push(0);
      kind.push(k);
      made++;
    }
    for (let u = 0; u < untied; u++) {
      R.push(drawRadius());
      phi.push(rng.next() * 2 * Math.PI);
      age.push(NaN);
      unrelated.push(1);
      kind.push(k);
    }
  };
  addClass(params.gasCount, params.gasKind, 0);
  addClass(params.youngCount, params.youngKind, params.delayMyr);

  const sigmaKpc = params.scatterPc / 1000;
  const RKpc = new Float64Array(R.length);
  const phiRad = new Float64Array(R.length);
  for (let i = 0; i < R.length; i++) {
    const x = R[i] * Math.cos(phi[i]) + sigmaKpc * rng.normal();
    const y = R[i] * Math.sin(phi[i]) + sigmaKpc * rng.normal();
    RKpc[i] = Math.hypot(x, y);
    phiRad[i] = Math.atan2(y, x);
  }
  const { raDeg, decDeg } = discToSky(RKpc, phiRad, params.sky);
  // The analysis is given the curve as a measured table would be, every 0.5 kpc.
  const points: [number, number][] = [];
  for (let r = 0.5; r <= params.RMaxKpc + 1; r += 0.5) points.push([r, vAt(r)]);
  return {
    raDeg,
    decDeg,
    kind,
    galaxy: { ...params.sky, rotationCurve: { kind: 'table', points } },
    truth: {
      RKpc,
      phiRad,
      ageMyr: Float64Array.from(age),
      unrelated: Uint8Array.from(unrelated),
      corotationKpc: corotation(vAt, pattern.patternSpeedKmsKpc),
    },
    params,
  };
}

/** Radius (kpc) where V(R)/R = Ω_p, by bisection over 0.01–100 kpc; null when outside. */
function corotation(vAt: (R: number) => number, speed: number): number | null {
  let lo = 0.01;
  let hi = 100;
  if (!(vAt(lo) / lo > speed && vAt(hi) / hi < speed)) return null;
  while (hi - lo > 1e-10) {
    const mid = 0.5 * (lo + hi);
    if (vAt(mid) / mid > speed) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}
