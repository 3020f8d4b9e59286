import { describe, expect, it } from 'vitest';
import {
  ROTATION_CURVE_PRESETS,
  curveWithConstants,
  makeRotationCurve,
} from '@/lib/astro/rotation-curves';

describe('rotation curves', () => {
  it('reproduces Θ(R0) of each published model', () => {
    // Brand & Blitz 1993: the fit gives Θ(R0) = 220 (a1 + a3) = 223.16 km/s (hand computation) …
    const bb = makeRotationCurve('brand-blitz-1993');
    expect(bb.thetaKms(8.5)).toBeCloseTo(223.16, 2);
    // … but the v_LSR formula takes Θ0 = 220 km/s, as the curve is used in practice (common practice)
    expect(bb.theta0Kms).toBe(220);
    // Reid et al. 2014 URC constants: Θ(R0) = 241.0 km/s (hand computation from their a1, a2, a3)
    expect(makeRotationCurve('reid-2014').theta0Kms).toBeCloseTo(241.0, 1);
    // Reid et al. 2019 form (Wenger et al. refit): Θ(R0) ≈ 237.0 km/s (hand computation)
    expect(makeRotationCurve('reid-2019').theta0Kms).toBeCloseTo(237.0, 0);
    // IAU 1985 values R0 = 8.5 kpc, Θ0 = 220 km/s (common practice)
    const flat = makeRotationCurve('flat');
    expect(flat.R0Kpc).toBe(8.5);
    expect(flat.theta0Kms).toBe(220);
    expect(flat.thetaKms(3)).toBe(220);
  });

  it('uses the published constants and R0 of each model', () => {
    // Brand & Blitz (1993) constants; Reid et al. (2014) model A5; Reid et al. (2019) refit
    expect(makeRotationCurve('brand-blitz-1993').params).toMatchObject({
      a1: 1.0074,
      a2: 0.0382,
      a3: 0.00698,
      theta0Kms: 220,
    });
    expect(makeRotationCurve('reid-2014').R0Kpc).toBe(8.34);
    expect(makeRotationCurve('reid-2014').params).toMatchObject({ a1: 241, a2: 0.9, a3: 1.46 });
    expect(makeRotationCurve('reid-2019').R0Kpc).toBe(8.166);
    expect(makeRotationCurve('reid-2019').params).toMatchObject({ a2: 0.977, a3: 1.623 });
  });

  it('follows the Brand & Blitz formula at other radii', () => {
    // Brand & Blitz 1993: Θ = Θ0 (a1 (R/R0)^a2 + a3)
    const c = makeRotationCurve('brand-blitz-1993');
    expect(c.thetaKms(4)).toBeCloseTo(220 * (1.0074 * (4 / 8.5) ** 0.0382 + 0.00698), 10);
  });

  it('applies overrides as documented', () => {
    // documented override semantics
    expect(makeRotationCurve('flat', { theta0Kms: 240, R0Kpc: 8.3 }).theta0Kms).toBe(240);
    const bb = makeRotationCurve('brand-blitz-1993', { theta0Kms: 230 });
    expect(bb.theta0Kms).toBe(230);
    expect(bb.thetaKms(8.5)).toBeCloseTo(230 * (1.0074 + 0.00698), 10);
    const r14 = makeRotationCurve('reid-2014', { theta0Kms: 236 });
    expect(r14.theta0Kms).toBeCloseTo(236, 10);
    expect(r14.thetaKms(12) / makeRotationCurve('reid-2014').thetaKms(12)).toBeCloseTo(
      236 / 240.9986745581,
      8,
    );
    expect(makeRotationCurve('reid-2019', { theta0Kms: 230 }).theta0Kms).toBeCloseTo(230, 10);
    expect(makeRotationCurve('reid-2014', { R0Kpc: 8.0 }).theta0Kms).toBeCloseTo(
      makeRotationCurve('reid-2014').theta0Kms,
      10,
    );
    expect(makeRotationCurve('reid-2014', { params: { a1: 230 } }).params.a1).toBe(230);
  });

  it('rejects bad constants with a clear message', () => {
    // input validation
    expect(() => makeRotationCurve('reid-2014', { params: { a9: 1 } })).toThrow('a9');
    expect(() => makeRotationCurve('flat', { R0Kpc: -1 })).toThrow('R0Kpc = -1');
    expect(() => makeRotationCurve('table')).toThrow('two');
    expect(() =>
      makeRotationCurve('table', {
        table: [
          [4, 200],
          [3, 210],
        ],
      }),
    ).toThrow('row 2');
    expect(() =>
      makeRotationCurve('table', {
        table: [
          [4, 200],
          [8, 500],
        ],
      }),
    ).toThrow('Θ/R');
  });

  it('interpolates a table linearly and holds the end values', () => {
    // documented table rule (linear interpolation, flat beyond the ends)
    const c = makeRotationCurve('table', {
      R0Kpc: 8,
      table: [
        [2, 200],
        [8, 220],
        [16, 240],
      ],
    });
    expect(c.thetaKms(5)).toBeCloseTo(210, 12);
    expect(c.thetaKms(12)).toBeCloseTo(230, 12);
    expect(c.thetaKms(1)).toBe(200);
    expect(c.thetaKms(30)).toBe(240);
    expect(c.theta0Kms).toBe(220);
    expect(
      makeRotationCurve('table', {
        R0Kpc: 8,
        theta0Kms: 231,
        table: [
          [2, 200],
          [8, 220],
          [16, 240],
        ],
      }).thetaKms(16),
    ).toBeCloseTo(252, 10);
  });

  it('lists every curve for forms', () => {
    // presets mirror makeRotationCurve defaults
    expect(ROTATION_CURVE_PRESETS.map((p) => p.name)).toEqual([
      'flat',
      'brand-blitz-1993',
      'clemens-1985',
      'reid-2014',
      'reid-2019',
      'table',
    ]);
    for (const p of ROTATION_CURVE_PRESETS) {
      expect(p.source.length).toBeGreaterThan(10);
      if (p.name !== 'table') expect(p.theta0Kms).toBe(makeRotationCurve(p.name).theta0Kms);
    }
  });

  it('carries the published 1σ of R0 and Θ0', () => {
    // Reid et al. (2014) abstract: R0 = 8.34 ± 0.16 kpc, Θ0 = 240 ± 8 km/s
    expect(makeRotationCurve('reid-2014')).toMatchObject({ R0ErrKpc: 0.16, theta0ErrKms: 8 });
    // Reid et al. (2019) abstract: R0 = 8.15 ± 0.15 kpc, Θ0 = 236 ± 7 km/s
    expect(makeRotationCurve('reid-2019')).toMatchObject({ R0ErrKpc: 0.15, theta0ErrKms: 7 });
    // IAU 1985 standard values are adopted, not measured (Kerr & Lynden-Bell 1986)
    for (const name of ['flat', 'brand-blitz-1993'] as const) {
      expect(makeRotationCurve(name)).toMatchObject({ R0ErrKpc: null, theta0ErrKms: null });
    }
  });

  it('replaces R0 and Θ0 and keeps the model', () => {
    // universal curve: Θ depends on R only through R/(a2 R0), so Θ_new(R R0'/R0) = Θ(R) Θ0'/Θ(R0) (exact scaling)
    const r14 = makeRotationCurve('reid-2014');
    const moved = curveWithConstants(r14, 8.0, 230);
    expect(moved.R0Kpc).toBe(8.0);
    expect(moved.theta0Kms).toBeCloseTo(230, 10);
    expect(moved).toMatchObject({ name: 'reid-2014', R0ErrKpc: 0.16, theta0ErrKms: 8 });
    for (const R of [3, 8.34, 15]) {
      expect(moved.thetaKms((R * 8.0) / 8.34)).toBeCloseTo(
        (r14.thetaKms(R) * 230) / r14.theta0Kms,
        9,
      );
    }
    // flat: Θ = Θ0 everywhere (definition)
    expect(curveWithConstants(makeRotationCurve('flat'), 8.2, 233).thetaKms(5)).toBe(233);
    // table: Θ scaled by Θ0'/Θ(R0') of the rows (documented table rule); 8 kpc row = 220 km/s
    const table = makeRotationCurve('table', {
      R0Kpc: 8,
      table: [
        [2, 200],
        [8, 220],
        [16, 240],
      ],
    });
    const t2 = curveWithConstants(table, 8, 231);
    expect(t2.thetaKms(16)).toBeCloseTo(252, 10);
    // same constants give the same curve
    const same = curveWithConstants(r14, r14.R0Kpc, r14.theta0Kms);
    expect(same.thetaKms(11)).toBeCloseTo(r14.thetaKms(11), 10);
    expect(() => curveWithConstants(r14, -1, 230)).toThrow('R0Kpc = -1');
    expect(() => curveWithConstants(r14, 8, NaN)).toThrow('theta0Kms = NaN');
  });

  it('follows the Clemens (1985) polynomials', () => {
    const c = makeRotationCurve('clemens-1985');
    expect(c.R0Kpc).toBe(8.5); // Clemens (1985): IAU 1985 R0
    expect(c.theta0Kms).toBe(220); // Clemens (1985): IAU 1985 Θ0, used in the v_LSR formula
    // Clemens (1985) Table 3 coefficients evaluated by hand (the paper's tabulated Θ not checked here)
    expect(c.thetaKms(4)).toBeCloseTo(213.057, 2);
    expect(c.thetaKms(8)).toBeCloseTo(223.446, 2);
    expect(c.thetaKms(12)).toBeCloseTo(224.97, 2);
    expect(c.thetaKms(20)).toBe(234.88); // Clemens (1985): constant beyond 1.6 R0
    // the four pieces join at R/R0 = 0.09, 0.45 and 1.6 (independent check of the coefficients)
    for (const x of [0.09, 0.45, 1.6]) {
      const R = x * 8.5;
      expect(Math.abs(c.thetaKms(R * (1 - 1e-9)) - c.thetaKms(R))).toBeLessThan(0.05);
    }
    // scaling rule: Θ0' = 240 scales Θ by 240/220, R0' = 8 scales R by 8/8.5 (documented)
    const moved = makeRotationCurve('clemens-1985', { R0Kpc: 8, theta0Kms: 240 });
    expect(moved.thetaKms(4 * (8 / 8.5))).toBeCloseTo((213.057 * 240) / 220, 2);
  });

  it('states the frame each curve was fitted in', () => {
    // Reid et al. (2014) model A5: (U, V, W)⊙ = (10.7, 15.6, 8.9), (U_s, V_s) = (2.9, −1.6) km/s
    expect(makeRotationCurve('reid-2014').frame).toEqual({
      solarMotion: { uKms: 10.7, vKms: 15.6, wKms: 8.9 },
      sourceUKms: 2.9,
      sourceVKms: -1.6,
    });
    // curves without a fitted frame take standard-LSR velocities as they are (common practice)
    for (const name of ['flat', 'brand-blitz-1993', 'clemens-1985'] as const) {
      expect(makeRotationCurve(name).frame).toBeNull();
    }
    // curveWithConstants keeps the frame
    expect(curveWithConstants(makeRotationCurve('reid-2019'), 8.2, 230).frame).toEqual(
      makeRotationCurve('reid-2019').frame,
    );
  });
});
