/**
 * Offsets of many points from log-spiral arm ridges, fast enough for every Monte Carlo distance
 * draw of every complex. Same definitions as `offsetFromArms` of `@/lib/astro/arms` (nearest
 * ridge point within the arm's β range, signed positive ahead in the sense of rotation; azimuth
 * offset at the same R) but found without scanning the ridge: for a log spiral the ridge crosses
 * the point's radius at a known azimuth, the first-order distance R·|Δβ|·sin ψ ranks the
 * crossings, and Newton's method on d|P − S(β)|²/dβ = 0 refines the best ones to the exact foot
 * of the perpendicular. `tests/unit/ordering/ridge-offset.test.ts` checks it against the
 * scanning implementation.
 */
import { wrap180Deg } from '@/lib/astro/angles';
import { armGeometry, type ArmGeometry, type ArmSpec } from '@/lib/astro/arms';
import { ROTATION_SENSE } from '@/lib/astro/galactocentric';

const DEG = Math.PI / 180;
const NEWTON_STEPS = 6;

type Segment = { tan: number; sinPsi: number; cos2Psi: number; loDeg: number; hiDeg: number };
type Ridge = { g: ArmGeometry; betaMinDeg: number; betaMaxDeg: number; segments: Segment[] };

/** Arms prepared for {@link ridgeOffset}. */
export type PreparedRidges = { arms: ArmSpec[]; ridges: Ridge[] };

/** Result of {@link ridgeOffset}, written into a reusable object. */
export type RidgeOffset = {
  armIndex: number;
  perpOffsetKpc: number;
  azimuthOffsetDeg: number;
  withinRange: boolean;
};

/** Prepares arms once (throws RangeError for an invalid arm, naming it). */
export function prepareRidges(arms: ArmSpec[]): PreparedRidges {
  if (arms.length === 0) throw new RangeError('no arms given');
  const ridges = arms.map((arm) => {
    const g = armGeometry(arm);
    const seg = (tan: number, loDeg: number, hiDeg: number): Segment => {
      const psi = Math.atan(Math.abs(tan));
      return { tan, sinPsi: Math.sin(psi), cos2Psi: Math.cos(psi) ** 2, loDeg, hiDeg };
    };
    const segments =
      g.tanBelow === g.tanAbove
        ? [seg(g.tanBelow, arm.betaMinDeg, arm.betaMaxDeg)]
        : [
            seg(g.tanBelow, arm.betaMinDeg, Math.min(g.betaK, arm.betaMaxDeg)),
            seg(g.tanAbove, Math.max(g.betaK, arm.betaMinDeg), arm.betaMaxDeg),
          ].filter((s) => s.hiDeg > s.loDeg);
    return { g, betaMinDeg: arm.betaMinDeg, betaMaxDeg: arm.betaMaxDeg, segments };
  });
  return { arms, ridges };
}

function radius(g: ArmGeometry, betaDeg: number): number {
  const t = betaDeg <= g.betaK ? g.tanBelow : g.tanAbove;
  return Math.exp(g.lnRk - (betaDeg - g.betaK) * DEG * t);
}

/** Squared distance from (x, y) to the ridge point at β (deg), in the frame of `galactocentric`. */
function dist2(g: ArmGeometry, betaDeg: number, x: number, y: number): number {
  const R = radius(g, betaDeg);
  const b = betaDeg * DEG;
  const dx = x - R * Math.cos(b);
  const dy = y + R * Math.sin(b);
  return dx * dx + dy * dy;
}

/**
 * Foot of the perpendicular from (x, y) on one segment, starting at β0 (deg), clamped to the
 * segment: Newton's method on f(β) = (P − S)·S′ with S(β) = R(β)(cos β, −sin β) and
 * R(β) = R_k e^{−(β − β_k) tan ψ}, so S′ = R(−t cos β − sin β, t sin β − cos β) and
 * S″ = R((t² − 1) cos β + 2t sin β, −(t² − 1) sin β + 2t cos β), per radian.
 */
function footOnSegment(g: ArmGeometry, s: Segment, beta0Deg: number, x: number, y: number): number {
  const t = s.tan;
  let beta = Math.min(s.hiDeg, Math.max(s.loDeg, beta0Deg));
  for (let k = 0; k < NEWTON_STEPS; k++) {
    const b = beta * DEG;
    const c = Math.cos(b);
    const sn = Math.sin(b);
    const R = Math.exp(g.lnRk - (beta - g.betaK) * DEG * t);
    const px = x - R * c;
    const py = y + R * sn;
    const d1x = R * (-t * c - sn);
    const d1y = R * (t * sn - c);
    const d2x = R * ((t * t - 1) * c + 2 * t * sn);
    const d2y = R * (-(t * t - 1) * sn + 2 * t * c);
    const f = px * d1x + py * d1y;
    const fp = -(d1x * d1x + d1y * d1y) + px * d2x + py * d2y;
    if (!(fp < 0)) break;
    const next = Math.min(s.hiDeg, Math.max(s.loDeg, beta - f / fp / DEG));
    if (Math.abs(next - beta) < 1e-10) {
      beta = next;
      break;
    }
    beta = next;
  }
  return beta;
}

type Candidate = {
  ridge: number;
  seg: number;
  crossDeg: number;
  dBetaDeg: number;
  estimateKpc: number;
};

/**
 * Offset of the in-plane point (x, y) (kpc) from its nearest arm, written into `out`. Points at
 * the Galactic centre get NaN offsets and arm −1.
 */
export function ridgeOffset(p: PreparedRidges, x: number, y: number, out: RidgeOffset): void {
  const RKpc = Math.hypot(x, y);
  out.armIndex = -1;
  out.perpOffsetKpc = NaN;
  out.azimuthOffsetDeg = NaN;
  out.withinRange = false;
  if (!(RKpc > 0)) return;
  const lnR = Math.log(RKpc);
  const betaDeg = Math.atan2(-y, x) / DEG;
  const candidates: Candidate[] = [];
  let best = Infinity;
  p.ridges.forEach((r, ri) => {
    r.segments.forEach((s, si) => {
      if (s.tan === 0) {
        candidates.push({ ridge: ri, seg: si, crossDeg: betaDeg, dBetaDeg: 0, estimateKpc: 0 });
        best = 0;
        return;
      }
      // The ridge crosses this radius once, at cross0; the point's azimuth is taken on every
      // turn (β + 360k) that can lie near the segment, and each turn is one candidate.
      const cross0 = r.g.betaK - (lnR - r.g.lnRk) / s.tan / DEG;
      const kLo = Math.ceil((s.loDeg - 180 - betaDeg) / 360);
      const kHi = Math.floor((s.hiDeg + 180 - betaDeg) / 360);
      for (let k = kLo; k <= kHi; k++) {
        const dBeta = betaDeg + 360 * k - cross0;
        const foot = cross0 + dBeta * s.cos2Psi;
        const outside = Math.max(0, s.loDeg - foot, foot - s.hiDeg);
        const est = RKpc * DEG * (Math.abs(dBeta) * s.sinPsi + outside);
        candidates.push({
          ridge: ri,
          seg: si,
          crossDeg: cross0,
          dBetaDeg: dBeta,
          estimateKpc: est,
        });
        if (est < best) best = est;
      }
    });
  });
  let bestD2 = Infinity;
  let bestRidge = -1;
  let bestBeta = NaN;
  for (const c of candidates) {
    if (c.estimateKpc > Math.min(2 * best + 0.5, best + 2)) continue;
    const r = p.ridges[c.ridge];
    const s = r.segments[c.seg];
    const foot = footOnSegment(r.g, s, c.crossDeg + c.dBetaDeg * s.cos2Psi, x, y);
    // A foot clamped to a segment bound may miss the nearer end of the arm: try both ends.
    const clamped = foot <= s.loDeg || foot >= s.hiDeg;
    for (const beta of clamped ? [foot, r.betaMinDeg, r.betaMaxDeg] : [foot]) {
      const d2 = dist2(r.g, beta, x, y);
      if (d2 < bestD2) {
        bestD2 = d2;
        bestRidge = c.ridge;
        bestBeta = beta;
      }
    }
  }
  if (bestRidge < 0) return;
  const r = p.ridges[bestRidge];
  const Rr = radius(r.g, bestBeta);
  const b = bestBeta * DEG;
  const qx = Rr * Math.cos(b);
  const qy = -Rr * Math.sin(b);
  // Direction of increasing β at the ridge point is (−sin β, −cos β) in this frame.
  const ahead = ((x - qx) * -Math.sin(b) + (y - qy) * -Math.cos(b)) * ROTATION_SENSE;
  const d = Math.sqrt(bestD2);
  out.armIndex = bestRidge;
  out.perpOffsetKpc = ahead < 0 ? -d : d;
  out.azimuthOffsetDeg = azimuthOffsetAtRadius(r.g, lnR, betaDeg);
  out.withinRange = bestBeta > r.betaMinDeg + 1e-9 && bestBeta < r.betaMaxDeg - 1e-9;
}

/** β_point − β_ridge(R) wrapped to (−180, 180], at the nearer of the (at most two) crossings. */
function azimuthOffsetAtRadius(g: ArmGeometry, lnR: number, betaDeg: number): number {
  let off = NaN;
  const consider = (t: number, below: boolean) => {
    if (t === 0) return;
    const beta = g.betaK - (lnR - g.lnRk) / t / DEG;
    if (below ? beta > g.betaK + 1e-12 : beta < g.betaK - 1e-12) return;
    const o = wrap180Deg(betaDeg - beta);
    if (!(Math.abs(o) >= Math.abs(off))) off = o;
  };
  consider(g.tanBelow, true);
  consider(g.tanAbove, false);
  return off * ROTATION_SENSE;
}

/** {@link ridgeOffset} for columns of points, in the shape of `offsetsFromArmsBulk`. */
export function ridgeOffsetsBulk(
  xKpc: Float64Array,
  yKpc: Float64Array,
  arms: ArmSpec[],
): {
  armIndex: Int32Array;
  perpOffsetKpc: Float64Array;
  azimuthOffsetDeg: Float64Array;
  withinRange: Uint8Array;
} {
  const n = xKpc.length;
  if (yKpc.length !== n) throw new RangeError(`column lengths differ: x ${n}, y ${yKpc.length}`);
  const p = prepareRidges(arms);
  const out: RidgeOffset = {
    armIndex: -1,
    perpOffsetKpc: NaN,
    azimuthOffsetDeg: NaN,
    withinRange: false,
  };
  const armIndex = new Int32Array(n);
  const perpOffsetKpc = new Float64Array(n);
  const azimuthOffsetDeg = new Float64Array(n);
  const withinRange = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    ridgeOffset(p, xKpc[i], yKpc[i], out);
    armIndex[i] = out.armIndex;
    perpOffsetKpc[i] = out.perpOffsetKpc;
    azimuthOffsetDeg[i] = out.azimuthOffsetDeg;
    withinRange[i] = out.withinRange ? 1 : 0;
  }
  return { armIndex, perpOffsetKpc, azimuthOffsetDeg, withinRange };
}
