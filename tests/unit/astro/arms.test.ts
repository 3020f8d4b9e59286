import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  ARM_MODEL_PRESETS,
  armLocusLv,
  armPoints,
  armRadiusKpc,
  offsetFromArms,
  offsetsFromArmsBulk,
  type ArmSpec,
} from '@/lib/astro/arms';
import { polarToXy } from '@/lib/astro/galactocentric';
import { kinematicDistance, vLsrAtKms } from '@/lib/astro/kinematic-distance';
import { makeRotationCurve } from '@/lib/astro/rotation-curves';

const D = Math.PI / 180;
const reid14 = ARM_MODEL_PRESETS['reid-2014'];
const reid19 = ARM_MODEL_PRESETS['reid-2019'];

describe('arm presets', () => {
  it('hold the Reid et al. (2019) Table 2 rows', () => {
    // Reid et al. (2019) Table 2 as reproduced in several independent copies (original table not
    // checked here): [β from, β to, β_kink, R_kink kpc, ψ< deg, ψ> deg, width kpc]
    const table: Record<string, number[]> = {
      '3-kpc': [15, 18, 15, 3.52, -4.2, -4.2, 0.18],
      'Norma–Outer': [5, 54, 18, 4.46, -1.0, 19.5, 0.14],
      'Scutum–Centaurus': [0, 104, 23, 4.91, 14.1, 12.1, 0.23],
      'Sagittarius–Carina': [2, 97, 24, 6.04, 17.1, 1.0, 0.27],
      Local: [-8, 34, 9, 8.26, 11.4, 11.4, 0.31],
      Perseus: [-23, 115, 40, 8.87, 10.3, 8.7, 0.35],
      Outer: [-16, 71, 18, 12.24, 3.0, 9.4, 0.65],
    };
    expect(reid19.R0Kpc).toBe(8.15); // Reid et al. (2019), abstract
    expect(reid19.arms.map((a) => a.name)).toEqual(Object.keys(table));
    for (const a of reid19.arms) {
      expect([
        a.betaMinDeg,
        a.betaMaxDeg,
        a.betaKinkDeg,
        a.RrefKpc,
        a.pitchDeg,
        a.pitchAfterKinkDeg,
        a.widthKpc,
      ]).toEqual(table[a.name]);
    }
  });

  it('hold the Reid et al. (2014) Table 2 rows', () => {
    // Reid et al. (2014) Table 2 as commonly reproduced (original table not checked here):
    // [R_ref kpc, β_ref deg, ψ deg, β from, β to, width kpc]
    const table: Record<string, number[]> = {
      Scutum: [5.0, 27.6, 19.8, 3, 101, 0.17],
      Sagittarius: [6.6, 25.6, 6.9, -2, 68, 0.26],
      Local: [8.4, 8.9, 12.8, -8, 27, 0.33],
      Perseus: [9.9, 14.2, 9.4, -21, 88, 0.38],
      Outer: [13.0, 18.6, 13.8, -6, 56, 0.63],
    };
    expect(reid14.R0Kpc).toBe(8.34); // Reid et al. (2014), abstract
    expect(reid14.arms.map((a) => a.name)).toEqual(Object.keys(table));
    for (const a of reid14.arms) {
      expect([a.RrefKpc, a.betaRefDeg, a.pitchDeg, a.betaMinDeg, a.betaMaxDeg, a.widthKpc]).toEqual(
        table[a.name],
      );
    }
  });

  it("say where their numbers come from, in the trade's words", () => {
    for (const p of Object.values(ARM_MODEL_PRESETS)) {
      expect(p.source).toMatch(/Table 2/);
      expect(p.source).not.toMatch(/memory|SCIENCE/i);
    }
  });
});

describe('arm geometry', () => {
  it('follows ln(R/Rref) = −(β − βref) tan ψ', () => {
    // Reid et al. 2014 log-spiral form
    const perseus = reid14.arms.find((a) => a.name === 'Perseus') as ArmSpec;
    expect(armRadiusKpc(perseus, perseus.betaRefDeg)).toBeCloseTo(9.9, 12);
    expect(armRadiusKpc(perseus, 50)).toBeCloseTo(
      9.9 * Math.exp(-(50 - 14.2) * D * Math.tan(9.4 * D)),
      12,
    );
  });

  it('carries the kinked Reid et al. 2019 arms through the kink', () => {
    // Reid et al. 2019 kinked spirals: R = R_kink at β_kink, ψ< below and ψ> above
    const sgr = reid19.arms.find((a) => a.name === 'Sagittarius–Carina') as ArmSpec;
    expect(armRadiusKpc(sgr, 24)).toBeCloseTo(6.04, 12);
    expect(armRadiusKpc(sgr, 10)).toBeCloseTo(
      6.04 * Math.exp(-(10 - 24) * D * Math.tan(17.1 * D)),
      12,
    );
    expect(armRadiusKpc(sgr, 60)).toBeCloseTo(
      6.04 * Math.exp(-(60 - 24) * D * Math.tan(1.0 * D)),
      12,
    );
    const general: ArmSpec = {
      name: 'x',
      RrefKpc: 7,
      betaRefDeg: 40,
      pitchDeg: 10,
      betaMinDeg: 0,
      betaMaxDeg: 80,
      betaKinkDeg: 20,
      pitchAfterKinkDeg: 15,
    };
    expect(armRadiusKpc(general, 40)).toBeCloseTo(7, 12);
  });

  it('samples the whole β range for drawing', () => {
    // geometry of the sampler
    const arm = reid14.arms[0];
    const pts = armPoints(arm, 1);
    expect(pts.betaDeg[0]).toBe(arm.betaMinDeg);
    expect(pts.betaDeg[pts.betaDeg.length - 1]).toBe(arm.betaMaxDeg);
    expect(Math.hypot(pts.xKpc[5], pts.yKpc[5])).toBeCloseTo(pts.RKpc[5], 12);
  });
});

describe('offsets from arms', () => {
  it('is zero for points on a ridge, for every preset arm', () => {
    // points generated on the ridge (brute-force oracle: the arm's own formula)
    for (const preset of [reid14, reid19]) {
      preset.arms.forEach((arm, index) => {
        for (let k = 0; k < 7; k++) {
          const beta = arm.betaMinDeg + ((k + 0.5) / 7) * (arm.betaMaxDeg - arm.betaMinDeg);
          const p = polarToXy(armRadiusKpc(arm, beta), beta);
          const off = offsetFromArms(p.xKpc, p.yKpc, preset.arms, preset.R0Kpc);
          expect(off.armIndex).toBe(index);
          expect(off.armName).toBe(arm.name);
          expect(Math.abs(off.perpOffsetKpc)).toBeLessThan(1e-6);
          expect(Math.abs(off.azimuthOffsetDeg)).toBeLessThan(1e-9);
        }
      });
    }
  });

  it('is positive ahead of the ridge in the sense of rotation and negative behind', () => {
    // Reid et al. 2014 frame: rotation toward increasing β; a log spiral crosses circles at the
    // pitch angle ψ, so a small azimuthal step R Δβ is R Δβ sin ψ off the ridge (plane geometry)
    const arm: ArmSpec = {
      name: 'test',
      RrefKpc: 8,
      betaRefDeg: 0,
      pitchDeg: 12,
      betaMinDeg: -60,
      betaMaxDeg: 60,
    };
    const R = armRadiusKpc(arm, 10);
    for (const delta of [0.5, -0.5]) {
      const p = polarToXy(R, 10 + delta);
      const off = offsetFromArms(p.xKpc, p.yKpc, [arm], 8.5);
      expect(Math.sign(off.perpOffsetKpc)).toBe(Math.sign(delta));
      expect(off.azimuthOffsetDeg).toBeCloseTo(delta, 9);
      expect(off.perpOffsetKpc).toBeCloseTo(R * delta * D * Math.sin(12 * D), 4);
      expect(off.withinRange).toBe(true);
    }
    // Inside a trailing arm at the same β lies behind it (the ridge at smaller R is at larger β).
    const inner = polarToXy(armRadiusKpc(arm, 10) - 0.2, 10);
    expect(offsetFromArms(inner.xKpc, inner.yKpc, [arm], 8.5).perpOffsetKpc).toBeLessThan(0);
  });

  it('measures the perpendicular distance as the true nearest distance', () => {
    // brute-force oracle: dense sampling of the ridge
    const arms = reid14.arms;
    const dense = arms.map((a) => armPoints(a, 0.001));
    fc.assert(
      fc.property(
        fc.integer({ min: -150, max: 150 }).map((x) => x / 10),
        fc.integer({ min: -150, max: 150 }).map((x) => x / 10),
        (x, y) => {
          let best = Infinity;
          for (const pts of dense) {
            for (let i = 0; i < pts.xKpc.length; i++)
              best = Math.min(best, Math.hypot(pts.xKpc[i] - x, pts.yKpc[i] - y));
          }
          const off = offsetFromArms(x, y, arms, 8.34);
          expect(Math.abs(Math.abs(off.perpOffsetKpc) - best)).toBeLessThan(1e-4);
        },
      ),
      { numRuns: 40 },
    );
  });

  it('bulk equals scalar', () => {
    // scalar call as oracle
    const x = Float64Array.of(4, 6, -3, 9);
    const y = Float64Array.of(-3, 2, -7, -1);
    const bulk = offsetsFromArmsBulk(x, y, reid19.arms, reid19.R0Kpc);
    for (let i = 0; i < 4; i++) {
      const s = offsetFromArms(x[i], y[i], reid19.arms, reid19.R0Kpc);
      expect(bulk.armIndex[i]).toBe(s.armIndex);
      expect(bulk.perpOffsetKpc[i]).toBe(s.perpOffsetKpc);
      expect(bulk.azimuthOffsetDeg[i]).toBe(s.azimuthOffsetDeg);
    }
  });

  it('rejects empty arm lists and bad arms', () => {
    // input validation
    expect(() => offsetFromArms(1, 1, [], 8.5)).toThrow('no arms');
    expect(() =>
      armRadiusKpc(
        { name: 'bad', RrefKpc: -1, betaRefDeg: 0, pitchDeg: 10, betaMinDeg: 0, betaMaxDeg: 10 },
        5,
      ),
    ).toThrow('bad');
  });
});

describe('arm loci in the longitude–velocity plane', () => {
  it('agree with the kinematic model of the same curve', () => {
    // docs/methods.md, "Spiral arms": loci follow from the same rotation curve (forward model as oracle)
    const curve = makeRotationCurve('reid-2014');
    const arm = reid14.arms.find((a) => a.name === 'Sagittarius') as ArmSpec;
    const locus = armLocusLv(arm, curve, 2);
    for (let i = 0; i < locus.lDeg.length; i++) {
      expect(locus.vLsrKms[i]).toBeCloseTo(vLsrAtKms(locus.lDeg[i], 0, locus.distKpc[i], curve), 8);
      const kd = kinematicDistance(locus.lDeg[i], 0, locus.vLsrKms[i], curve);
      // at l = 0° (β = 0 on the Sun–centre line) v_LSR carries no distance; near the tangent the
      // roots are ill-conditioned
      if (
        kd.flags.some((f) => f === 'no-solution' || f === 'near-tangent' || f === 'beyond-terminal')
      )
        continue;
      const roots = [kd.nearKpc, kd.farKpc].filter((d): d is number => d !== null);
      expect(Math.min(...roots.map((d) => Math.abs(d - locus.distKpc[i])))).toBeLessThan(1e-6);
    }
    expect(locus.betaDeg[0]).toBe(arm.betaMinDeg);
  });
});
