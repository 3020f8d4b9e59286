/**
 * Recovery of the demo galaxy's ordering (seed/generator) by the analysis. The generator places
 * complexes by a life-cycle model — born upstream of the ridge, drifting through the pattern at
 * Ω(R) − Ω_p, showing young stars after a delay — on a rotation curve of its own (arctangent
 * rise), with streaming motions; its truth states the realized offsets at the TRUE positions,
 * measured with lib/astro/arms (a second ridge-offset algorithm). The analysis sees only l, b,
 * v_LSR, velocity errors and the OB associations' independent distances.
 */
import { describe, expect, it } from 'vitest';
import { fromGalactocentric } from '@/lib/astro/galactocentric';
import { makeRotationCurve } from '@/lib/astro/rotation-curves';
import { runOrderingAnalysis, type OrderingComplex } from '@/lib/ordering';
import { DEFAULT_MODEL, generateGalaxy, type DemoGalaxy, type ModelParams } from '@/seed/generator';
import { complexesFromGalaxy, settingsFromGalaxy } from './from-generator';

const contains = (ci: [number, number] | null, x: number) =>
  ci !== null && ci[0] <= x && x <= ci[1];

function atTrueDistances(galaxy: DemoGalaxy): OrderingComplex[] {
  const { complexes } = complexesFromGalaxy(galaxy);
  const t = galaxy.complexes;
  complexes.forEach((cx, c) => {
    cx.distanceOverride = {
      distKpc: fromGalactocentric(t.xKpc[c], t.yKpc[c], t.zKpc[c], galaxy.truth.R0Kpc).distKpc,
    };
  });
  return complexes;
}

describe('recovery with the true distances (placement, offsets, statistics, fit)', () => {
  const galaxy = generateGalaxy({ seed: 11, complexes: 1500, interlopers: 0 });
  const truth = galaxy.truth.ordering;
  const r = runOrderingAnalysis(
    atTrueDistances(galaxy),
    settingsFromGalaxy(galaxy, { mcDraws: 50 }),
  );

  it('recovers every class offset and young minus gas within its interval', () => {
    const perClass = { hi: 'HI', co: 'CO', hii: 'HII', ob: 'OB' } as const;
    for (const c of r.classes) {
      const expected = truth.perClassPerpKpc[perClass[c.kind as keyof typeof perClass]].all!; // generator truth
      expect(contains(c.ci95, expected), `${c.kind}: ${expected} in ${c.ci95}`).toBe(true);
    }
    expect(contains(r.youngMinusGas.ci95, truth.youngMinusGasPerpKpc!)).toBe(true); // generator truth
    expect(r.youngMinusGas.ci95![0]).toBeGreaterThan(0.08); // 100–300 pc injected: away from zero
  });

  it('fits the pattern speed and the timescale within their intervals', () => {
    expect(r.patternFit?.constrained).toBe(true);
    expect(contains(r.patternFit!.patternSpeedCi95, galaxy.truth.patternSpeedKmsKpc)).toBe(true); // injected Ω_p
    expect(contains(r.patternFit!.timescaleCi95, truth.effectiveTimescaleMyr!)).toBe(true); // realized phase difference
    expect(r.interpretation.source).toBe('fitted');
    expect(r.headline.join(' ')).toMatch(/as a density wave predicts/);
  });
});

describe('recovery with kinematic distances on a curve the generator did not use', () => {
  it(
    'the young-minus-gas interval contains the injected offset and excludes zero',
    { timeout: 120_000 },
    () => {
      const galaxy = generateGalaxy({ seed: 11, complexes: 1500, interlopers: 0 });
      const { complexes } = complexesFromGalaxy(galaxy);
      // Reid et al. (2014) curve with its published 1σ of R0 and Θ0: not the generator's curve
      const r = runOrderingAnalysis(
        complexes,
        settingsFromGalaxy(galaxy, {
          curve: makeRotationCurve('reid-2014'),
          R0ErrKpc: 0.16,
          theta0ErrKms: 8,
        }),
      );
      expect(contains(r.youngMinusGas.ci95, galaxy.truth.ordering.youngMinusGasPerpKpc!)).toBe(
        true,
      );
      expect(r.youngMinusGas.ci95![0]).toBeGreaterThan(0);
      expect(r.headline[0]).toMatch(/Young stars \(HII, OB\) lie \d+ pc ahead of the gas/);
    },
  );
});

describe('null galaxy: no star-formation delay', () => {
  it(
    'gives a young-minus-gas interval that contains zero and no density-wave claim',
    { timeout: 120_000 },
    () => {
      const model: Partial<ModelParams> = {
        phase: {
          ...DEFAULT_MODEL.phase,
          starFormationDelayMyr: 0,
          hiiLifetimeMyr: DEFAULT_MODEL.phase.maxAgeMyr,
          gasAtDelay: 1,
          gasDispersalMyr: Infinity,
        },
      };
      const galaxy = generateGalaxy({ seed: 12, complexes: 1500, interlopers: 0, model });
      const r = runOrderingAnalysis(
        complexesFromGalaxy(galaxy).complexes,
        settingsFromGalaxy(galaxy),
      );
      const [lo, hi] = r.youngMinusGas.ci95!;
      expect(lo).toBeLessThan(0);
      expect(hi).toBeGreaterThan(0);
      expect(r.headline.join(' ')).not.toMatch(/as a density wave predicts/);
    },
  );
});
