import { describe, expect, it } from 'vitest';
import { runExternalAnalysis } from '@/lib/external/analysis';
import { deprojectToDisc } from '@/lib/external/deproject';
import { makeExternalRotationCurve } from '@/lib/external/rotation';
import type { ExternalAnalysisOptions } from '@/lib/external/types';
import { generateExternalGalaxy, type ExternalGeneratorParams } from '@/seed/external-generator';

const OPTIONS: ExternalAnalysisOptions = {
  arms: 2,
  rings: { minKpc: 3, maxKpc: 11, widthKpc: 1 },
  resamples: 400,
  seed: 7,
  permutations: 99,
};

function analyse(overrides: Partial<ExternalGeneratorParams>) {
  const g = generateExternalGalaxy({ gasCount: 14_000, youngCount: 14_000, ...overrides });
  const result = runExternalAnalysis(
    { raDeg: g.raDeg, decDeg: g.decDeg, kind: g.kind },
    g.galaxy,
    OPTIONS,
  );
  return { g, result };
}

const within = (x: number, [lo, hi]: [number, number]) => x >= lo && x <= hi;

describe('external-galaxy ordering analysis on synthetic spirals (orbits crossing a rotating ridge)', () => {
  const drifting = analyse({ seed: 11, delayMyr: 6 });
  const still = analyse({ seed: 12, delayMyr: 0 });

  it('deprojects the generated sky positions back onto the generator truth', () => {
    const { g, result } = drifting;
    for (let i = 0; i < g.kind.length; i += 97) {
      // generator geometry with perspective; (R/D) tan i ≈ 1e-3
      expect(Math.abs(result.sources.RKpc[i] / g.truth.RKpc[i] - 1)).toBeLessThan(2e-3);
      const d = (result.sources.phiDeg[i] * Math.PI) / 180 - g.truth.phiRad[i];
      expect(Math.abs(Math.atan2(Math.sin(d), Math.cos(d)))).toBeLessThan(2e-3);
    }
  });

  it('recovers Ω_p and t of a drifting galaxy within their intervals; offsets change sign at corotation', () => {
    const { g, result } = drifting;
    const fit = result.fit!;
    expect(fit.constrained).toBe(true);
    expect(within(6, fit.timescaleCi95!)).toBe(true); // generator truth: delayMyr
    expect(within(24, fit.patternSpeedCi95!)).toBe(true); // generator truth: Ω_p
    expect(Math.abs(fit.corotationKpc! - g.truth.corotationKpc!)).toBeLessThan(1); // generator truth
    const inner = result.rings[0];
    const outer = result.rings[result.rings.length - 1];
    expect(inner.ci95![0]).toBeGreaterThan(0); // young ahead inside corotation (generator truth)
    expect(outer.ci95![1]).toBeLessThan(0); // and behind outside it
    expect(result.nullTest!.pValue).toBeLessThan(0.05);
    expect(result.nullTest!.permutations).toBe(99);
  });

  it('the ridge cross-check agrees with the cross-correlation ring by ring', () => {
    for (const ring of drifting.result.rings) {
      if (ring.dphiDeg === null || !ring.ridge) continue;
      const halfWidths =
        (ring.ci95![1] - ring.ci95![0]) / 2 + (ring.ridge.ci95[1] - ring.ridge.ci95[0]) / 2;
      // two estimators of one offset: they differ by no more than their joint spread
      expect(Math.abs(ring.ridge.youngMinusGasDeg - ring.dphiDeg)).toBeLessThan(1.5 * halfWidths);
    }
    const arms = drifting.result.armsFit!;
    expect(Math.abs(arms.pitchDeg - 20)).toBeLessThan(1); // generator truth (gas drifts off the ridge a little)
  });

  it('a galaxy with no drift gives a timescale interval containing 0 and no small p-value', () => {
    const { result } = still;
    const fit = result.fit!;
    expect(within(0, fit.timescaleCi95!)).toBe(true); // generator truth: delayMyr = 0
    expect(fit.patternSpeedKmsKpc).toBeNull();
    expect(result.fitReason).toMatch(/do not change with Ω/);
    expect(result.nullTest!.pValue).toBeGreaterThan(0.05);
  });

  it('recovers the NGC 4254 values of Egusa et al. (2004): t = 4.8 Myr, Ω_p = 26 km/s/kpc', () => {
    const { result } = analyse({
      seed: 13,
      delayMyr: 4.8, // Egusa et al. (2004) NGC 4254
      pattern: { m: 2, pitchDeg: 20, phaseDeg: 30, RRefKpc: 6, patternSpeedKmsKpc: 26 }, // Egusa et al. (2004)
    });
    const fit = result.fit!;
    expect(within(4.8, fit.timescaleCi95!)).toBe(true); // Egusa et al. (2004) NGC 4254: 4.8 ± 1.2 Myr
    expect(within(26, fit.patternSpeedCi95!)).toBe(true); // Egusa et al. (2004) NGC 4254: 26 (+10/−6)
  });

  it('infers the sense of rotation from trailing arms', () => {
    for (const rotation of ['clockwise', 'counterclockwise'] as const) {
      const g = generateExternalGalaxy({
        seed: 14,
        gasCount: 3000,
        youngCount: 3000,
        sky: { ...generateExternalGalaxy({ gasCount: 1, youngCount: 1 }).params.sky, rotation },
      });
      const result = runExternalAnalysis(
        { raDeg: g.raDeg, decDeg: g.decDeg, kind: g.kind },
        { ...g.galaxy, rotation: 'trailing-arms' },
        { ...OPTIONS, resamples: 50, permutations: 9 },
      );
      expect(result.rotation).toBe(rotation); // generator truth
      expect(result.rotationInference!.clear).toBe(true);
      expect(result.armsFit!.pitchDeg).toBeGreaterThan(0); // trailing in the sense found
    }
  });
});

describe('input checks name the field', () => {
  const g = generateExternalGalaxy({ gasCount: 50, youngCount: 50 });
  const cols = { raDeg: g.raDeg, decDeg: g.decDeg, kind: g.kind };
  const run = (galaxy: object, options: object = {}, sources: object = cols) =>
    runExternalAnalysis(sources as never, { ...g.galaxy, ...galaxy }, { ...OPTIONS, ...options });

  it.each([
    [{ inclinationDeg: 90 }, {}, /galaxy\.inclinationDeg/],
    [{ distanceMpc: -3 }, {}, /galaxy\.distanceMpc/],
    [{ centerDecDeg: 91 }, {}, /galaxy\.centerDecDeg/],
    [{ positionAngleDeg: Number.NaN }, {}, /galaxy\.positionAngleDeg/],
    [{ rotation: 'sideways' }, {}, /galaxy\.rotation/],
    [{ rotationCurve: { kind: 'flat', vKms: 0 } }, {}, /galaxy\.rotationCurve\.vKms/],
    [
      {
        rotationCurve: {
          kind: 'table',
          points: [
            [2, 100],
            [1, 150],
          ],
        },
      },
      {},
      /points\[1\]\[0\]/,
    ],
    [{}, { arms: 0 }, /options\.arms/],
    [{}, { resamples: 1.5 }, /options\.resamples/],
    [{}, { rings: { minKpc: 5, maxKpc: 4, widthKpc: 1 } }, /rings\.maxKpc/],
    [{}, { rings: { minKpc: 1, maxKpc: 4, widthKpc: 0 } }, /rings\.widthKpc/],
    [{}, { azimuthBins: 100 }, /options\.azimuthBins/],
    [{}, { gasKinds: ['hii'] }, /both options\.gasKinds and options\.youngKinds/],
    [{}, { youngKinds: ['stars'] }, /options\.youngKinds/],
  ])('galaxy %j, options %j', (galaxy, options, message) => {
    expect(() => run(galaxy, options)).toThrow(RangeError);
    expect(() => run(galaxy, options)).toThrow(message);
  });

  it('names the bad source', () => {
    const bad = { raDeg: Float64Array.from(g.raDeg), decDeg: g.decDeg, kind: g.kind };
    bad.raDeg[3] = 400;
    expect(() => run({}, {}, bad)).toThrow(/sources\[4\]\.raDeg/);
    const kinds = [...g.kind];
    kinds[0] = 'star' as never;
    expect(() => run({}, {}, { ...cols, kind: kinds })).toThrow(/sources\[1\]\.kind/);
  });

  it('the rotation curve interpolates its table linearly and gives Ω = V/R', () => {
    const curve = makeExternalRotationCurve({
      kind: 'table',
      points: [
        [2, 100],
        [4, 200],
        [8, 220],
      ],
    });
    expect(curve.thetaKms(3)).toBeCloseTo(150, 12); // linear interpolation by hand
    expect(curve.thetaKms(1)).toBeCloseTo(50, 12); // solid body inside the first row
    expect(curve.thetaKms(20)).toBe(220); // flat beyond the last row
    expect(curve.omegaKmsKpc(6)).toBeCloseTo(210 / 6, 12); // Ω = V/R
    expect(() => curve.omegaKmsKpc(0)).toThrow(/RKpc = 0/);
  });

  it('deprojection refuses nothing silently: a source at the centre has R = 0', () => {
    const { RKpc } = deprojectToDisc(
      Float64Array.of(g.galaxy.centerRaDeg),
      Float64Array.of(g.galaxy.centerDecDeg),
      {
        ...g.galaxy,
        rotation: 'clockwise',
      },
    );
    expect(RKpc[0]).toBeCloseTo(0, 9); // exact geometry
  });
});
