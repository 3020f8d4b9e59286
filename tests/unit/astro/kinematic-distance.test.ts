import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  KINEMATIC_FLAG_BITS,
  flagsFromBits,
  frameShiftKms,
  isUnreliableLongitude,
  kinematicDistance,
  kinematicDistancesBulk,
  kinematicIntervalsBulk,
  monteCarloDistance,
  monteCarloDistancesBulk,
  resolveAmbiguity,
  vLsrAtKms,
} from '@/lib/astro/kinematic-distance';
import {
  curveWithConstants,
  makeRotationCurve,
  type RotationCurveName,
} from '@/lib/astro/rotation-curves';
import { deriveSeed, makeRng } from '@/lib/stats/rng';

const D = Math.PI / 180;
const MODEL_CURVES: RotationCurveName[] = ['flat', 'brand-blitz-1993', 'reid-2014', 'reid-2019'];

describe('flat rotation curve', () => {
  const flat = makeRotationCurve('flat', { R0Kpc: 8.5, theta0Kms: 220 });

  it('matches the closed form R = R0 Θ0 sin l / (Θ0 sin l + v) to 1e-6 kpc', () => {
    // closed form for a flat curve (docs/methods.md, "Kinematic distances")
    let checked = 0;
    for (let l = 1; l < 360; l += 7) {
      for (let v = -200; v <= 200; v += 9) {
        const s = Math.sin(l * D);
        const R = (8.5 * 220 * s) / (220 * s + v);
        const kd = kinematicDistance(l, 0, v, flat);
        if (kd.flags.includes('no-solution') || kd.flags.includes('beyond-terminal')) {
          // then the closed-form R is off the sight line or beyond the documented 1000 kpc limit
          const onLine =
            R > 0 && R <= 1000 && (Math.cos(l * D) > 0 ? R >= 8.5 * Math.abs(s) : R >= 8.5);
          expect(onLine).toBe(false);
          continue;
        }
        expect(kd.RKpc).not.toBeNull();
        expect(Math.abs((kd.RKpc as number) - R)).toBeLessThan(1e-6);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(1000);
  });

  it('has v_t = 110 km/s and d_t = 7.36 kpc at l = 30°', () => {
    // docs/methods.md, "Kinematic distances": l = 30°, R0 = 8.5, Θ0 = 220 → v_t = Θ0 (1 − sin l) = 110 km/s, d_t = R0 cos l
    const kd = kinematicDistance(30, 0, 110, flat);
    expect(kd.tangentKpc).toBeCloseTo(7.36, 2);
    expect(kd.nearKpc).toBeCloseTo(7.361, 3);
    expect(kd.farKpc).toBeCloseTo(7.361, 3);
    expect(kd.RKpc).toBeCloseTo(4.25, 6);
    expect(vLsrAtKms(30, 0, 8.5 * Math.cos(30 * D), flat)).toBeCloseTo(110, 9);
  });

  it('places velocities beyond the terminal velocity at the tangent point', () => {
    // docs/methods.md, "Kinematic distances": beyond-terminal velocities are flagged and placed at the tangent point
    const kd = kinematicDistance(30, 0, 125, flat);
    expect(kd.flags).toContain('beyond-terminal');
    expect(kd.nearKpc).toBe(kd.tangentKpc);
    expect(kd.farKpc).toBe(kd.tangentKpc);
    expect(kd.RKpc).toBeCloseTo(4.25, 12);
    // exact geometry: at v = 107 the roots' half-separation times |dv/dd| is 5.9 km/s < σ_v = 7
    expect(kinematicDistance(30, 0, 107, flat).flags).toContain('near-tangent');
    // … and 9.7 km/s at v = 105: resolved with σ_v = 7, not with σ_v = 12
    expect(kinematicDistance(30, 0, 105, flat).flags).not.toContain('near-tangent');
    expect(kinematicDistance(30, 0, 105, flat, 12).flags).toContain('near-tangent');
  });

  it('reports one root, as far, outside the solar circle', () => {
    // documented API: single root in farKpc, nearKpc null, flag 'outer-galaxy'
    const kd = kinematicDistance(120, 0, -40, flat);
    expect(kd.flags).toEqual(['outer-galaxy']);
    expect(kd.nearKpc).toBeNull();
    expect(kd.tangentKpc).toBeNull();
    expect(vLsrAtKms(120, 0, kd.farKpc as number, flat)).toBeCloseTo(-40, 9);
    const inner = kinematicDistance(40, 0, -20, flat);
    expect(inner.flags).toContain('outer-galaxy');
    expect(inner.nearKpc).toBeNull();
    expect(inner.farKpc as number).toBeGreaterThan(2 * 8.5 * Math.cos(40 * D));
  });

  it('flags forbidden velocities and unreliable longitudes', () => {
    // circular rotation: v > 0 is impossible in the second quadrant; l = 0 carries no distance
    expect(kinematicDistance(120, 0, 30, flat).flags).toContain('no-solution');
    expect(kinematicDistance(120, 0, 30, flat).farKpc).toBeNull();
    expect(kinematicDistance(0, 0, 10, flat).flags).toEqual([
      'unreliable-longitude',
      'no-solution',
    ]);
    expect(kinematicDistance(185, 0, -3, flat).flags).toContain('unreliable-longitude');
    expect(kinematicDistance(355, 0, -3, flat).flags).toContain('unreliable-longitude');
    expect(kinematicDistance(60, 0, 20, flat).flags).toEqual([]);
  });

  it('divides in-plane distances by cos b', () => {
    // docs/methods.md, "Kinematic distances": line-of-sight distance = in-plane distance / cos b
    const b = 3;
    const v = vLsrAtKms(40, b, 3, flat);
    const kd = kinematicDistance(40, b, v, flat);
    expect(kd.nearKpc).toBeCloseTo(3, 9);
    const dPlane = 3 * Math.cos(b * D);
    expect(kd.RKpc).toBeCloseTo(
      Math.sqrt(8.5 ** 2 + dPlane ** 2 - 2 * 8.5 * dPlane * Math.cos(40 * D)),
      9,
    );
  });
});

describe('every curve', () => {
  it('round-trips distance → v_LSR → distance across the disc, choosing near/far correctly', () => {
    // brute-force oracle: the forward model v_LSR(d) of docs/methods.md, "Kinematic distances"
    for (const name of MODEL_CURVES) {
      const curve = makeRotationCurve(name);
      const R0 = curve.R0Kpc;
      fc.assert(
        fc.property(
          fc.integer({ min: 0, max: 3_599_999 }).map((x) => x / 10_000),
          fc.integer({ min: -15_000, max: 15_000 }).map((x) => x / 10_000),
          fc.integer({ min: 500, max: 250_000 }).map((x) => x / 10_000),
          (l, b, d) => {
            const s = Math.sin(l * D);
            const c = Math.cos(l * D);
            fc.pre(Math.abs(s) > 0.02);
            const dPlane = d * Math.cos(b * D);
            const dt = R0 * c;
            fc.pre(c <= 0 || Math.abs(dPlane - dt) > 0.05);
            const R = Math.sqrt(R0 * R0 + dPlane * dPlane - 2 * R0 * dPlane * c);
            fc.pre(Math.abs(R - R0) > 1e-3);
            const v = vLsrAtKms(l, b, d, curve);
            const kd = kinematicDistance(l, b, v, curve);
            expect(kd.RKpc as number).toBeCloseTo(R, 7);
            if (R > R0) {
              expect(kd.flags).toContain('outer-galaxy');
              expect(kd.nearKpc).toBeNull();
              expect(Math.abs((kd.farKpc as number) - d)).toBeLessThan(1e-6 * Math.max(1, d));
            } else {
              const root = dPlane < dt ? kd.nearKpc : kd.farKpc;
              expect(Math.abs((root as number) - d)).toBeLessThan(1e-6 * Math.max(1, d));
            }
          },
        ),
        { numRuns: 400 },
      );
    }
  });

  it('bulk results equal scalar results', () => {
    // the scalar solver (exact bisection) is the oracle for the tabulated bulk solver
    const rng = makeRng(11);
    const n = 3000;
    const l = Float64Array.from({ length: n }, () => rng.next() * 360);
    const b = Float64Array.from({ length: n }, () => rng.next() * 4 - 2);
    const v = Float64Array.from({ length: n }, () => rng.next() * 300 - 150);
    for (const name of MODEL_CURVES) {
      const curve = makeRotationCurve(name);
      const bulk = kinematicDistancesBulk(l, b, v, curve);
      for (let i = 0; i < n; i++) {
        const s = kinematicDistance(l[i], b[i], v[i], curve);
        expect(flagsFromBits(bulk.flags[i])).toEqual(s.flags);
        for (const [col, val] of [
          [bulk.RKpc[i], s.RKpc],
          [bulk.nearKpc[i], s.nearKpc],
          [bulk.farKpc[i], s.farKpc],
          [bulk.tangentKpc[i], s.tangentKpc],
        ] as const) {
          if (val === null) expect(col).toBeNaN();
          else expect(Math.abs(col - val)).toBeLessThan(1e-9 * Math.max(1, val));
        }
      }
    }
  });

  it('works for a tabulated curve', () => {
    // brute-force oracle: forward model on the same table
    const curve = makeRotationCurve('table', {
      R0Kpc: 8.3,
      table: [
        [1, 180],
        [4, 215],
        [8.3, 230],
        [20, 235],
      ],
    });
    const v = vLsrAtKms(50, 0, 9, curve);
    expect(kinematicDistance(50, 0, v, curve).farKpc).toBeCloseTo(9, 8);
    expect(Array.from(KINEMATIC_FLAG_BITS ? Object.values(KINEMATIC_FLAG_BITS) : [])).toEqual([
      1, 2, 4, 8, 16,
    ]);
  });
});

describe('Monte Carlo distances', () => {
  const curve = makeRotationCurve('reid-2014');

  it('is reproducible for a seed and differs between seeds', () => {
    // seeded reproducibility (common practice)
    const a = monteCarloDistance(35, 0.1, 60, 3, curve, { draws: 500, seed: 42 });
    const b = monteCarloDistance(35, 0.1, 60, 3, curve, { draws: 500, seed: 42 });
    const c = monteCarloDistance(35, 0.1, 60, 3, curve, { draws: 500, seed: 43 });
    expect(b).toEqual(a);
    expect(c.near?.medianKpc).not.toBe(a.near?.medianKpc);
    expect(a.sigmaTotalKms).toBeCloseTo(Math.hypot(3, 7), 12);
  });

  it('gives sane intervals that match linear error propagation', () => {
    // first-order propagation: σ_d ≈ |∂d/∂v| σ_v (common practice)
    const l = 35;
    const v = 50;
    const sigma = Math.hypot(2, 7);
    const mc = monteCarloDistance(l, 0, v, 2, curve, { draws: 4000, seed: 7 });
    const kd = kinematicDistance(l, 0, v, curve);
    const h = 0.01;
    const slope =
      ((kinematicDistance(l, 0, v + h, curve).nearKpc as number) -
        (kinematicDistance(l, 0, v - h, curve).nearKpc as number)) /
      (2 * h);
    const near = mc.near!;
    expect(near.loKpc).toBeLessThan(near.medianKpc);
    expect(near.medianKpc).toBeLessThan(near.hiKpc);
    expect(Math.abs(near.medianKpc - (kd.nearKpc as number))).toBeLessThan(0.05);
    expect((near.hiKpc - near.loKpc) / 2).toBeGreaterThan(0.8 * Math.abs(slope) * sigma);
    expect((near.hiKpc - near.loKpc) / 2).toBeLessThan(1.25 * Math.abs(slope) * sigma);
    expect(near.fraction).toBe(1);
    expect(mc.far!.medianKpc).toBeGreaterThan(near.medianKpc);
  });

  it('collapses to the scalar solution with zero dispersion', () => {
    // no dispersion → every draw equals the point solution
    const mc = monteCarloDistance(35, 0, 50, 0, curve, { draws: 20, sigmaStreamKms: 0 });
    const kd = kinematicDistance(35, 0, 50, curve);
    expect(mc.near!.medianKpc).toBeCloseTo(kd.nearKpc as number, 9);
    expect(mc.near!.loKpc).toBeCloseTo(kd.nearKpc as number, 9);
    expect(mc.far!.hiKpc).toBeCloseTo(kd.farKpc as number, 9);
  });

  it('bulk equals the single-source call with the derived seed', () => {
    // documented seeding: source i uses deriveSeed(seed, i)
    const l = Float64Array.of(35, 120, 300);
    const b = Float64Array.of(0, 0.5, -0.2);
    const v = Float64Array.of(50, -60, -30);
    const bulk = monteCarloDistancesBulk(l, b, v, 2, curve, { draws: 300, seed: 9 });
    for (let i = 0; i < 3; i++) {
      const one = monteCarloDistance(l[i], b[i], v[i], 2, curve, {
        draws: 300,
        seed: deriveSeed(9, i),
      });
      expect(bulk.farMedianKpc[i]).toBe(one.far?.medianKpc);
      expect(bulk.farFraction[i]).toBe(one.far?.fraction);
      if (one.near) expect(bulk.nearLoKpc[i]).toBe(one.near.loKpc);
      else expect(bulk.nearLoKpc[i]).toBeNaN();
    }
  });
});

describe('near/far ambiguity', () => {
  it('follows the documented rules', () => {
    // docs/methods.md, "Kinematic distances", rules: independent distance first, else latitude with 2.5 scale heights
    expect(resolveAmbiguity({ nearKpc: null, farKpc: null, bDeg: 0 }).choice).toBe('unresolved');
    expect(resolveAmbiguity({ nearKpc: null, farKpc: 12, bDeg: 0 })).toMatchObject({
      choice: 'single',
      distKpc: 12,
    });
    expect(resolveAmbiguity({ nearKpc: 7.36, farKpc: 7.36, bDeg: 0 })).toMatchObject({
      choice: 'tangent',
      distKpc: 7.36,
    });
    expect(
      resolveAmbiguity({ nearKpc: 3, farKpc: 11, bDeg: 0, independentDistKpc: 10 }),
    ).toMatchObject({ choice: 'far', distKpc: 11 });
    expect(
      resolveAmbiguity({
        nearKpc: 3,
        farKpc: 11,
        bDeg: 0,
        independentDistKpc: 4,
        independentErrKpc: 0.5,
      }),
    ).toMatchObject({ choice: 'near', distKpc: 3 });
    expect(
      resolveAmbiguity({
        nearKpc: 3,
        farKpc: 11,
        bDeg: 0,
        independentDistKpc: 7.2,
        independentErrKpc: 2,
      }).choice,
    ).toBe('unresolved');
    // far root at 11 kpc and b = 1° → |z| = 0.192 kpc > 2.5 × 0.06 kpc
    const lat = resolveAmbiguity({ nearKpc: 3, farKpc: 11, bDeg: 1 });
    expect(lat).toMatchObject({ choice: 'near', distKpc: 3 });
    expect(lat.reason).toContain('0.192');
    expect(resolveAmbiguity({ nearKpc: 3, farKpc: 11, bDeg: 0.5 }).choice).toBe('unresolved');
    expect(
      resolveAmbiguity({ nearKpc: 3, farKpc: 11, bDeg: 0.5, scaleHeightKpc: 0.03 }).choice,
    ).toBe('near');
    expect(resolveAmbiguity({ nearKpc: 3, farKpc: 11, bDeg: -1, maxScaleHeights: 4 }).choice).toBe(
      'unresolved',
    );
    expect(() => resolveAmbiguity({ nearKpc: 3, farKpc: 11, bDeg: 0, scaleHeightKpc: 0 })).toThrow(
      'scaleHeightKpc',
    );
  });
});

describe('conventions of the published curves', () => {
  it('Brand & Blitz (1993) with Θ0 = 220 km/s in the v_LSR formula', () => {
    // independent hand computation from the Brand & Blitz (1993) formula, Θ0 = 220 in v_LSR,
    // by scanning v(d) along the sight line in 1 pc steps and bisecting (no published worked
    // example found here)
    const bb = makeRotationCurve('brand-blitz-1993');
    const a = kinematicDistance(60, 0, 10, bb);
    expect(a.nearKpc).toBeCloseTo(0.682, 3);
    expect(a.farKpc).toBeCloseTo(7.818, 3);
    const b = kinematicDistance(30, 0, 80, bb);
    expect(b.nearKpc).toBeCloseTo(4.9464, 3);
    expect(b.farKpc).toBeCloseTo(9.7761, 3);
    const c = kinematicDistance(135, 0, -40, bb);
    expect(c.nearKpc).toBeNull();
    expect(c.farKpc).toBeCloseTo(4.0861, 3);
  });

  it('moves standard-LSR velocities into the Reid et al. (2014) frame', () => {
    const r14 = makeRotationCurve('reid-2014');
    // hand computation from Reid et al. (2014) model A5 and the standard solar motion:
    // l = 30°, b = 0: (10.7 − 10.27) cos 30° + (15.6 − 15.32) sin 30° = 0.51239 km/s
    expect(frameShiftKms(30, 0, r14)).toBeCloseTo(0.51239, 5);
    // b = 90°: W only, 8.9 − 7.74 = 1.16 km/s
    expect(frameShiftKms(0, 90, r14)).toBeCloseTo(1.16, 10);
    // curves without a frame: no shift
    expect(frameShiftKms(30, 0, makeRotationCurve('flat'))).toBe(0);
  });

  it('inverts the frame model that an independent vector computation gives', () => {
    // independent oracle: 3-D velocities. Source moves at Θ(R) + V_s along its rotation
    // direction; the Sun moves at Θ0 plus the curve's solar motion; the observed heliocentric
    // velocity is converted to the standard LSR with the standard solar motion (common practice)
    const curve = makeRotationCurve('reid-2014');
    const R0 = curve.R0Kpc;
    const f = curve.frame!;
    const D2 = Math.PI / 180;
    for (const [l, b, d] of [
      [30, 0, 2],
      [30, 0.5, 11],
      [120, -1, 5],
      [300, 0.3, 3],
    ]) {
      const n = [
        Math.cos(b * D2) * Math.cos(l * D2),
        Math.cos(b * D2) * Math.sin(l * D2),
        Math.sin(b * D2),
      ];
      // x toward the Galactic centre from the Sun, y toward l = 90°, z north; centre at (R0, 0, 0)
      const p = [d * n[0] - R0, d * n[1]]; // source relative to the centre
      const R = Math.hypot(p[0], p[1]);
      const speed = curve.thetaKms(R) + f.sourceVKms;
      // rotation at the Sun points to +y (toward l = 90°); direction at p is perpendicular to p
      const vSrc = [(p[1] / R) * speed, (-p[0] / R) * speed];
      const vSun = [f.solarMotion.uKms, curve.theta0Kms + f.solarMotion.vKms, f.solarMotion.wKms];
      const vHelio = (vSrc[0] - vSun[0]) * n[0] + (vSrc[1] - vSun[1]) * n[1] - vSun[2] * n[2];
      const std = 10.27 * n[0] + 15.32 * n[1] + 7.74 * n[2]; // standard solar motion
      const vStd = vHelio + std;
      expect(vLsrAtKms(l, b, d, curve)).toBeCloseTo(vStd, 9);
      const kd = kinematicDistance(l, b, vStd, curve);
      const roots = [kd.nearKpc, kd.farKpc].filter((x): x is number => x !== null);
      expect(Math.min(...roots.map((x) => Math.abs(x - d)))).toBeLessThan(1e-6);
    }
  });

  it('scales the near-tangent window with the velocity uncertainty', () => {
    const flat = makeRotationCurve('flat');
    // exact geometry, flat curve: at l = 80° the terminal velocity is 220 (1 − sin 80°) = 3.34 km/s;
    // v = 0 puts the near root at the Sun (d = 0) and the far root at 2 R0 cos l = 2.95 kpc
    expect(kinematicDistance(80, 0, 0.5, flat, 1).flags).not.toContain('near-tangent');
    expect(kinematicDistance(80, 0, 0.5, flat).flags).toContain('near-tangent');
    expect(() => kinematicDistance(80, 0, 0.5, flat, 0)).toThrow('velocity uncertainty 0');
  });

  it('shares one rule for the unreliable longitudes', () => {
    // common practice: ±15° around l = 0° and 180°
    expect(isUnreliableLongitude(14.9)).toBe(true);
    expect(isUnreliableLongitude(15.1)).toBe(false);
    expect(isUnreliableLongitude(-14)).toBe(true);
    expect(isUnreliableLongitude(194)).toBe(true);
    expect(isUnreliableLongitude(196)).toBe(false);
  });
});

describe('kinematicIntervalsBulk', () => {
  const flat = makeRotationCurve('flat', { R0Kpc: 8.5, theta0Kms: 220 });
  const closedForm = (l: number, v: number) => {
    // flat closed form R = R0 Θ0 sin l / (Θ0 sin l + v), d = R0 cos l ± √(R² − R0² sin² l) (exact geometry)
    const R = (8.5 * 220 * Math.sin(l * D)) / (220 * Math.sin(l * D) + v);
    const q = Math.sqrt(R * R - 8.5 ** 2 * Math.sin(l * D) ** 2);
    return { near: 8.5 * Math.cos(l * D) - q, far: 8.5 * Math.cos(l * D) + q, R };
  };

  it('gives the closed-form roots at v ∓ 1σ as the 16th/84th percentiles of a monotonic root', () => {
    const l = Float64Array.of(30, 45);
    const b = Float64Array.of(0, 0);
    const v = Float64Array.of(50, 40);
    const r = kinematicIntervalsBulk(l, b, v, Float64Array.of(7, 3), flat, { draws: 4000 });
    expect(r.constantsDrawn).toBe(false); // the IAU 1985 constants carry no uncertainty (Kerr & Lynden-Bell 1986)
    [7, 3].forEach((sigma, i) => {
      // normal 16th/84th percentiles at ∓0.9945σ (standard normal table); ±0.06σ for 4000 draws
      const z = 0.9945;
      const at = (k: number) => closedForm(l[i], v[i] + k * sigma);
      expect(r.near.loKpc[i]).toBeGreaterThan(at(-z - 0.06).near);
      expect(r.near.loKpc[i]).toBeLessThan(at(-z + 0.06).near);
      expect(r.near.hiKpc[i]).toBeGreaterThan(at(z - 0.06).near);
      expect(r.near.hiKpc[i]).toBeLessThan(at(z + 0.06).near);
      expect(r.far.loKpc[i]).toBeGreaterThan(at(z + 0.06).far);
      expect(r.far.hiKpc[i]).toBeLessThan(at(-z - 0.06).far);
      expect(r.near.fraction[i]).toBe(1);
      expect(r.single.fraction[i]).toBe(0);
    });
  });

  it('keeps the single outer-Galaxy root apart from near and far', () => {
    const r = kinematicIntervalsBulk(
      Float64Array.of(120),
      Float64Array.of(0),
      Float64Array.of(-50),
      7,
      flat,
    );
    expect(r.single.fraction[0]).toBe(1);
    expect(Number.isNaN(r.far.loKpc[0])).toBe(true);
    const lo = closedForm(120, -50 + 1.3 * 7);
    const hi = closedForm(120, -50 - 1.3 * 7);
    const single = (c: { R: number }) =>
      8.5 * Math.cos(120 * D) + Math.sqrt(c.R ** 2 - 8.5 ** 2 * Math.sin(120 * D) ** 2);
    // the outer root grows as v falls (exact geometry); bounds ±1.3σ hold the 68 % interval of 200 draws
    expect(r.single.loKpc[0]).toBeGreaterThan(single(lo));
    expect(r.single.hiKpc[0]).toBeLessThan(single(hi));
  });

  it('gives a source the same interval alone and in a batch', () => {
    const curve = makeRotationCurve('reid-2014');
    const alone = kinematicIntervalsBulk(
      Float64Array.of(40),
      Float64Array.of(0.2),
      Float64Array.of(40),
      5,
      curve,
      { draws: 50 },
    );
    const batch = kinematicIntervalsBulk(
      Float64Array.of(40, 60, 130),
      Float64Array.of(0.2, 0, 1),
      Float64Array.of(40, 20, -40),
      5,
      curve,
      { draws: 50 },
    );
    expect(batch.near.loKpc[0]).toBe(alone.near.loKpc[0]);
    expect(batch.far.hiKpc[0]).toBe(alone.far.hiKpc[0]);
  });

  it('spreads a source by the published R0 and Θ0 errors when its velocity is nearly exact', () => {
    const curve = makeRotationCurve('reid-2014');
    const r = kinematicIntervalsBulk(
      Float64Array.of(40),
      Float64Array.of(0),
      Float64Array.of(40),
      0.01,
      curve,
      {
        draws: 1000,
      },
    );
    expect(r.constantsDrawn).toBe(true);
    // Independent computation: draws of our own (other seed) solved by bisection on the exact
    // curves; their 16th/84th percentiles agree to 0.3 of the width (sampling error of 300 and
    // 600 draws)
    const rng = makeRng(99);
    const own = Array.from({ length: 600 }, () => {
      const c = curveWithConstants(
        curve,
        8.34 + 0.16 * rng.normal(),
        curve.theta0Kms + 8 * rng.normal(),
      );
      return kinematicDistance(40, 0, 40, c).nearKpc!;
    }).sort((x, y) => x - y);
    const [ownLo, ownHi] = [own[Math.round(0.16 * 599)], own[Math.round(0.84 * 599)]];
    const width = ownHi - ownLo;
    expect(Math.abs(r.near.loKpc[0] - ownLo)).toBeLessThan(0.3 * width);
    expect(Math.abs(r.near.hiKpc[0] - ownHi)).toBeLessThan(0.3 * width);
    expect(r.near.hiKpc[0] - r.near.loKpc[0]).toBeGreaterThan(0.05);
  });
});
