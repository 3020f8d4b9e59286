import { describe, expect, it } from 'vitest';
import {
  armTangentLongitudes,
  ridgeFrame,
  shiftedRidgePoint,
  tangentNormalOffsetKpc,
} from '@/lib/astro/arm-tangents';
import { ARM_MODEL_PRESETS, armRadiusKpc, offsetFromArms, type ArmSpec } from '@/lib/astro/arms';
import { fromGalactocentric } from '@/lib/astro/galactocentric';

const D = Math.PI / 180;
const reid14 = ARM_MODEL_PRESETS['reid-2014'];
const reid19 = ARM_MODEL_PRESETS['reid-2019'];
const byName = (arms: ArmSpec[], name: string) => arms.find((a) => a.name === name) as ArmSpec;
/** The Reid et al. (2014) Scutum spiral continued to β = −90°, so that it has a fourth-quadrant tangent too. */
const scutumBoth: ArmSpec = { ...byName(reid14.arms, 'Scutum'), betaMinDeg: -90 };

/**
 * Tangents from the closed-form condition instead of maximising l. For a log spiral
 * (dR/dβ = −R tan ψ) the sight line from the Sun (R0, 0) touches the copy shifted by n along the
 * ahead normal s(cos ψ e_R + sin ψ e_β), s = sign ψ, where
 *   R(β) cos ψ + s n = R0 cos(β + ψ)       // exact geometry: (P + nN − S) × T = 0
 * Roots by a scan and bisection, per pitch segment; only inner-Galaxy quadrants kept.
 */
function closedFormTangents(
  arm: ArmSpec,
  R0: number,
  n: number,
): { lDeg: number; betaDeg: number }[] {
  const pitchAt = (b: number) =>
    arm.betaKinkDeg !== undefined && b > arm.betaKinkDeg
      ? (arm.pitchAfterKinkDeg ?? arm.pitchDeg)
      : arm.pitchDeg;
  const g = (b: number) => {
    const psi = pitchAt(b) * D;
    const s = psi < 0 ? -1 : 1;
    return armRadiusKpc(arm, b) * Math.cos(psi) + s * n - R0 * Math.cos(b * D + psi);
  };
  const roots: { lDeg: number; betaDeg: number }[] = [];
  const step = 0.01;
  for (let b = arm.betaMinDeg; b + step <= arm.betaMaxDeg; b += step) {
    let lo = b;
    let hi = b + step;
    if (pitchAt(lo) !== pitchAt(hi) || Math.sign(g(lo)) === Math.sign(g(hi))) continue;
    for (let k = 0; k < 100; k++) {
      const mid = 0.5 * (lo + hi);
      if (Math.sign(g(mid)) === Math.sign(g(lo))) lo = mid;
      else hi = mid;
    }
    const beta = 0.5 * (lo + hi);
    const p = shiftedRidgePoint(arm, beta, n);
    const lDeg = fromGalactocentric(p.xKpc, p.yKpc, 0, R0).lDeg;
    if ((lDeg > 0 && lDeg < 90) || (lDeg > 270 && lDeg < 360)) roots.push({ lDeg, betaDeg: beta });
  }
  return roots;
}

describe('armTangentLongitudes', () => {
  const cases: [string, ArmSpec, number][] = [
    ...reid14.arms.map((a): [string, ArmSpec, number] => [`2014 ${a.name}`, a, reid14.R0Kpc]),
    ...reid19.arms.map((a): [string, ArmSpec, number] => [`2019 ${a.name}`, a, reid19.R0Kpc]),
    ['Scutum continued to β = −90°', scutumBoth, reid14.R0Kpc],
  ];

  it.each(cases)('agrees with the closed-form tangent condition: %s', (_label, arm, R0) => {
    for (const n of [0, 0.1, 0.3, -0.2]) {
      const found = armTangentLongitudes(arm, R0, n);
      const exact = closedFormTangents(arm, R0, n);
      expect(found.length).toBe(exact.length);
      found.forEach((t, i) => {
        expect(Math.abs(t.lDeg - exact[i].lDeg)).toBeLessThan(0.01); // exact geometry
        expect(Math.abs(t.betaDeg - exact[i].betaDeg)).toBeLessThan(1e-3); // exact geometry
      });
    }
  });

  it('finds a first- and a fourth-quadrant tangent on an arm that spans both', () => {
    const [q4, q1] = armTangentLongitudes(scutumBoth, reid14.R0Kpc);
    expect(q4.lDeg).toBeGreaterThan(270);
    expect(q1.lDeg).toBeLessThan(90);
    // exact geometry: the sight line's distance from the centre is R0 |sin l| = R cos ψ
    for (const t of [q1, q4]) {
      expect(reid14.R0Kpc * Math.abs(Math.sin(t.lDeg * D))).toBeCloseTo(
        t.RKpc * Math.cos(t.pitchDeg * D),
        6,
      );
      // exact geometry: Sun, tangent point and centre form a triangle with sides R0, d, R
      const f = ridgeFrame(scutumBoth, t.betaDeg);
      expect(Math.hypot(reid14.R0Kpc - f.xKpc, f.yKpc)).toBeCloseTo(t.distKpc, 9);
    }
  });

  it('puts published arms near the tangent directions astronomers quote (loose)', () => {
    const l = (m: typeof reid14, name: string) =>
      armTangentLongitudes(byName(m.arms, name), m.R0Kpc)[0].lDeg;
    expect(l(reid14, 'Scutum')).toBeGreaterThan(30); // from memory: Scutum tangent 30–33°
    expect(l(reid14, 'Scutum')).toBeLessThan(33);
    expect(Math.abs(l(reid14, 'Sagittarius') - 50.5)).toBeLessThan(1.5); // from memory: Sagittarius ≈ 50–51°
    expect(Math.abs(l(reid19, 'Scutum–Centaurus') - 31.5)).toBeLessThan(2); // from memory: Scutum 30–33°
    expect(Math.abs(l(reid19, 'Sagittarius–Carina') - 50.5)).toBeLessThan(4); // from memory: Sagittarius ≈ 50°
    expect(armTangentLongitudes(byName(reid14.arms, 'Perseus'), reid14.R0Kpc)).toEqual([]); // exact geometry: R cos ψ > R0 sin l everywhere
  });

  it('rejects a non-positive R0 and a non-finite offset, naming them', () => {
    expect(() => armTangentLongitudes(scutumBoth, 0)).toThrow(/R0Kpc = 0/);
    expect(() => armTangentLongitudes(scutumBoth, 8.34, NaN)).toThrow(/normalOffsetKpc = NaN/);
  });
});

describe('ridge normal', () => {
  it('points ahead in the sense of rotation, as offsetFromArms measures it', () => {
    for (const arm of [...reid14.arms, ...reid19.arms]) {
      for (const frac of [0.2, 0.5, 0.8]) {
        const beta = arm.betaMinDeg + frac * (arm.betaMaxDeg - arm.betaMinDeg);
        const p = shiftedRidgePoint(arm, beta, 0.05);
        const off = offsetFromArms(p.xKpc, p.yKpc, [arm], 8.34);
        expect(off.perpOffsetKpc).toBeCloseTo(0.05, 6); // independent implementation in lib/astro/arms
      }
    }
  });
});

describe('tangentNormalOffsetKpc', () => {
  it('recovers the shift of a ridge copy from its tangent longitude, in both quadrants', () => {
    const model = armTangentLongitudes(scutumBoth, reid14.R0Kpc);
    for (const n of [-0.3, 0.1, 0.3]) {
      const exact = closedFormTangents(scutumBoth, reid14.R0Kpc, n);
      model.forEach((t, i) => {
        expect(tangentNormalOffsetKpc(scutumBoth, reid14.R0Kpc, t, exact[i].lDeg)).toBeCloseTo(
          n,
          6,
        ); // exact geometry
      });
    }
  });
});
