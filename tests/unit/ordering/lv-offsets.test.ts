/**
 * l–v offsets checked against sources whose velocities come from the 3-D vector method (the
 * source's circular velocity minus the Sun's, projected on the line of sight), not from the
 * R0 sin l (Θ/R − Θ0/R0) formula the code uses, and whose across-arm offsets are set by placing
 * them along the ridge normal. Test arms other than the Reid et al. (2014) presets are invented.
 */
import { describe, expect, it } from 'vitest';
import { ARM_MODEL_PRESETS, armRadiusKpc, type ArmSpec } from '@/lib/astro/arms';
import { polarToXy } from '@/lib/astro/galactocentric';
import { makeRotationCurve, type RotationCurve } from '@/lib/astro/rotation-curves';
import {
  LV_DEFAULTS,
  LV_STATUS,
  lvLoci,
  lvOffsets,
  type LvInput,
  type LvOffsetsResult,
} from '@/lib/ordering/lv-offsets';

const DEG = Math.PI / 180;
// Curves without a frame of their own, so that the model is pure circular rotation in the
// standard LSR: the Reid et al. (2014) curve with its fitted solar and source motions left out.
const REID: RotationCurve = { ...makeRotationCurve('reid-2014'), frame: null };
const BRAND_BLITZ = makeRotationCurve('brand-blitz-1993');
const REID_ARMS = ARM_MODEL_PRESETS['reid-2014'].arms;
// Invented arms reaching the fourth quadrant (inner) and the second and third (outer).
const INNER: ArmSpec = {
  name: 'Inner test arm',
  RrefKpc: 5.5,
  betaRefDeg: 0,
  pitchDeg: 12,
  betaMinDeg: -80,
  betaMaxDeg: 80,
};
const OUTER: ArmSpec = {
  name: 'Outer test arm',
  RrefKpc: 10.8,
  betaRefDeg: 0,
  pitchDeg: 11,
  betaMinDeg: -70,
  betaMaxDeg: 70,
};

type Source = { lDeg: number; bDeg: number; vLsrKms: number };

/**
 * v_LSR by the vector method: the source at (x, y, z) moves at Θ(R) along the direction of
 * rotation ê_β = (−sin β, −cos β, 0), the LSR at the Sun at Θ0 along (0, −1, 0) (l = 90° is −y);
 * the difference is projected on the unit vector from the Sun to the source.
 */
function vectorVLsrKms(xKpc: number, yKpc: number, zKpc: number, curve: RotationCurve): number {
  const sx = xKpc - curve.R0Kpc;
  const d = Math.hypot(sx, yKpc, zKpc);
  const R = Math.hypot(xKpc, yKpc);
  const beta = Math.atan2(-yKpc, xKpc);
  const theta = curve.thetaKms(R);
  const dvx = -theta * Math.sin(beta);
  const dvy = -theta * Math.cos(beta) + curve.theta0Kms;
  return (dvx * sx + dvy * yKpc) / d;
}

/** A source at in-plane (x, y) and latitude b, seen from the Sun at (R0, 0, 0). */
function seen(xKpc: number, yKpc: number, bDeg: number, curve: RotationCurve) {
  const hx = curve.R0Kpc - xKpc;
  const hy = -yKpc;
  const dPlane = Math.hypot(hx, hy);
  const zKpc = dPlane * Math.tan(bDeg * DEG);
  let lDeg = Math.atan2(hy, hx) / DEG;
  if (lDeg < 0) lDeg += 360;
  return {
    lDeg,
    bDeg,
    vLsrKms: vectorVLsrKms(xKpc, yKpc, zKpc, curve),
    distKpc: Math.hypot(dPlane, zKpc),
  };
}

/** The ridge point at β and the unit normal there, found from a numerical tangent, turned ahead (n̂·ê_β > 0). */
function ridgeAndNormal(arm: ArmSpec, betaDeg: number) {
  const q = polarToXy(armRadiusKpc(arm, betaDeg), betaDeg);
  const h = 1e-6;
  const q2 = polarToXy(armRadiusKpc(arm, betaDeg + h), betaDeg + h);
  const tx = q2.xKpc - q.xKpc;
  const ty = q2.yKpc - q.yKpc;
  const t = Math.hypot(tx, ty);
  let nx = ty / t;
  let ny = -tx / t;
  // ê_β = (−sin β, −cos β): rotation runs toward increasing β (Reid et al. 2014 frame)
  if (-nx * Math.sin(betaDeg * DEG) - ny * Math.cos(betaDeg * DEG) < 0) [nx, ny] = [-nx, -ny];
  return { xKpc: q.xKpc, yKpc: q.yKpc, nx, ny };
}

function columns(sources: Source[], kind: number[], cluster: number[]): LvInput {
  return {
    lDeg: Float64Array.from(sources, (s) => s.lDeg),
    bDeg: Float64Array.from(sources, (s) => s.bDeg),
    vLsrKms: Float64Array.from(sources, (s) => s.vLsrKms),
    kind: Uint8Array.from(kind),
    cluster: Int32Array.from(cluster),
  };
}

const quadrant = (lDeg: number) => Math.floor(lDeg / 90) + 1;

describe('l–v locus against the vector method', () => {
  it('puts sources on the ridge at b ≠ 0 within 0.01 km/s of the locus, several arms, all quadrants', () => {
    const cases: Array<[ArmSpec, RotationCurve]> = [
      ...REID_ARMS.map((a) => [a, REID] as [ArmSpec, RotationCurve]),
      [INNER, BRAND_BLITZ],
      [OUTER, BRAND_BLITZ],
    ];
    const quadrants = new Set<number>();
    let checked = 0;
    for (const [arm, curve] of cases) {
      const sources: Array<Source & { distKpc: number }> = [];
      for (let beta = arm.betaMinDeg + 1; beta < arm.betaMaxDeg; beta += 3) {
        for (const b of [-2, 0.6, 1.5]) {
          const q = polarToXy(armRadiusKpc(arm, beta), beta);
          sources.push(seen(q.xKpc, q.yKpc, b, curve));
        }
      }
      const res = lvOffsets(
        columns(
          sources,
          sources.map(() => 0),
          sources.map((_, i) => i),
        ),
        [arm],
        curve,
        { resamples: 10, seed: 1 },
      );
      sources.forEach((s, i) => {
        if (res.sources.status[i] === LV_STATUS.unreliableLongitude) return;
        expect(res.sources.status[i], `${arm.name} l = ${s.lDeg}`).not.toBe(LV_STATUS.noBranch);
        expect(Math.abs(res.sources.dvKms[i])).toBeLessThan(0.01); // vector method
        expect(res.sources.crossingDistKpc[i]).toBeCloseTo(s.distKpc, 6); // exact geometry
        quadrants.add(quadrant(s.lDeg));
        checked++;
      });
    }
    expect([...quadrants].sort()).toEqual([1, 2, 3, 4]);
    expect(checked).toBeGreaterThan(300);
  });

  it('draws each arm locus (b = 0) on the vector-method velocities, with masked stretches marked', () => {
    const arms = [...REID_ARMS, INNER];
    const loci = lvLoci(arms, REID);
    expect(loci.map((l) => l.arm)).toEqual(arms.map((a) => a.name));
    const marks = new Set<number>();
    for (const [a, locus] of loci.entries()) {
      const arm = arms[a];
      for (let i = 0; i < locus.lDeg.length; i++) {
        const p = polarToXy(armRadiusKpc(arm, locus.betaDeg[i]), locus.betaDeg[i]);
        const s = seen(p.xKpc, p.yKpc, 0, REID);
        expect(Math.abs(locus.vLsrKms[i] - s.vLsrKms)).toBeLessThan(0.01); // vector method
        const l = locus.lDeg[i];
        const fromZero = Math.min(l, 360 - l);
        // exclusions: within 15° of l = 0° or 180° (common practice)
        if (fromZero < 15 || Math.abs(l - 180) < 15)
          expect(locus.status[i]).toBe(LV_STATUS.unreliableLongitude);
        marks.add(locus.status[i]);
      }
    }
    expect([...marks].sort()).toEqual([
      LV_STATUS.used,
      LV_STATUS.unreliableLongitude,
      LV_STATUS.nearTangent,
    ]);
  });
});

/** Injected across-arm offsets (kpc) by class: HI behind the ridge, CO on it, HII ahead. */
const INJECTED_KPC = [-0.2, 0, 0.15];

/**
 * Sources along the ridge normal at the injected offsets from ridge points every stepDeg of β, at
 * latitudes cycling through 0°, 0.8°, −1.2°; one complex per ridge point.
 */
function injected(arm: ArmSpec, curve: RotationCurve, stepDeg: number) {
  const sources: Source[] = [];
  const kind: number[] = [];
  const cluster: number[] = [];
  const ridgeL: number[] = [];
  let c = 0;
  for (let beta = arm.betaMinDeg + 2; beta < arm.betaMaxDeg - 2; beta += stepDeg, c++) {
    const r = ridgeAndNormal(arm, beta);
    const lRidge = seen(r.xKpc, r.yKpc, 0, curve).lDeg;
    INJECTED_KPC.forEach((dn, k) => {
      sources.push(seen(r.xKpc + dn * r.nx, r.yKpc + dn * r.ny, [0, 0.8, -1.2][c % 3], curve));
      kind.push(k);
      cluster.push(c);
      ridgeL.push(lRidge);
    });
  }
  return { sources, kind, cluster, ridgeL };
}

function run(
  arm: ArmSpec,
  curve: RotationCurve,
  stepDeg = 4,
): {
  res: LvOffsetsResult;
  inj: ReturnType<typeof injected>;
} {
  const inj = injected(arm, curve, stepDeg);
  const res = lvOffsets(columns(inj.sources, inj.kind, inj.cluster), [arm], curve, {
    resamples: 2000,
    seed: 7,
  });
  return { res, inj };
}

describe('injected across-arm offsets', () => {
  const cases: Array<[ArmSpec, RotationCurve]> = [
    [INNER, REID],
    [OUTER, REID],
    [INNER, BRAND_BLITZ],
    [REID_ARMS[0], REID], // Scutum, Reid et al. (2014) Table 2
    [REID_ARMS[3], REID], // Perseus, Reid et al. (2014) Table 2
  ];

  it('recovers each source within 10 % (or 10 pc), with the right sign, in every quadrant', () => {
    const usedPerQuadrant = new Map<number, number>();
    for (const [arm, curve] of cases) {
      const { res, inj } = run(arm, curve);
      inj.sources.forEach((s, i) => {
        if (res.sources.status[i] !== LV_STATUS.used) return;
        const truth = INJECTED_KPC[inj.kind[i]];
        const got = res.sources.dnKpc[i];
        const at = `${arm.name}, l = ${s.lDeg.toFixed(2)}°, injected ${truth} kpc`;
        expect(Math.abs(got - truth), at).toBeLessThanOrEqual(
          Math.max(0.1 * Math.abs(truth), 0.01),
        ); // injected
        if (truth !== 0) expect(Math.sign(got), at).toBe(Math.sign(truth)); // injected
        const q = quadrant(inj.ridgeL[i]);
        usedPerQuadrant.set(q, (usedPerQuadrant.get(q) ?? 0) + 1);
      });
    }
    for (const q of [1, 2, 3, 4])
      expect(usedPerQuadrant.get(q) ?? 0, `quadrant ${q}`).toBeGreaterThan(20);
  });

  it('summarises per arm and class: medians near the injected offsets, bootstrap intervals around them', () => {
    const { res } = run(INNER, REID, 1);
    expect(res.rows.map((r) => r.kind)).toEqual(['hi', 'co', 'hii']);
    res.rows.forEach((row, k) => {
      const truth = INJECTED_KPC[k];
      expect(row.arm).toBe(INNER.name);
      expect(row.n).toBeGreaterThan(10);
      expect(row.nClusters).toBe(row.n); // one source per complex and class
      expect(Math.abs(row.dnKpc - truth)).toBeLessThanOrEqual(
        Math.max(0.1 * Math.abs(truth), 0.01),
      ); // injected
      expect(row.ci95![0]).toBeLessThanOrEqual(row.dnKpc);
      expect(row.ci95![1]).toBeGreaterThanOrEqual(row.dnKpc);
      // on the ridge the velocity is the locus's (vector method); off it, |Δv| ≥ 150 pc × 5 km/s/kpc
      if (truth === 0) expect(Math.abs(row.medianDvKms)).toBeLessThan(0.01);
      else expect(Math.abs(row.medianDvKms)).toBeGreaterThan(0.75);
    });
    const again = run(INNER, REID, 1).res;
    expect(again.rows).toEqual(res.rows); // seeded: same seed, same intervals
  });
});

/** Ridge points where l(β) has a local extremum: the arm's tangent longitudes (exact geometry on a 0.002° grid). */
function armTangentBetas(arm: ArmSpec, curve: RotationCurve): number[] {
  const fold = (l: number) => (l > 180 ? l - 360 : l);
  const lAt = (beta: number) => {
    const q = polarToXy(armRadiusKpc(arm, beta), beta);
    return fold(seen(q.xKpc, q.yKpc, 0, curve).lDeg);
  };
  const found: number[] = [];
  const step = 0.002;
  let a = lAt(arm.betaMinDeg);
  let b = lAt(arm.betaMinDeg + step);
  for (let beta = arm.betaMinDeg + step; beta < arm.betaMaxDeg - step; beta += step) {
    const c = lAt(beta + step);
    if ((b - a) * (c - b) < 0 && Math.abs(c - a) < 1) found.push(beta);
    [a, b] = [b, c];
  }
  return found;
}

/** The ridge point whose sight line is perpendicular to its radius vector: the sight line's tangent point (exact geometry, bisection). */
function sightTangentBeta(arm: ArmSpec, curve: RotationCurve, lo: number, hi: number): number {
  const g = (beta: number) => {
    const q = polarToXy(armRadiusKpc(arm, beta), beta);
    return (q.xKpc - curve.R0Kpc) * q.xKpc + q.yKpc * q.yKpc;
  };
  expect(g(lo) * g(hi)).toBeLessThan(0);
  for (let k = 0; k < 100; k++) {
    const mid = 0.5 * (lo + hi);
    if (g(mid) * g(lo) > 0) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

function onRidge(arm: ArmSpec, beta: number, dnKpc: number, curve: RotationCurve): Source {
  const r = ridgeAndNormal(arm, beta);
  return seen(r.xKpc + dnKpc * r.nx, r.yKpc + dnKpc * r.ny, 0, curve);
}

function single(sources: Source[], arms: ArmSpec[], curve: RotationCurve, extra = {}) {
  return lvOffsets(
    columns(
      sources,
      sources.map(() => 0),
      sources.map((_, i) => i),
    ),
    arms,
    curve,
    { resamples: 200, seed: 3, ...extra },
  );
}

describe('masks', () => {
  it('masks sources at the arm tangent longitudes (first and fourth quadrants)', () => {
    const betas = armTangentBetas(INNER, REID);
    const ls = betas.map((b) => onRidge(INNER, b, 0, REID).lDeg);
    expect(ls.some((l) => l < 90) && ls.some((l) => l > 270)).toBe(true);
    for (const beta of betas) {
      const res = single(
        [-0.1, 0, 0.1].map((dn) => onRidge(INNER, beta, dn, REID)),
        [INNER],
        REID,
      );
      expect(res.sources.status[1]).toBe(LV_STATUS.nearTangent); // exact geometry: the tangent
      expect(res.sources.crossingAngleDeg[1]).toBeLessThan(1);
      for (const i of [0, 2]) expect(res.sources.status[i]).not.toBe(LV_STATUS.used);
      expect(res.masked.nearTangent + res.masked.noBranch).toBe(3);
    }
  });

  it("masks the sight line's tangent point by |∂v/∂n| where the crossing angle alone would not", () => {
    const beta = sightTangentBeta(INNER, REID, 0, 60);
    const source = onRidge(INNER, beta, 0, REID);
    const steep = single([source], [INNER], REID, { minCrossingAngleDeg: 0 });
    expect(steep.sources.status[0]).toBe(LV_STATUS.nearTangent);
    // exact geometry: dv/dd = 0 at the tangent point of the sight line
    expect(Math.abs(steep.sources.dvDnKmsPerKpc[0])).toBeLessThan(0.01);
    const open = single([source], [INNER], REID, { minCrossingAngleDeg: 0, minDvDnKmsPerKpc: 0 });
    expect(open.sources.status[0]).toBe(LV_STATUS.used);
  });

  it('counts no velocity, the zone near l = 0°/180°, and velocities off every branch', () => {
    const used = onRidge(INNER, -14, 0, REID);
    const sources: Source[] = [
      { ...used, vLsrKms: NaN },
      { lDeg: 3, bDeg: 0, vLsrKms: 10 },
      { lDeg: 346, bDeg: 0.5, vLsrKms: -5 },
      { lDeg: 170, bDeg: 0, vLsrKms: 2 },
      { lDeg: 194.9, bDeg: 0, vLsrKms: 2 },
      { ...used, vLsrKms: used.vLsrKms + 40 },
      used,
    ];
    const res = single(sources, [INNER], REID);
    // exclusions: within 15° of l = 0° or 180° (common practice)
    expect(res.masked).toEqual({
      noVelocity: 1,
      unreliableLongitude: 4,
      noBranch: 1,
      nearTangent: 0,
    });
    expect(Array.from(res.sources.status)).toEqual([1, 2, 2, 2, 2, 3, 0]);
    expect(res.sources.armIndex[5]).toBe(-1);
    expect(Math.abs(res.sources.dnKpc[6])).toBeLessThan(0.001); // on the ridge
    expect(Number.isNaN(res.sources.dnKpc[5])).toBe(true);
  });

  it('attributes ridge sources to their own arm among all the Reid et al. (2014) arms', () => {
    let own = 0;
    let total = 0;
    REID_ARMS.forEach((arm, a) => {
      const sources: Source[] = [];
      for (let beta = arm.betaMinDeg + 1; beta < arm.betaMaxDeg; beta += 2)
        sources.push(onRidge(arm, beta, 0, REID));
      const res = single(sources, REID_ARMS, REID);
      res.sources.status.forEach((st, i) => {
        if (st === LV_STATUS.unreliableLongitude) return;
        total++;
        if (res.sources.armIndex[i] === a) own++;
        expect(Math.abs(res.sources.dvKms[i])).toBeLessThan(0.01); // vector method
      });
    });
    expect(own / total).toBeGreaterThan(0.95);
  });

  it('gives no interval for a class from a single complex', () => {
    const sources = [0, 0.05, 0.1].map((dn) => onRidge(INNER, -14, dn, REID));
    const res = lvOffsets(columns(sources, [2, 2, 2], [5, 5, 5]), [INNER], REID, {
      resamples: 100,
      seed: 1,
    });
    expect(res.rows).toHaveLength(1);
    expect(res.rows[0]).toMatchObject({ kind: 'hii', n: 3, nClusters: 1, ci95: null });
  });
});

describe('bad input', () => {
  const good = columns([onRidge(INNER, -14, 0, REID)], [0], [0]);
  const opts = { resamples: 10, seed: 1 };
  it('throws RangeError naming the value', () => {
    const cases: Array<[() => unknown, RegExp]> = [
      [() => lvOffsets({ ...good, bDeg: new Float64Array(2) }, [INNER], REID, opts), /bDeg 2/],
      [
        () => lvOffsets({ ...good, lDeg: Float64Array.of(NaN) }, [INNER], REID, opts),
        /source 1: lDeg = NaN/,
      ],
      [() => lvOffsets({ ...good, bDeg: Float64Array.of(90) }, [INNER], REID, opts), /bDeg = 90/],
      [
        () => lvOffsets({ ...good, vLsrKms: Float64Array.of(Infinity) }, [INNER], REID, opts),
        /vLsrKms = Infinity/,
      ],
      [() => lvOffsets({ ...good, kind: Uint8Array.of(9) }, [INNER], REID, opts), /kind = 9/],
      [() => lvOffsets(good, [], REID, opts), /no arms/],
      [() => lvOffsets(good, [INNER, { ...OUTER, name: INNER.name }], REID, opts), /appears twice/],
      [() => lvOffsets(good, [INNER], REID, { ...opts, maxDvKms: 0 }), /maxDvKms = 0/],
      [
        () => lvOffsets(good, [INNER], REID, { ...opts, minCrossingAngleDeg: 95 }),
        /minCrossingAngleDeg = 95/,
      ],
      [
        () => lvOffsets(good, [INNER], REID, { ...opts, minDvDnKmsPerKpc: -1 }),
        /minDvDnKmsPerKpc = -1/,
      ],
      [() => lvOffsets(good, [INNER], REID, { ...opts, resamples: 0 }), /resamples = 0/],
      [() => lvOffsets(good, [INNER], REID, { ...opts, seed: NaN }), /seed = NaN/],
      [() => lvOffsets(good, [{ ...INNER, RrefKpc: -2 }], REID, opts), /RrefKpc = -2/],
      [() => lvLoci([INNER], REID, { maxDvKms: -3 }), /lvLoci: maxDvKms = -3/],
    ];
    for (const [call, message] of cases) {
      expect(call).toThrow(RangeError);
      expect(call).toThrow(message);
    }
  });

  it('states its defaults', () => {
    expect(LV_DEFAULTS).toEqual({ maxDvKms: 15, minCrossingAngleDeg: 40, minDvDnKmsPerKpc: 5 });
  });
});
