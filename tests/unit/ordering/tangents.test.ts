import { describe, expect, it } from 'vitest';
import { armTangentLongitudes } from '@/lib/astro/arm-tangents';
import { ARM_MODEL_PRESETS, type ArmSpec } from '@/lib/astro/arms';
import { makeRotationCurve } from '@/lib/astro/rotation-curves';
import { KIND_INDEX } from '@/lib/ordering/members';
import { CAUSTIC_EDGE_LEVEL, tangentOffsets, type TangentInput } from '@/lib/ordering/tangents';
import type { TracerKind } from '@/lib/ordering/types';
import { makeRng } from '@/lib/stats/rng';
import { joinSources, ridgeSources, type SourceClass } from '../../helpers/tangent-sources';

const curve = makeRotationCurve('reid-2014');
const R0 = curve.R0Kpc;
/** The Reid et al. (2014) Scutum spiral continued to β = −90°: one tangent in each inner quadrant. */
const arm: ArmSpec = {
  ...(ARM_MODEL_PRESETS['reid-2014'].arms.find((a) => a.name === 'Scutum') as ArmSpec),
  betaMinDeg: -90,
};
const model = armTangentLongitudes(arm, R0);
const QUADRANTS = [
  ['fourth', 0],
  ['first', 1],
] as const;
/** Injected normal shifts (kpc, positive ahead in the sense of rotation). */
const SHIFT: Partial<Record<TracerKind, number>> = { co: 0, ob: 0.1, hii: 0.3 };
const shiftedClasses: SourceClass[] = Object.entries(SHIFT).map(([kind, n]) => ({
  kind: kind as TracerKind,
  perComplex: 1,
  normalOffsetKpc: n,
}));
/** Scatter of invented complexes: 50 pc across the arm, members 20 pc about them, 30 pc along. */
const scatter = {
  acrossSigmaKpc: 0.05,
  memberSigmaKpc: 0.02,
  alongSigmaKpc: 0.03,
  zSigmaKpc: 0.04,
  vSigmaKms: 5,
};

function nearTangent(t: number, complexes: number, seed: number, classes = shiftedClasses) {
  const b = model[t].betaDeg;
  return ridgeSources({
    arm,
    curve,
    betaFromDeg: b - 30,
    betaToDeg: b + 30,
    complexes,
    classes,
    ...scatter,
    seed,
  });
}

/** Exact tangent longitude (deg) of the ridge shifted by n, in the same quadrant as model[t]. */
const exactL = (t: number, n: number) => armTangentLongitudes(arm, R0, n)[t].lDeg;

describe('CAUSTIC_EDGE_LEVEL', () => {
  it('is F(0)/max F for F(y) = 2∫₀^∞ φ(y + u²) du', () => {
    const phi = (z: number) => Math.exp((-z * z) / 2) / Math.sqrt(2 * Math.PI);
    const F = (y: number) => {
      const n = 4000;
      const h = 6 / n;
      let s = phi(y) + phi(y + 36);
      for (let i = 1; i < n; i++) s += (i % 2 ? 4 : 2) * phi(y + (i * h) ** 2);
      return (2 * s * h) / 3;
    };
    // exact: ∫₀^∞ e^(−u⁴/2) du = 2^(1/4) Γ(5/4), Γ(5/4) = 0.9064024770554771 (standard tables)
    expect(F(0)).toBeCloseTo((2 / Math.sqrt(2 * Math.PI)) * 2 ** 0.25 * 0.9064024770554771, 9);
    let best = 0;
    for (let y = -2; y < 0; y += 1e-3) best = Math.max(best, F(y));
    expect(F(0) / best).toBeCloseTo(CAUSTIC_EDGE_LEVEL, 5); // brute-force maximum
  });
});

describe('tangentOffsets on sources along shifted ridges', () => {
  it.each(QUADRANTS)(
    'finds each class at the exact tangent of its ridge and Δn with its sign (%s quadrant)',
    (_q, t) => {
      const [res] = tangentOffsets(nearTangent(t, 8000, 11 + t), [arm], curve, {
        resamples: 20,
        seed: 5,
      }).filter((r) => r.modelTangentLDeg === model[t].lDeg);
      expect(res.classes.map((c) => c.kind).sort()).toEqual(['co', 'hii', 'ob']);
      for (const c of res.classes) {
        expect(Math.abs(c.tangentLDeg - exactL(t, SHIFT[c.kind] as number))).toBeLessThan(0.1); // exact geometry
      }
      const off = (from: TracerKind, to: TracerKind) =>
        res.offsets.find((o) => o.from === from && o.to === to);
      // injected: HII 300 pc and OB 100 pc ahead of CO, so OB lies 200 pc behind HII
      expect(off('co', 'hii')?.dnKpc).toBeGreaterThan(0.27);
      expect(off('co', 'hii')?.dnKpc).toBeLessThan(0.33);
      expect(off('co', 'ob')?.dnKpc).toBeGreaterThan(0.09);
      expect(off('co', 'ob')?.dnKpc).toBeLessThan(0.11);
      expect(off('hii', 'ob')?.dnKpc).toBeLessThan(-0.18);
      expect(off('hii', 'ob')?.dnKpc).toBeGreaterThan(-0.22);
      const coHii = off('co', 'hii');
      const exactDl = exactL(t, SHIFT.hii as number) - exactL(t, 0);
      expect(Math.abs((coHii?.dlDeg as number) - exactDl)).toBeLessThan(0.1); // exact geometry
      expect(coHii?.dlCi95?.[0]).toBeLessThan(coHii?.dlDeg as number);
      expect(coHii?.dlCi95?.[1]).toBeGreaterThan(coHii?.dlDeg as number);
      expect(coHii?.dtMyr).toBeNull();
      expect(res.patternSpeedLabel).toBeNull();
    },
  );

  it('covers the exact tangent with its 95 % interval in most seeds', () => {
    let covered = 0;
    for (let seed = 1; seed <= 20; seed++) {
      const [res] = tangentOffsets(nearTangent(1, 2000, 100 + seed), [arm], curve, {
        resamples: 200,
        seed,
      }).filter((r) => r.modelTangentLDeg === model[1].lDeg);
      const hii = res.classes.find((c) => c.kind === 'hii');
      const exact = exactL(1, SHIFT.hii as number);
      if (hii?.ci95 && hii.ci95[0] <= exact && exact <= hii.ci95[1]) covered++;
    }
    expect(covered).toBeGreaterThanOrEqual(17); // a 95 % interval: ≥ 17 of 20 (common practice)
  });

  it.each(QUADRANTS)(
    'recovers the age of stars drifted from their gas for a stated pattern speed (%s quadrant)',
    (_q, t) => {
      const patternSpeedKmsKpc = 20;
      const ageMyr = 5;
      const input = ridgeSources({
        arm,
        curve,
        betaFromDeg: model[t].betaDeg - 30,
        betaToDeg: model[t].betaDeg + 30,
        complexes: 8000,
        classes: [
          { kind: 'co', perComplex: 1, normalOffsetKpc: 0 },
          { kind: 'hii', perComplex: 1, normalOffsetKpc: 0, driftMyr: ageMyr },
        ],
        ...scatter,
        patternSpeedKmsKpc,
        seed: 31 + t,
      });
      const run = (speed: number | null) =>
        tangentOffsets(input, [arm], curve, {
          resamples: 50,
          seed: 2,
          patternSpeedKmsKpc: speed,
          patternSpeedLabel: speed === null ? null : 'assumed',
        }).filter((r) => r.modelTangentLDeg === model[t].lDeg)[0];
      const res = run(patternSpeedKmsKpc);
      const coHii = res.offsets.find((o) => o.from === 'co' && o.to === 'hii');
      expect(res.patternSpeedKmsKpc).toBe(20);
      expect(res.patternSpeedLabel).toBe('assumed');
      expect(coHii?.dnKpc).toBeGreaterThan(0); // drifted ahead inside corotation
      expect(Math.abs((coHii?.dtMyr as number) / ageMyr - 1)).toBeLessThan(0.1); // injected age
      expect(coHii?.dtCi95?.[0]).toBeLessThan(coHii?.dtMyr as number);
      // The measurement does not change with the pattern speed; only its interpretation does.
      const outside = run(80);
      const none = run(null);
      const dn = (r: typeof res) => r.offsets.find((o) => o.from === 'co')?.dnKpc;
      expect(dn(outside)).toBe(dn(res));
      expect(dn(none)).toBe(dn(res));
      expect(outside.offsets[0].dtMyr).toBeLessThan(0); // Ω_p > Ω(R): the stars would be older than the gas ahead of them
      expect(none.offsets[0].dtMyr).toBeNull();
    },
  );

  it('keeps only sources near the terminal velocity when asked', () => {
    const t = 1;
    const arms = nearTangent(t, 4000, 41, [{ kind: 'co', perComplex: 1, normalOffsetKpc: 0 }]);
    // Local gas beyond the tangent, at low velocity (invented): it would stretch the profile.
    const rng = makeRng(9);
    const m = 1500;
    const local: TangentInput = {
      lDeg: Float64Array.from({ length: m }, () => model[t].lDeg + 0.3 + 1.5 * rng.next()),
      bDeg: Float64Array.from({ length: m }, () => 0.5 * rng.normal()),
      vLsrKms: Float64Array.from({ length: m }, () => 30 * rng.next()),
      kind: new Uint8Array(m).fill(KIND_INDEX.co),
      cluster: Int32Array.from({ length: m }, (_, i) => i),
    };
    const input = joinSources([arms, local]);
    const co = (nearTerminalKms: number | null) =>
      tangentOffsets(input, [arm], curve, { resamples: 20, seed: 3, nearTerminalKms })
        .filter((r) => r.modelTangentLDeg === model[t].lDeg)[0]
        .classes.find((c) => c.kind === 'co');
    const exact = exactL(t, 0);
    const all = co(null);
    const near = co(40);
    expect(Math.abs((all?.tangentLDeg as number) - exact)).toBeGreaterThan(0.3);
    expect(Math.abs((near?.tangentLDeg as number) - exact)).toBeLessThan(0.1); // exact geometry
    expect(near?.n).toBeLessThan((all?.n as number) - m / 2);
  });
});

describe('tangentOffsets bookkeeping', () => {
  const small = nearTangent(1, 1500, 51);

  it('is reproducible from its seed', () => {
    const a = tangentOffsets(small, [arm], curve, { resamples: 100, seed: 8 });
    const b = tangentOffsets(small, [arm], curve, { resamples: 100, seed: 8 });
    const c = tangentOffsets(small, [arm], curve, { resamples: 100, seed: 9 });
    expect(b).toEqual(a);
    expect(c[1].classes[0].ci95).not.toEqual(a[1].classes[0].ci95);
    expect(c[1].classes[0].tangentLDeg).toBe(a[1].classes[0].tangentLDeg);
  });

  it('leaves out a class with too few sources and says why', () => {
    const [q4, q1] = tangentOffsets(small, [arm], curve, {
      resamples: 20,
      seed: 1,
      minSources: 5000,
    });
    expect(q1.classes).toEqual([]);
    expect(q1.offsets).toEqual([]);
    expect(q1.notes.join(' ')).toMatch(
      /co: \d+ sources in the window, fewer than minSources = 5000/,
    );
    expect(q4.classes).toEqual([]);
  });

  it('rejects bad input, naming it', () => {
    const short = { ...small, bDeg: small.bDeg.subarray(1) };
    expect(() => tangentOffsets(short, [arm], curve)).toThrow(RangeError);
    expect(() => tangentOffsets(short, [arm], curve)).toThrow(/bDeg has \d+ rows, lDeg has \d+/);
    expect(() => tangentOffsets(small, [], curve)).toThrow(/no arms/);
    const badKind = { ...small, kind: small.kind.map((k, i) => (i === 3 ? 9 : k)) };
    expect(() => tangentOffsets(badKind, [arm], curve)).toThrow(/kind of row 4 is 9/);
    expect(() =>
      tangentOffsets(small, [arm], curve, { patternSpeedKmsKpc: 25, patternSpeedLabel: null }),
    ).toThrow(/given together/);
    expect(() => tangentOffsets(small, [arm], curve, { kernelDeg: 0 })).toThrow(/kernelDeg = 0/);
  });
});
