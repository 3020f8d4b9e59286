/**
 * Spiral arms as logarithmic spirals in the Galactocentric frame of `./galactocentric`
 * (Reid et al. 2014 form): ln(R/R_ref) = −(β − β_ref) tan ψ over β_min ≤ β ≤ β_max, optionally
 * with a kink at β_kink where the pitch angle changes (Reid et al. 2019). R in kpc, angles in deg.
 * Offsets of a point from an arm are signed positive AHEAD of the ridge in the sense of Galactic
 * rotation ({@link ROTATION_SENSE}).
 */

import { wrap180Deg } from './angles';
import { ROTATION_SENSE, azimuthDeg, fromGalactocentric, polarToXy } from './galactocentric';
import { vLsrAtKms } from './kinematic-distance';
import type { RotationCurve } from './rotation-curves';

const DEG = Math.PI / 180;

/**
 * One arm. `pitchDeg` applies for β ≤ β_kink (or everywhere without a kink) and
 * `pitchAfterKinkDeg` for β > β_kink; the arm passes through (R_ref, β_ref) on whichever side of
 * the kink β_ref lies. `widthKpc` is the published arm width, informational.
 */
export interface ArmSpec {
  name: string;
  RrefKpc: number;
  betaRefDeg: number;
  pitchDeg: number;
  betaMinDeg: number;
  betaMaxDeg: number;
  betaKinkDeg?: number;
  pitchAfterKinkDeg?: number;
  widthKpc?: number;
}

/** A named set of arms with the R0 it was fitted with. */
export type ArmModelPreset = { label: string; source: string; R0Kpc: number; arms: ArmSpec[] };

/** Published arm models, labelled with their sources. */
export const ARM_MODEL_PRESETS: Readonly<Record<string, ArmModelPreset>> = Object.freeze({
  'reid-2014': {
    label: 'Reid et al. (2014) arms',
    source:
      'Reid et al. (2014), ApJ 783, 130, Table 2 (R_ref, β_ref, ψ, β range, width; R0 = 8.34 kpc, abstract). Values as Table 2 is commonly reproduced, not checked against the original table here; R_ref, β_ref, ψ and the β ranges agree between independent copies',
    R0Kpc: 8.34,
    arms: [
      {
        name: 'Scutum',
        RrefKpc: 5.0,
        betaRefDeg: 27.6,
        pitchDeg: 19.8,
        betaMinDeg: 3,
        betaMaxDeg: 101,
        widthKpc: 0.17,
      },
      {
        name: 'Sagittarius',
        RrefKpc: 6.6,
        betaRefDeg: 25.6,
        pitchDeg: 6.9,
        betaMinDeg: -2,
        betaMaxDeg: 68,
        widthKpc: 0.26,
      },
      {
        name: 'Local',
        RrefKpc: 8.4,
        betaRefDeg: 8.9,
        pitchDeg: 12.8,
        betaMinDeg: -8,
        betaMaxDeg: 27,
        widthKpc: 0.33,
      },
      {
        name: 'Perseus',
        RrefKpc: 9.9,
        betaRefDeg: 14.2,
        pitchDeg: 9.4,
        betaMinDeg: -21,
        betaMaxDeg: 88,
        widthKpc: 0.38,
      },
      {
        name: 'Outer',
        RrefKpc: 13.0,
        betaRefDeg: 18.6,
        pitchDeg: 13.8,
        betaMinDeg: -6,
        betaMaxDeg: 56,
        widthKpc: 0.63,
      },
    ],
  },
  'reid-2019': {
    label: 'Reid et al. (2019) arms',
    source:
      'Reid et al. (2019), ApJ 885, 131, Table 2 (β range, β_kink, R_kink, ψ<, ψ>, width; R0 = 8.15 kpc, abstract). Values as Table 2 is commonly reproduced, not checked against the original table here; independent copies agree on every number, including the Norma–Outer range 5° → 54°',
    R0Kpc: 8.15,
    arms: [
      kinked('3-kpc', 15, 18, 15, 3.52, -4.2, -4.2, 0.18),
      kinked('Norma–Outer', 5, 54, 18, 4.46, -1.0, 19.5, 0.14),
      kinked('Scutum–Centaurus', 0, 104, 23, 4.91, 14.1, 12.1, 0.23),
      kinked('Sagittarius–Carina', 2, 97, 24, 6.04, 17.1, 1.0, 0.27),
      kinked('Local', -8, 34, 9, 8.26, 11.4, 11.4, 0.31),
      kinked('Perseus', -23, 115, 40, 8.87, 10.3, 8.7, 0.35),
      kinked('Outer', -16, 71, 18, 12.24, 3.0, 9.4, 0.65),
    ],
  },
});

function kinked(
  name: string,
  betaMinDeg: number,
  betaMaxDeg: number,
  betaKinkDeg: number,
  RkinkKpc: number,
  pitchBelowDeg: number,
  pitchAboveDeg: number,
  widthKpc: number,
): ArmSpec {
  return {
    name,
    RrefKpc: RkinkKpc,
    betaRefDeg: betaKinkDeg,
    pitchDeg: pitchBelowDeg,
    betaMinDeg,
    betaMaxDeg,
    betaKinkDeg,
    pitchAfterKinkDeg: pitchAboveDeg,
    widthKpc,
  };
}

/** A log-spiral arm in the form the offset code needs: ln R at the kink azimuth, and tan ψ on each side. */
export type ArmGeometry = {
  lnRk: number;
  betaK: number;
  tanBelow: number;
  tanAbove: number;
};

/** The arm's geometry (throws RangeError for an invalid arm, naming it). */
export function armGeometry(arm: ArmSpec): ArmGeometry {
  if (!(arm.RrefKpc > 0))
    throw new RangeError(`arm ${arm.name}: RrefKpc = ${arm.RrefKpc} must be positive`);
  if (!(arm.betaMaxDeg > arm.betaMinDeg)) {
    throw new RangeError(
      `arm ${arm.name}: betaMaxDeg ${arm.betaMaxDeg} must exceed betaMinDeg ${arm.betaMinDeg}`,
    );
  }
  for (const [key, p] of [
    ['pitchDeg', arm.pitchDeg],
    ['pitchAfterKinkDeg', arm.pitchAfterKinkDeg ?? 0],
  ] as const) {
    if (!(Math.abs(p) < 90))
      throw new RangeError(`arm ${arm.name}: ${key} = ${p} must lie within (−90°, 90°)`);
  }
  const tanBelow = Math.tan(arm.pitchDeg * DEG);
  if (arm.betaKinkDeg === undefined) {
    return { lnRk: Math.log(arm.RrefKpc), betaK: arm.betaRefDeg, tanBelow, tanAbove: tanBelow };
  }
  const tanAbove = Math.tan((arm.pitchAfterKinkDeg ?? arm.pitchDeg) * DEG);
  const betaK = arm.betaKinkDeg;
  const tanRef = arm.betaRefDeg <= betaK ? tanBelow : tanAbove;
  return {
    lnRk: Math.log(arm.RrefKpc) - (betaK - arm.betaRefDeg) * DEG * tanRef,
    betaK,
    tanBelow,
    tanAbove,
  };
}

function radiusFrom(g: ArmGeometry, betaDeg: number): number {
  const t = betaDeg <= g.betaK ? g.tanBelow : g.tanAbove;
  return Math.exp(g.lnRk - (betaDeg - g.betaK) * DEG * t);
}

/** Galactocentric radius (kpc) of the arm's ridge at azimuth betaDeg (the spiral continued beyond its β range if asked). */
export function armRadiusKpc(arm: ArmSpec, betaDeg: number): number {
  return radiusFrom(armGeometry(arm), betaDeg);
}

/** Ridge points of an arm from β_min to β_max (both included) every stepDeg (default 0.5°), for drawing: β (deg), R, x, y (kpc). */
export function armPoints(
  arm: ArmSpec,
  stepDeg = 0.5,
): { betaDeg: Float64Array; RKpc: Float64Array; xKpc: Float64Array; yKpc: Float64Array } {
  if (!(stepDeg > 0)) throw new RangeError(`stepDeg = ${stepDeg} must be positive`);
  const g = armGeometry(arm);
  const span = arm.betaMaxDeg - arm.betaMinDeg;
  const n = Math.max(2, Math.ceil(span / stepDeg - 1e-9) + 1);
  const betaDeg = new Float64Array(n);
  const RKpc = new Float64Array(n);
  const xKpc = new Float64Array(n);
  const yKpc = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const beta = i === n - 1 ? arm.betaMaxDeg : arm.betaMinDeg + i * stepDeg;
    const R = radiusFrom(g, beta);
    const p = polarToXy(R, beta);
    betaDeg[i] = beta;
    RKpc[i] = R;
    xKpc[i] = p.xKpc;
    yKpc[i] = p.yKpc;
  }
  return { betaDeg, RKpc, xKpc, yKpc };
}

/** Offset of a point from its nearest arm. */
export type ArmOffset = {
  armIndex: number;
  armName: string;
  /** Signed distance (kpc) to the nearest ridge point within the arm's β range; positive ahead in the sense of rotation. */
  perpOffsetKpc: number;
  /** β_point − β_ridge(R) (deg, wrapped to (−180, 180]) at the point's own R, times ROTATION_SENSE: positive ahead. */
  azimuthOffsetDeg: number;
  /** False when the nearest ridge point is an end of the arm's β range (the point lies off the arm's ends). */
  withinRange: boolean;
};

type Prepared = { arm: ArmSpec; g: ArmGeometry; pts: ReturnType<typeof armPoints>; key: string };
const prepCache = new WeakMap<ArmSpec, Prepared>();
const SAMPLE_STEP_DEG = 0.5;

function armKey(a: ArmSpec): string {
  return [
    a.RrefKpc,
    a.betaRefDeg,
    a.pitchDeg,
    a.betaMinDeg,
    a.betaMaxDeg,
    a.betaKinkDeg,
    a.pitchAfterKinkDeg,
  ].join('|');
}

function prepare(arm: ArmSpec): Prepared {
  const key = armKey(arm);
  const hit = prepCache.get(arm);
  if (hit && hit.key === key) return hit;
  const p = { arm, g: armGeometry(arm), pts: armPoints(arm, SAMPLE_STEP_DEG), key };
  prepCache.set(arm, p);
  return p;
}

/** Azimuth offset (deg) of (R, β) from the ridge at the same R: the nearest ridge crossing of that radius. */
function ridgeAzimuthOffset(g: ArmGeometry, RKpc: number, betaDeg: number): number {
  const lnR = Math.log(RKpc);
  let best = NaN;
  const consider = (t: number, below: boolean) => {
    if (t === 0) return;
    const beta = g.betaK - (lnR - g.lnRk) / t / DEG;
    if (below ? beta > g.betaK + 1e-12 : beta < g.betaK - 1e-12) return;
    const off = wrap180Deg(betaDeg - beta);
    if (!(Math.abs(off) >= Math.abs(best))) best = off;
  };
  consider(g.tanBelow, true);
  consider(g.tanAbove, false);
  return best * ROTATION_SENSE;
}

function nearestOnArm(
  p: Prepared,
  x: number,
  y: number,
): { dist: number; beta: number; interior: boolean } {
  const { xKpc, yKpc, betaDeg } = p.pts;
  const n = xKpc.length;
  let bestI = 0;
  let bestD2 = Infinity;
  for (let i = 0; i < n; i++) {
    const dx = xKpc[i] - x;
    const dy = yKpc[i] - y;
    const d2 = dx * dx + dy * dy;
    if (d2 < bestD2) {
      bestD2 = d2;
      bestI = i;
    }
  }
  let lo = betaDeg[Math.max(0, bestI - 1)];
  let hi = betaDeg[Math.min(n - 1, bestI + 1)];
  const d2At = (beta: number) => {
    const q = polarToXy(radiusFrom(p.g, beta), beta);
    return (q.xKpc - x) ** 2 + (q.yKpc - y) ** 2;
  };
  const phi = (Math.sqrt(5) - 1) / 2;
  let a = hi - phi * (hi - lo);
  let b = lo + phi * (hi - lo);
  let fa = d2At(a);
  let fb = d2At(b);
  for (let k = 0; k < 60 && hi - lo > 1e-11; k++) {
    if (fa <= fb) {
      hi = b;
      b = a;
      fb = fa;
      a = hi - phi * (hi - lo);
      fa = d2At(a);
    } else {
      lo = a;
      a = b;
      fa = fb;
      b = lo + phi * (hi - lo);
      fb = d2At(b);
    }
  }
  let beta = 0.5 * (lo + hi);
  let d2 = d2At(beta);
  for (const end of [p.arm.betaMinDeg, p.arm.betaMaxDeg]) {
    const de = d2At(end);
    if (de < d2) {
      d2 = de;
      beta = end;
    }
  }
  const interior = beta > p.arm.betaMinDeg + 1e-9 && beta < p.arm.betaMaxDeg - 1e-9;
  return { dist: Math.sqrt(d2), beta, interior };
}

function offsetFromPrepared(prepared: Prepared[], xKpc: number, yKpc: number): ArmOffset {
  let best: { index: number; dist: number; beta: number; interior: boolean } | null = null;
  prepared.forEach((p, index) => {
    const r = nearestOnArm(p, xKpc, yKpc);
    if (!best || r.dist < best.dist) best = { index, ...r };
  });
  const b = best as unknown as { index: number; dist: number; beta: number; interior: boolean };
  const p = prepared[b.index];
  const q = polarToXy(radiusFrom(p.g, b.beta), b.beta);
  const betaRad = b.beta * DEG;
  // Direction of increasing β at the ridge point is (−sin β, −cos β) in this frame.
  const ahead =
    ((xKpc - q.xKpc) * -Math.sin(betaRad) + (yKpc - q.yKpc) * -Math.cos(betaRad)) * ROTATION_SENSE;
  const RKpc = Math.hypot(xKpc, yKpc);
  return {
    armIndex: b.index,
    armName: p.arm.name,
    perpOffsetKpc: ahead < 0 ? -b.dist : b.dist,
    azimuthOffsetDeg: RKpc > 0 ? ridgeAzimuthOffset(p.g, RKpc, azimuthDeg(xKpc, yKpc)) : NaN,
    withinRange: b.interior,
  };
}

function prepareAll(arms: ArmSpec[], R0Kpc: number): Prepared[] {
  if (arms.length === 0) throw new RangeError('no arms given');
  if (!(R0Kpc > 0)) throw new RangeError(`R0Kpc = ${R0Kpc} must be positive`);
  return arms.map(prepare);
}

/**
 * Nearest arm to an in-plane Galactocentric point (kpc, frame of `./galactocentric`) and the
 * signed offsets from its ridge: the perpendicular distance to the ridge (kpc) and the azimuth
 * offset at the same R (deg), both positive ahead of the ridge in the sense of Galactic rotation.
 * The offsets do not depend on R0Kpc (the frame is centred on the Galactic centre); it is
 * required so that callers state the frame the point was computed in, and is checked positive.
 */
export function offsetFromArms(
  xKpc: number,
  yKpc: number,
  arms: ArmSpec[],
  R0Kpc: number,
): ArmOffset {
  return offsetFromPrepared(prepareAll(arms, R0Kpc), xKpc, yKpc);
}

/** {@link offsetFromArms} for columns of points: arm index, perpendicular (kpc) and azimuth (deg) offsets, and within-range flags. */
export function offsetsFromArmsBulk(
  xKpc: Float64Array,
  yKpc: Float64Array,
  arms: ArmSpec[],
  R0Kpc: number,
): {
  armIndex: Int32Array;
  perpOffsetKpc: Float64Array;
  azimuthOffsetDeg: Float64Array;
  withinRange: Uint8Array;
} {
  const prepared = prepareAll(arms, R0Kpc);
  const n = xKpc.length;
  if (yKpc.length !== n) throw new RangeError(`column lengths differ: x ${n}, y ${yKpc.length}`);
  const armIndex = new Int32Array(n);
  const perpOffsetKpc = new Float64Array(n);
  const azimuthOffsetDeg = new Float64Array(n);
  const withinRange = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const r = offsetFromPrepared(prepared, xKpc[i], yKpc[i]);
    armIndex[i] = r.armIndex;
    perpOffsetKpc[i] = r.perpOffsetKpc;
    azimuthOffsetDeg[i] = r.azimuthOffsetDeg;
    withinRange[i] = r.withinRange ? 1 : 0;
  }
  return { armIndex, perpOffsetKpc, azimuthOffsetDeg, withinRange };
}

/**
 * The arm's locus in the longitude–velocity plane for circular rotation on `curve`, with the Sun
 * at (curve.R0Kpc, 0): for ridge points every stepDeg of β, Galactic longitude (deg, [0, 360)),
 * standard-LSR v (km/s) of the curve's forward model {@link vLsrAtKms} at b = 0 (R0 sin l (Θ(R)/R − Θ0/R0)
 * for a curve without a frame of its own), heliocentric distance (kpc) and β (deg).
 */
export function armLocusLv(
  arm: ArmSpec,
  curve: RotationCurve,
  stepDeg = 0.5,
): { lDeg: Float64Array; vLsrKms: Float64Array; distKpc: Float64Array; betaDeg: Float64Array } {
  const pts = armPoints(arm, stepDeg);
  const n = pts.betaDeg.length;
  const R0 = curve.R0Kpc;
  const lDeg = new Float64Array(n);
  const vLsrKms = new Float64Array(n);
  const distKpc = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const h = fromGalactocentric(pts.xKpc[i], pts.yKpc[i], 0, R0);
    lDeg[i] = h.lDeg;
    distKpc[i] = h.distKpc;
    vLsrKms[i] = vLsrAtKms(h.lDeg, 0, h.distKpc, curve);
  }
  return { lDeg, vLsrKms, distKpc, betaDeg: pts.betaDeg.slice() };
}
