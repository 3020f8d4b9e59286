import { beforeAll, describe, expect, it } from 'vitest';
import { Client, newUser } from '../helpers/client';

type ApiErrorBody = {
  error: { code: string; message: string; details?: Array<{ index: number; message: string }> };
};
type Points = { points: Array<[number, number]> };
type Interval = [number, number];
type Row = {
  R: number | null;
  near: number | null;
  far: number | null;
  single: number | null;
  tangent: number | null;
  flags: string[];
  intervals: { near: Interval | null; far: Interval | null; single: Interval | null } | null;
};
type Distances = {
  curve: {
    name: string;
    R0: number;
    theta0: number;
    R0Err: number | null;
    theta0Err: number | null;
  };
  intervals: {
    draws: number;
    defaultVelocityErrKms: number;
    constantsDrawn: boolean;
    note: string;
  };
  results: Row[];
};

const DEG = Math.PI / 180;
/** Difference of two longitudes in arcseconds, taking the wrap at 360° into account. */
const lonDiffArcsec = (a: number, b: number) => Math.abs(((a - b + 540) % 360) - 180) * 3600;

let user: Client;
beforeAll(async () => {
  user = (await newUser('tools')).client;
});

describe('POST /api/tools/convert', () => {
  it('answers 401 without a session or token', async () => {
    const anon = new Client();
    const r = await anon.json<ApiErrorBody>('POST', '/api/tools/convert', {
      from: 'equatorial',
      points: [[0, 0]],
    });
    expect(r.status).toBe(401);
    expect(r.body.error.code).toBe('unauthenticated');
    const k = await anon.json<ApiErrorBody>('POST', '/api/tools/kinematic-distance', {
      curve: 'flat',
      sources: [{ l: 30, b: 0, v: 50 }],
    });
    expect(k.status).toBe(401);
  });

  it('puts α = 266.40499°, δ = −28.93617° at the Galactic centre within 0.05″', async () => {
    const r = await user.json<Points>('POST', '/api/tools/convert', {
      from: 'equatorial',
      // Galactic centre in J2000: Hipparcos Catalogue Vol. 1 §1.5.3
      points: [[266.40499, -28.93617]],
    });
    expect(r.status).toBe(200);
    const [[l, b]] = r.body.points;
    expect(lonDiffArcsec(l, 0)).toBeLessThan(0.05); // Hipparcos Catalogue Vol. 1 §1.5.3
    expect(Math.abs(b) * 3600).toBeLessThan(0.05); // Hipparcos Catalogue Vol. 1 §1.5.3
  });

  it('reads sexagesimal RA/Dec text the same as the degrees it stands for', async () => {
    const r = await user.json<Points>('POST', '/api/tools/convert', {
      from: 'equatorial',
      // 17h45m37.1976s = 266.40499°, −28°56′10.212″ = −28.93617° (plain unit conversion)
      points: [
        ['17:45:37.1976', '-28:56:10.212'],
        [266.40499, -28.93617],
      ],
    });
    expect(r.status).toBe(200);
    const [a, b] = r.body.points;
    expect(lonDiffArcsec(a[0], b[0])).toBeLessThan(1e-6);
    expect(Math.abs(a[1] - b[1]) * 3600).toBeLessThan(1e-6);
  });

  it('turns the north Galactic pole into b = +90° and back', async () => {
    const r = await user.json<Points>('POST', '/api/tools/convert', {
      from: 'galactic',
      points: [[0, 90]],
    });
    expect(r.status).toBe(200);
    const [[ra, dec]] = r.body.points;
    expect(Math.abs(ra - 192.85948) * 3600 * Math.cos(dec * DEG)).toBeLessThan(0.05); // Hipparcos Catalogue Vol. 1 §1.5.3
    expect(Math.abs(dec - 27.12825) * 3600).toBeLessThan(0.05); // Hipparcos Catalogue Vol. 1 §1.5.3
  });

  it('round-trips equatorial → Galactic → equatorial to well under a milliarcsecond', async () => {
    const points: Array<[number, number]> = [];
    for (let i = 0; i < 200; i++) {
      points.push([(i * 37.3) % 360, -89 + ((i * 53.7) % 178)]);
    }
    const there = await user.json<Points>('POST', '/api/tools/convert', {
      from: 'equatorial',
      points,
    });
    expect(there.status).toBe(200);
    const back = await user.json<Points>('POST', '/api/tools/convert', {
      from: 'galactic',
      points: there.body.points,
    });
    expect(back.status).toBe(200);
    back.body.points.forEach(([ra, dec], i) => {
      expect(lonDiffArcsec(ra, points[i][0]) * Math.cos(dec * DEG)).toBeLessThan(1e-3);
      expect(Math.abs(dec - points[i][1]) * 3600).toBeLessThan(1e-3);
    });
  });

  it('answers 413 for 100 001 points, 200 for 100 000', async () => {
    const many = (n: number) => Array.from({ length: n }, (_, i) => [i % 360, 0]);
    const over = await user.json<ApiErrorBody>('POST', '/api/tools/convert', {
      from: 'galactic',
      points: many(100_001),
    });
    expect(over.status).toBe(413);
    expect(over.body.error.code).toBe('too_many_points');
    expect(over.body.error.message).toMatch(/100001/);
    const limit = await user.json<Points>('POST', '/api/tools/convert', {
      from: 'galactic',
      points: many(100_000),
    });
    expect(limit.status).toBe(200);
    expect(limit.body.points).toHaveLength(100_000);
  });

  it('answers 400 naming the index and the reason of a bad point', async () => {
    const points = Array.from({ length: 30 }, () => [10, 10]);
    points[17] = [10, 95];
    const r = await user.json<ApiErrorBody>('POST', '/api/tools/convert', {
      from: 'galactic',
      points,
    });
    expect(r.status).toBe(400);
    expect(r.body.error.message).toMatch(/^points\[17\]: .*latitude.*95.*−90…90/);
    expect(r.body.error.details?.[0].index).toBe(17);
    expect(r.body.error.details?.[0].message).toMatch(/95/);

    const text = await user.json<ApiErrorBody>('POST', '/api/tools/convert', {
      from: 'equatorial',
      points: [
        [1, 1],
        ['25:00:00', '+10:00:00'],
      ],
    });
    expect(text.status).toBe(400);
    expect(text.body.error.message).toMatch(/^points\[1\]: .*25:00:00.*hours must be below 24/);

    const shape = await user.json<ApiErrorBody>('POST', '/api/tools/convert', {
      from: 'galactic',
      points: [[1, 2, 3]],
    });
    expect(shape.status).toBe(400);
    expect(shape.body.error.details?.[0].index).toBe(0);

    const frame = await user.json<ApiErrorBody>('POST', '/api/tools/convert', {
      from: 'ecliptic',
      points: [[1, 2]],
    });
    expect(frame.status).toBe(400);
    expect(frame.body.error.message).toMatch(/^from: /);
  });

  it('works with a personal API token as Bearer', async () => {
    const created = await user.json<{ token: string }>('POST', '/api/tokens', { name: 'tools' });
    expect(created.status).toBe(201);
    const script = new Client();
    script.bearer = created.body.token;
    const r = await script.json<Points>('POST', '/api/tools/convert', {
      from: 'equatorial',
      points: [[266.40499, -28.93617]],
    });
    expect(r.status).toBe(200);
    expect(lonDiffArcsec(r.body.points[0][0], 0)).toBeLessThan(0.05); // Hipparcos Catalogue Vol. 1 §1.5.3
    const k = await script.json<Distances>('POST', '/api/tools/kinematic-distance', {
      curve: 'flat',
      sources: [{ l: 30, b: 0, v: 50 }],
    });
    expect(k.status).toBe(200);
    expect(k.body.results).toHaveLength(1);
  });
});

describe('POST /api/tools/kinematic-distance', () => {
  const flat = (sources: Array<{ l: number; b: number; v: number }>) =>
    user.json<Distances>('POST', '/api/tools/kinematic-distance', {
      curve: 'flat',
      R0: 8.5,
      theta0: 220,
      sources,
    });

  it('matches the flat-curve closed form R = R0 Θ0 sin l / (Θ0 sin l + v)', async () => {
    const [R0, theta0, l, v] = [8.5, 220, 30, 50];
    const r = await flat([{ l, b: 0, v }]);
    expect(r.status).toBe(200);
    // closed form for the flat curve (docs/methods.md, "Kinematic distances"; exact geometry)
    const R = (R0 * theta0 * Math.sin(l * DEG)) / (theta0 * Math.sin(l * DEG) + v);
    const root = Math.sqrt(R * R - R0 * R0 * Math.sin(l * DEG) ** 2);
    const [row] = r.body.results;
    expect(row.R).toBeCloseTo(R, 6);
    expect(row.near).toBeCloseTo(R0 * Math.cos(l * DEG) - root, 6); // exact geometry
    expect(row.far).toBeCloseTo(R0 * Math.cos(l * DEG) + root, 6); // exact geometry
    expect(row.single).toBeNull();
    expect(row.flags).toEqual([]);
    expect(r.body.curve).toMatchObject({ name: 'flat', R0: 8.5, theta0: 220 });
  });

  it('puts the tangent point of l = 30° at 7.36 kpc with terminal velocity 110 km/s', async () => {
    const r = await flat([
      // 3 km/s below terminal: half the root separation × |dv/dd| = 2 (v_t − v) = 6 km/s is
      // below the default σ_v of 7 km/s, so the roots cannot be told apart (docs/methods.md)
      { l: 30, b: 0, v: 107 },
      { l: 30, b: 0, v: 110 },
      { l: 30, b: 0, v: 112 },
    ]);
    expect(r.status).toBe(200);
    const [below, at, beyond] = r.body.results;
    // R0 = 8.5, Θ0 = 220, l = 30°: v_t = Θ0 (1 − sin l) = 110 km/s, d_t = R0 cos l = 7.36 kpc (exact geometry)
    for (const row of r.body.results) expect(row.tangent).toBeCloseTo(7.36, 2);
    expect(below.near).toBeLessThan(7.36);
    expect(below.far).toBeGreaterThan(7.36);
    expect(below.flags).toContain('near-tangent');
    expect(at.near).toBeCloseTo(7.36, 2); // exact geometry
    expect(at.far).toBeCloseTo(7.36, 2); // exact geometry
    expect(at.R).toBeCloseTo(4.25, 6); // R_t = R0 sin l (exact geometry)
    expect(beyond.flags).toContain('beyond-terminal');
    expect(beyond.near).toBeCloseTo(7.36, 2); // placed at the tangent point (common practice)
  });

  it('puts the outer-Galaxy root under single, not far, and nulls for a forbidden velocity', async () => {
    const r = await flat([
      { l: 120, b: 0, v: -50 },
      { l: 120, b: 0, v: 30 },
    ]);
    expect(r.status).toBe(200);
    const [outer, forbidden] = r.body.results;
    expect(outer.near).toBeNull();
    expect(outer.far).toBeNull();
    expect(outer.tangent).toBeNull();
    expect(outer.flags).toContain('outer-galaxy');
    // flat closed form, then d = R0 cos l + √(R² − R0² sin² l) (exact geometry)
    const sl = Math.sin(120 * DEG);
    const R = (8.5 * 220 * sl) / (220 * sl - 50);
    expect(outer.R).toBeCloseTo(R, 6);
    expect(outer.single).toBeCloseTo(
      8.5 * Math.cos(120 * DEG) + Math.sqrt(R * R - 8.5 ** 2 * sl * sl),
      6,
    );
    expect(outer.intervals?.single).not.toBeNull();
    expect(outer.intervals?.far).toBeNull();
    // A positive velocity in the second quadrant has no circular-rotation solution (common practice)
    expect(forbidden).toMatchObject({
      R: null,
      near: null,
      far: null,
      single: null,
      flags: ['no-solution'],
      intervals: { near: null, far: null, single: null },
    });
  });

  it('uses the published curve constants when R0 and Θ0 are left out', async () => {
    const r = await user.json<Distances>('POST', '/api/tools/kinematic-distance', {
      curve: 'reid-2014',
      sources: [{ l: 40, b: 0.5, v: 40 }],
    });
    expect(r.status).toBe(200);
    expect(r.body.curve.R0).toBe(8.34); // Reid et al. (2014), abstract
    // Θ(R0) = 240.9987 km/s of the a1 = 241 km/s curve (Reid et al. 2014), echoed as shown, not 240.999
    expect(r.body.curve.theta0).toBe(241);
    expect(r.body.curve).toMatchObject({ R0Err: 0.16, theta0Err: 8 }); // Reid et al. (2014), abstract
    expect(r.body.intervals.constantsDrawn).toBe(true);
    expect(r.body.results[0].near).not.toBeNull();
    expect(r.body.results[0].far).not.toBeNull();
  });

  it('gives 68 % Monte Carlo intervals that follow the velocity uncertainty through the closed form', async () => {
    const [R0, theta0, l, v] = [8.5, 220, 30, 50];
    const r = await user.json<Distances>('POST', '/api/tools/kinematic-distance', {
      curve: 'flat',
      R0,
      theta0,
      sources: [
        { l, b: 0, v },
        { l, b: 0, v, vErr: 1 },
      ],
    });
    expect(r.status).toBe(200);
    // The flat preset's R0 and Θ0 are adopted standards without an uncertainty (Kerr & Lynden-Bell 1986).
    expect(r.body.intervals).toMatchObject({ constantsDrawn: false, defaultVelocityErrKms: 7 });
    expect(r.body.intervals.draws).toBeGreaterThanOrEqual(100);
    // Independent computation: each root is monotonic in v, so its 16th/84th percentiles are the
    // closed-form roots at v ∓ σ (normal 16th/84th percentiles at ∓1σ); the bounds allow ±0.35σ
    // for the sampling error of a percentile from 100 draws.
    const roots = (vk: number) => {
      const R = (R0 * theta0 * Math.sin(l * DEG)) / (theta0 * Math.sin(l * DEG) + vk);
      const q = Math.sqrt(R * R - R0 * R0 * Math.sin(l * DEG) ** 2);
      return { near: R0 * Math.cos(l * DEG) - q, far: R0 * Math.cos(l * DEG) + q };
    };
    for (const [row, sigma] of [
      [r.body.results[0], 7],
      [r.body.results[1], 1],
    ] as const) {
      const [nearLo, nearHi] = row.intervals!.near!;
      const [farLo, farHi] = row.intervals!.far!;
      // near grows with v, far shrinks with v (exact geometry)
      expect(nearLo).toBeGreaterThan(roots(v - 1.35 * sigma).near);
      expect(nearLo).toBeLessThan(roots(v - 0.65 * sigma).near);
      expect(nearHi).toBeGreaterThan(roots(v + 0.65 * sigma).near);
      expect(nearHi).toBeLessThan(roots(v + 1.35 * sigma).near);
      expect(farLo).toBeGreaterThan(roots(v + 1.35 * sigma).far);
      expect(farLo).toBeLessThan(roots(v + 0.65 * sigma).far);
      expect(farHi).toBeGreaterThan(roots(v - 0.65 * sigma).far);
      expect(farHi).toBeLessThan(roots(v - 1.35 * sigma).far);
      expect(row.intervals!.single).toBeNull();
    }
  });

  it("widens the intervals with the curve constants' published errors", async () => {
    const body = (curve: string, extra: Record<string, number>) =>
      user.json<Distances>('POST', '/api/tools/kinematic-distance', {
        curve,
        sources: [{ l: 40, b: 0, v: 40, vErr: 1 }],
        ...extra,
      });
    const reid = await body('reid-2014', {});
    expect(reid.status).toBe(200);
    const [lo, hi] = reid.body.results[0].intervals!.near!;
    const near = reid.body.results[0].near!;
    expect(lo).toBeLessThan(near);
    expect(hi).toBeGreaterThan(near);
    // σ_v = 1 km/s alone spans about 0.03 kpc here (dd/dv ≈ 0.013 kpc per km/s, exact geometry);
    // R0 ± 0.16 kpc and Θ0 ± 8 km/s (Reid et al. 2014) widen it past 0.15 kpc
    expect(hi - lo).toBeGreaterThan(0.15);
  });

  it('leaves the intervals out beyond 10 000 sources and says so', async () => {
    const r = await user.json<Distances>('POST', '/api/tools/kinematic-distance', {
      curve: 'flat',
      sources: Array.from({ length: 10_001 }, (_, i) => ({ l: 20 + (i % 50), b: 0, v: 30 })),
    });
    expect(r.status).toBe(200);
    expect(r.body.intervals.draws).toBe(0);
    expect(r.body.intervals.note).toMatch(/10000/);
    expect(r.body.results[0].intervals).toBeNull();
    expect(r.body.results[0].near).not.toBeNull();
  });

  it('answers 413 for 100 001 sources and 400 naming the index of a bad source', async () => {
    const over = await user.json<ApiErrorBody>('POST', '/api/tools/kinematic-distance', {
      curve: 'flat',
      sources: Array.from({ length: 100_001 }, () => ({ l: 30, b: 0, v: 50 })),
    });
    expect(over.status).toBe(413);
    expect(over.body.error.code).toBe('too_many_points');

    const sources: Array<Record<string, unknown>> = Array.from({ length: 10 }, () => ({
      l: 30,
      b: 0,
      v: 50,
    }));
    sources[6] = { l: 30, b: 0, v: 'fast' };
    const bad = await user.json<ApiErrorBody>('POST', '/api/tools/kinematic-distance', {
      curve: 'flat',
      sources,
    });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/^sources\[6\]: v "fast" is not a finite number/);
    expect(bad.body.error.details?.[0].index).toBe(6);

    const badErr = await user.json<ApiErrorBody>('POST', '/api/tools/kinematic-distance', {
      curve: 'flat',
      sources: [
        { l: 30, b: 0, v: 50 },
        { l: 30, b: 0, v: 50, vErr: -2 },
      ],
    });
    expect(badErr.status).toBe(400);
    expect(badErr.body.error.message).toMatch(/^sources\[1\]: velocity uncertainty vErr -2/);

    const curve = await user.json<ApiErrorBody>('POST', '/api/tools/kinematic-distance', {
      curve: 'spiral',
      sources: [],
    });
    expect(curve.status).toBe(400);
    expect(curve.body.error.message).toMatch(/^curve: /);
  });
});
