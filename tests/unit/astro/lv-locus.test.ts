import { describe, expect, it } from 'vitest';
import { ARM_MODEL_PRESETS, armRadiusKpc, offsetFromArms, type ArmSpec } from '@/lib/astro/arms';
import { fromGalactocentric, polarToXy } from '@/lib/astro/galactocentric';
import {
  armRidge,
  dvDdPlaneKmsPerKpc,
  localPitchDeg,
  sightDotAheadNormal,
  sightLineCrossings,
} from '@/lib/astro/lv-locus';
import { makeRotationCurve } from '@/lib/astro/rotation-curves';

const DEG = Math.PI / 180;
const R0 = 8.34; // Reid et al. (2014)
const ARMS = ARM_MODEL_PRESETS['reid-2014'].arms;
// Invented arm with a kink, for the two-pitch case.
const KINKED: ArmSpec = {
  name: 'Kinked test arm',
  RrefKpc: 6.5,
  betaRefDeg: 10,
  pitchDeg: 8,
  betaMinDeg: -60,
  betaMaxDeg: 90,
  betaKinkDeg: 10,
  pitchAfterKinkDeg: 17,
};

/** In-plane ridge point at β and its heliocentric longitude and distance. */
function ridgeSeenFromSun(arm: ArmSpec, betaDeg: number) {
  const p = polarToXy(armRadiusKpc(arm, betaDeg), betaDeg);
  return { ...p, ...fromGalactocentric(p.xKpc, p.yKpc, 0, R0) };
}

const GRID_DEG = 0.01;

/** The ridge's longitude seen from the Sun on a fine grid of β, for the brute-force scan. */
function ridgeLongitudes(arm: ArmSpec): { betaDeg: number[]; lDeg: number[] } {
  const betaDeg: number[] = [];
  const lDeg: number[] = [];
  for (let beta = arm.betaMinDeg; beta <= arm.betaMaxDeg; beta += GRID_DEG) {
    betaDeg.push(beta);
    lDeg.push(ridgeSeenFromSun(arm, beta).lDeg);
  }
  return { betaDeg, lDeg };
}

/** Brute force: sign changes of (l_ridge(β) − l) along the grid, in front of the Sun. */
function bruteForceCrossings(grid: { betaDeg: number[]; lDeg: number[] }, lDeg: number): number[] {
  const wrap = (d: number) => ((((d + 180) % 360) + 360) % 360) - 180;
  const found: number[] = [];
  for (let i = 1; i < grid.lDeg.length; i++) {
    const prev = wrap(grid.lDeg[i - 1] - lDeg);
    const cur = wrap(grid.lDeg[i] - lDeg);
    // a jump through ±180° is the sight line's backward half, behind the Sun
    if (prev * cur <= 0 && Math.abs(prev - cur) < 90)
      found.push(0.5 * (grid.betaDeg[i - 1] + grid.betaDeg[i]));
  }
  return found;
}

describe('sight-line crossings with an arm ridge', () => {
  it('finds the same crossings as a brute-force scan, each on the ridge and on the sight line', () => {
    const beta = new Float64Array(400);
    const dPlane = new Float64Array(400);
    let total = 0;
    for (const arm of [...ARMS, KINKED]) {
      const ridge = armRidge(arm, R0);
      const grid = ridgeLongitudes(arm);
      for (const l of [12, 31, 47, 75, 110, 150, 200, 250, 300, 335]) {
        const count = sightLineCrossings(ridge, l, beta, dPlane);
        const brute = bruteForceCrossings(grid, l);
        expect(count, `${arm.name} at l = ${l}°`).toBe(brute.length); // brute force
        for (let k = 0; k < count; k++) {
          expect(Math.abs(beta[k] - brute[k])).toBeLessThan(GRID_DEG); // brute force grid step
          const seen = ridgeSeenFromSun(arm, beta[k]);
          expect(seen.lDeg).toBeCloseTo(l, 8); // exact geometry: on the sight line
          expect(seen.distKpc).toBeCloseTo(dPlane[k], 8); // exact geometry: distance along it
        }
        total += count;
      }
    }
    expect(total).toBeGreaterThan(20);
  });

  it('finds both crossings of a sight line that grazes the ridge between samples', () => {
    const arm = ARMS[0]; // Scutum, Reid et al. (2014) Table 2: a tangent near l = 30°
    // exact geometry: the largest longitude the near-side ridge reaches, by golden section
    const lAt = (beta: number) => ridgeSeenFromSun(arm, beta).lDeg;
    let lo = 3;
    let hi = 60;
    for (let k = 0; k < 200; k++) {
      const m1 = lo + (hi - lo) / 3;
      const m2 = hi - (hi - lo) / 3;
      if (lAt(m1) < lAt(m2)) lo = m1;
      else hi = m2;
    }
    const lTangent = lAt(0.5 * (lo + hi));
    expect(lTangent).toBeGreaterThan(28); // from memory: Scutum tangent 30–33°
    expect(lTangent).toBeLessThan(34);
    const ridge = armRidge(arm, R0);
    const beta = new Float64Array(400);
    const dPlane = new Float64Array(400);
    const nearTangent = (l: number) => {
      const count = sightLineCrossings(ridge, l, beta, dPlane);
      return Array.from(beta.subarray(0, count)).filter((b) => Math.abs(b - lo) < 2);
    };
    const inside = nearTangent(lTangent - 1e-5);
    expect(inside).toHaveLength(2); // exact geometry: just inside the tangent, two crossings
    for (const b of inside) expect(lAt(b)).toBeCloseTo(lTangent - 1e-5, 8);
    expect(nearTangent(lTangent + 1e-5)).toHaveLength(0); // just outside, none
  });

  it('rejects buffers shorter than the ridge sample', () => {
    const ridge = armRidge(ARMS[0], R0);
    expect(() => sightLineCrossings(ridge, 30, new Float64Array(3), new Float64Array(3))).toThrow(
      /crossing buffers \(3, 3\)/,
    );
    expect(() => armRidge(ARMS[0], -1)).toThrow(/R0Kpc = -1/);
  });
});

describe('the ridge normal that points ahead', () => {
  it('agrees with the signed perpendicular offset of lib/astro/arms for a point moved along it', () => {
    for (const arm of [...ARMS, KINKED]) {
      for (let b = arm.betaMinDeg + 5; b < arm.betaMaxDeg - 5; b += 7) {
        const q = polarToXy(armRadiusKpc(arm, b), b);
        // n̂ recovered from ŝ·n̂ at two sight directions 90° apart (l and l + 90°).
        const l0 = fromGalactocentric(q.xKpc, q.yKpc, 0, R0).lDeg;
        const a = sightDotAheadNormal(arm, b, l0);
        const c = sightDotAheadNormal(arm, b, l0 + 90);
        const sx = -Math.cos(l0 * DEG);
        const sy = -Math.sin(l0 * DEG);
        const nx = a * sx - c * sy;
        const ny = a * sy + c * sx;
        expect(Math.hypot(nx, ny)).toBeCloseTo(1, 12); // unit normal
        for (const dn of [-0.05, 0.03]) {
          const off = offsetFromArms(q.xKpc + dn * nx, q.yKpc + dn * ny, [arm], R0);
          // independent: nearest-point search and ahead sign of lib/astro/arms
          expect(off.perpOffsetKpc).toBeCloseTo(dn, 5);
        }
      }
    }
  });

  it('takes the pitch on each side of a kink as ArmSpec states it', () => {
    expect(localPitchDeg(KINKED, 10)).toBe(8); // ArmSpec: pitchDeg up to β_kink
    expect(localPitchDeg(KINKED, 10.01)).toBe(17); // ArmSpec: pitchAfterKinkDeg beyond
    expect(localPitchDeg(ARMS[0], 80)).toBe(19.8); // Reid et al. (2014) Table 2, Scutum
  });
});

describe('velocity gradient along the sight line', () => {
  it('matches the closed-form derivative for a flat curve', () => {
    const curve = makeRotationCurve('flat');
    const { R0Kpc: r0, theta0Kms: t0 } = curve;
    for (const [l, b, d] of [
      [30, 0, 2],
      [30, 1.5, 9],
      [120, -2, 3],
      [320, 0.5, 4],
      [250, 0, 0],
    ]) {
      const R = Math.sqrt(r0 * r0 + d * d - 2 * r0 * d * Math.cos(l * DEG));
      // exact: v = R0 sin l cos b Θ0 (1/R − 1/R0), dR/dd = (d − R0 cos l)/R
      const exact =
        ((-r0 * Math.sin(l * DEG) * Math.cos(b * DEG) * t0) / (R * R)) *
        ((d - r0 * Math.cos(l * DEG)) / R);
      expect(dvDdPlaneKmsPerKpc(l, b, d, curve)).toBeCloseTo(exact, 3);
    }
  });
});
