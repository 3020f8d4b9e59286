import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  estimateChanceLinks,
  MatchCancelledError,
  MatchInputError,
  type MatchParams,
} from '@/lib/match';
import { atSeam, catalogPair, paramsWith, fixedRadius } from './arbitraries';
import { bruteForcePairs } from './oracle';
import { mulberry32, randomPlaneCatalog } from './random';

const params: MatchParams = {
  radius: { mode: 'fixed', arcsec: 300 },
  velocity: { mode: 'fixed', kms: 10 },
  linkMode: 'all',
};

describe('estimateChanceLinks', { timeout: 60_000 }, () => {
  it('on two uncorrelated catalogs predicts the actual number of links within 3σ', async () => {
    const random = mulberry32(2024);
    const a = randomPlaneCatalog(20_000, random);
    const b = randomPlaneCatalog(20_000, random);
    const estimate = await estimateChanceLinks(a, b, params);
    // All links are chance links here. σ combines the Poisson error of the observed count with the
    // shift-to-shift standard error of the estimate (common practice).
    const sigma = Math.sqrt(estimate.expected + estimate.stdErr ** 2);
    expect(estimate.links.count).toBeGreaterThan(100); // enough links for the test to mean something
    expect(Math.abs(estimate.links.count - estimate.expected)).toBeLessThan(3 * sigma);
    expect(estimate.perShift).toHaveLength(10);
    // Poisson expectation N_A·N_B·πR²/Ω·P(|Δv| ≤ W) = 20000·20000·π(300″)²/(360°·10°)·(2·10·250 − 10²)/250²
    // ≈ 190 (from the geometry; edge losses at |b| = 5° are < 1 %)
    const analytic =
      ((20_000 * 20_000 * Math.PI * (300 / 3600) ** 2) / 3600) * ((2 * 10 * 250 - 100) / 250 ** 2);
    expect(Math.abs(estimate.expected - analytic)).toBeLessThan(
      3 * Math.sqrt(analytic / 10 + estimate.stdErr ** 2),
    );
    expect(estimate.overallReliability).toBeLessThan(0.3); // almost nothing real, by construction
  });

  it('finds true counterparts reliable', async () => {
    const random = mulberry32(7);
    const a = randomPlaneCatalog(20_000, random);
    const b = randomPlaneCatalog(20_000, random);
    // the first 2000 sources of B are A's first 2000 displaced by < 10″ and < 1 km/s
    for (let i = 0; i < 2000; i++) {
      b.lDeg[i] = a.lDeg[i] + (random() - 0.5) * (10 / 3600);
      b.bDeg[i] = a.bDeg[i] + (random() - 0.5) * (10 / 3600);
      b.vKms![i] = a.vKms![i] + (random() - 0.5);
    }
    const estimate = await estimateChanceLinks(a, b, {
      ...params,
      radius: { mode: 'fixed', arcsec: 30 },
    });
    expect(estimate.links.count).toBeGreaterThanOrEqual(2000); // every true pair is within 30″ and 10 km/s
    expect(estimate.expected).toBeLessThan(50); // uncorrelated density × area is ~3 links, by construction
    for (let k = 0; k < estimate.links.count; k++) {
      if (
        estimate.links.indexA[k] === estimate.links.indexB[k] &&
        estimate.links.indexA[k] < 2000
      ) {
        expect(estimate.reliability[k]).toBeGreaterThan(0.9); // chance links ≪ real ones in every bin
      }
    }
  });

  it('counts chance links per shift exactly as the brute-force match of the shifted catalog', async () => {
    await fc.assert(
      fc.asyncProperty(
        catalogPair(atSeam, { missingVelocityRate: 0.2 }),
        paramsWith(fixedRadius(fc.double({ min: 0, max: 720, noNaN: true }))),
        fc.array(
          fc.double({ min: -0.3, max: 0.3, noNaN: true }).filter((s) => s !== 0),
          {
            minLength: 1,
            maxLength: 4,
          },
        ),
        async ({ a, b }, p, shiftsDeg) => {
          const estimate = await estimateChanceLinks(a, b, p, { shiftsDeg, bins: 4 });
          expect(Array.from(estimate.perShift)).toEqual(
            shiftsDeg.map((s) => bruteForcePairs(a, b, p, s).length),
          ); // brute-force oracle
          expect(estimate.links.count).toBe(bruteForcePairs(a, b, p).length); // brute-force oracle
          const sumObserved = estimate.observedPerBin.reduce((x, y) => x + y, 0);
          expect(sumObserved).toBe(estimate.links.count);
          // The bins add 1/K per shifted link, thousands of times: rounding grows with the count,
          // so the check is relative (seed 761693290 gave 3760.0000000005916 against 3760).
          const sumExpected = estimate.expectedPerBin.reduce((x, y) => x + y, 0);
          expect(Math.abs(sumExpected - estimate.expected)).toBeLessThanOrEqual(
            1e-9 * Math.max(1, estimate.expected),
          );
          for (const r of estimate.reliability) expect(r >= 0 && r <= 1).toBe(true);
        },
      ),
      // A failure is reported (with its seed) before the test's own timeout, shrunk or not.
      { numRuns: 60, interruptAfterTimeLimit: 30_000 },
    );
  });

  it('rejects a zero offset and reports progress to 1; cancels on abort', async () => {
    const random = mulberry32(3);
    const a = randomPlaneCatalog(2000, random);
    const b = randomPlaneCatalog(2000, random);
    await expect(estimateChanceLinks(a, b, params, { shiftsDeg: [1, 0] })).rejects.toThrow(
      'shiftsDeg[1] = 0 is not a nonzero longitude offset in degrees.',
    );
    await expect(estimateChanceLinks(a, b, params, { shiftsDeg: [360] })).rejects.toThrow(
      MatchInputError,
    );
    const seen: number[] = [];
    await estimateChanceLinks(a, b, params, { onProgress: (f) => seen.push(f) });
    expect(seen.at(-1)).toBe(1);
    const controller = new AbortController();
    const run = estimateChanceLinks(a, b, params, {
      signal: controller.signal,
      onProgress: (f) => f > 0.5 && controller.abort(),
    });
    await expect(run).rejects.toThrow(MatchCancelledError);
  });
});
