/**
 * Builds ordering-analysis input from a generated demo galaxy: one OrderingComplex per generator
 * complex, with the observed l, b, v, velocity error and independent distance of each member as
 * the catalogs hold them, and settings taken from the galaxy's truth (curve, arms, pattern speed).
 */
import type { OrderingComplex, OrderingSettings, TracerKind } from '@/lib/ordering';
import { galaxyCurve, TRACERS, type DemoGalaxy } from '@/seed/generator';

const KIND: Record<(typeof TRACERS)[number], TracerKind> = {
  HI: 'hi',
  CO: 'co',
  HII: 'hii',
  OB: 'ob',
};

/** Member row (catalog and row) of each complex member, in the order they appear in the input. */
export type MemberRef = { tracer: (typeof TRACERS)[number]; row: number };

/** The galaxy's complexes as analysis input, and where each member came from. */
export function complexesFromGalaxy(galaxy: DemoGalaxy): {
  complexes: OrderingComplex[];
  refs: MemberRef[][];
} {
  const n = galaxy.complexes.count;
  const complexes: OrderingComplex[] = Array.from({ length: n }, (_, c) => ({
    id: `cx-${c}`,
    members: [],
  }));
  const refs: MemberRef[][] = Array.from({ length: n }, () => []);
  for (const t of TRACERS) {
    const cat = galaxy.catalogs[t];
    for (let i = 0; i < cat.count; i++) {
      const c = cat.complexId[i];
      if (c < 0) continue;
      complexes[c].members.push({
        kind: KIND[t],
        lDeg: cat.lDeg[i],
        bDeg: cat.bDeg[i],
        vLsrKms: cat.vLsrKms[i],
        vErrKms: cat.vErrKms[i],
        distKpc: cat.indepDistKpc[i],
        distErrKpc: cat.indepDistErrKpc[i],
      });
      refs[c].push({ tracer: t, row: i });
    }
  }
  return { complexes, refs };
}

/**
 * Settings that use the galaxy's own curve (rebuilt from its truth) and arms, with the analysis
 * defaults: no stated pattern speed, probabilistic near/far, no error on the curve constants.
 */
export function settingsFromGalaxy(
  galaxy: DemoGalaxy,
  overrides: Partial<OrderingSettings> = {},
): OrderingSettings {
  const { truth } = galaxy;
  return {
    curve: galaxyCurve(truth),
    arms: truth.arms,
    armWidthKpc: 1.0,
    patternSpeedKmsKpc: null,
    sigmaStreamKms: 7,
    R0ErrKpc: 0,
    theta0ErrKms: 0,
    scaleHeightKpc: 0.06,
    nearFar: 'probabilistic',
    velocityFrom: 'gas',
    resamples: 2000,
    seed: 7,
    mcDraws: 200,
    armsR0Kpc: null,
    tangentNearTerminalKms: null,
    linkRadiusArcsec: null,
    ...overrides,
  };
}
