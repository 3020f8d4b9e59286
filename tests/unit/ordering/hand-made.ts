/**
 * Small hand-made inputs for the ordering tests: a flat rotation curve, one test arm, and
 * helpers that put members at chosen Galactocentric positions and return what the Sun sees.
 */
import type { ArmSpec } from '@/lib/astro/arms';
import { fromGalactocentric } from '@/lib/astro/galactocentric';
import { vLsrAtKms } from '@/lib/astro/kinematic-distance';
import { makeRotationCurve } from '@/lib/astro/rotation-curves';
import type { OrderingMember, OrderingSettings, TracerKind } from '@/lib/ordering';

/** Flat curve, R0 = 8.5 kpc, Θ0 = 220 km/s (IAU 1985 values; Kerr & Lynden-Bell 1986). */
export const FLAT = makeRotationCurve('flat');

/** An invented trailing log-spiral arm of pitch 12°. */
export const TEST_ARM: ArmSpec = {
  name: 'Saltmarsh Arm',
  RrefKpc: 6,
  betaRefDeg: 0,
  pitchDeg: 12,
  betaMinDeg: -60,
  betaMaxDeg: 120,
};

/** Settings for hand-made inputs: the analysis defaults, no stated pattern speed, no constant errors. */
export function handSettings(overrides: Partial<OrderingSettings> = {}): OrderingSettings {
  return {
    curve: FLAT,
    arms: [TEST_ARM],
    armWidthKpc: 1,
    patternSpeedKmsKpc: null,
    sigmaStreamKms: 7,
    R0ErrKpc: 0,
    theta0ErrKms: 0,
    scaleHeightKpc: 0.06,
    nearFar: 'probabilistic',
    velocityFrom: 'gas',
    resamples: 2000,
    seed: 1,
    mcDraws: 200,
    armsR0Kpc: null,
    tangentNearTerminalKms: null,
    linkRadiusArcsec: null,
    ...overrides,
  };
}

/** A member at Galactocentric (x, y, z) kpc moving in circular rotation on FLAT, as seen from the Sun. */
export function memberAt(kind: TracerKind, xKpc: number, yKpc: number, zKpc = 0): OrderingMember {
  const sky = fromGalactocentric(xKpc, yKpc, zKpc, FLAT.R0Kpc);
  return {
    kind,
    lDeg: sky.lDeg,
    bDeg: sky.bDeg,
    vLsrKms: vLsrAtKms(sky.lDeg, sky.bDeg, sky.distKpc, FLAT),
    vErrKms: 1,
    distKpc: NaN,
    distErrKpc: NaN,
  };
}

/** A member seen at (l, b) deg with velocity v km/s and optional independent distance. */
export function memberSeen(
  kind: TracerKind,
  lDeg: number,
  bDeg: number,
  vLsrKms: number,
  distKpc = NaN,
  distErrKpc = NaN,
): OrderingMember {
  return { kind, lDeg, bDeg, vLsrKms, vErrKms: 1, distKpc, distErrKpc };
}
