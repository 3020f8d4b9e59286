/**
 * Coverage of the young-minus-gas interval with kinematic distances: over 20 generator seeds the
 * 95 % interval must contain the injected offset (seed/generator truth at the true positions) in
 * at least 18. The analysis uses the Reid et al. (2014) curve with its published 1σ of R0 and Θ0,
 * not the generator's own curve, and its default probabilistic near/far rule.
 */
import { describe, expect, it } from 'vitest';
import { makeRotationCurve } from '@/lib/astro/rotation-curves';
import { runOrderingAnalysis } from '@/lib/ordering';
import { generateGalaxy } from '@/seed/generator';
import { complexesFromGalaxy, settingsFromGalaxy } from './from-generator';

const SEEDS = 20;

describe('coverage over generator seeds', () => {
  it(
    'the 95 % young-minus-gas interval covers the injected value in ≥ 90 % of 20 seeds',
    { timeout: 600_000 },
    () => {
      const curve = makeRotationCurve('reid-2014');
      const misses: string[] = [];
      for (let s = 1; s <= SEEDS; s++) {
        const galaxy = generateGalaxy({ seed: 2000 + s, complexes: 800, interlopers: 0 });
        const r = runOrderingAnalysis(
          complexesFromGalaxy(galaxy).complexes,
          settingsFromGalaxy(galaxy, { curve, R0ErrKpc: 0.16, theta0ErrKms: 8, seed: s }),
        );
        const truth = galaxy.truth.ordering.youngMinusGasPerpKpc!;
        const ci = r.youngMinusGas.ci95;
        if (!ci || truth < ci[0] || truth > ci[1])
          misses.push(`seed ${2000 + s}: ${truth} vs ${ci}`);
      }
      expect(misses.length, misses.join('; ')).toBeLessThanOrEqual(SEEDS / 10);
    },
  );
});
