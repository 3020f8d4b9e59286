import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { MatchInputError, matchCatalogs, matchMany, type MatchParams } from '@/lib/match';
import { atSeam, catalogPair, nearPoles } from './arbitraries';

const params: MatchParams = {
  radius: { mode: 'scaled', factor: 1, minArcsec: 120 },
  velocity: { mode: 'fixed', kms: 10 },
  linkMode: 'all',
  missingVelocity: 'exclude',
};

describe('matchMany', { timeout: 60_000 }, () => {
  it('links every pair of catalogs exactly as matchCatalogs does', async () => {
    await fc.assert(
      fc.asyncProperty(
        catalogPair(fc.oneof(atSeam, nearPoles), { missingVelocityRate: 0.2 }),
        catalogPair(atSeam),
        async (first, second) => {
          const catalogs = [first.a, first.b, second.a];
          const seen: number[] = [];
          const { pairs } = await matchMany(catalogs, params, { onProgress: (f) => seen.push(f) });
          expect(pairs.map((p) => [p.catA, p.catB])).toEqual([
            [0, 1],
            [0, 2],
            [1, 2],
          ]);
          for (const { catA, catB, links } of pairs) {
            expect(links).toEqual(await matchCatalogs(catalogs[catA], catalogs[catB], params));
          }
          expect(seen.at(-1)).toBe(1);
        },
      ),
      { numRuns: 50 },
    );
  });

  it('runs only the chosen pairs, in the given direction', async () => {
    const one = { lDeg: Float64Array.of(1), bDeg: Float64Array.of(0), vKms: Float64Array.of(0) };
    const two = { lDeg: Float64Array.of(1.01), bDeg: Float64Array.of(0), vKms: Float64Array.of(3) };
    const { pairs } = await matchMany([one, two, one], params, { pairs: [[1, 0]] });
    expect(pairs).toHaveLength(1);
    expect(pairs[0].catA).toBe(1);
    expect(pairs[0].links.dvKms[0]).toBe(-3); // v_B − v_A with catalog 1 as A
    await expect(matchMany([one, two], params, { pairs: [[0, 0]] })).rejects.toThrow(
      MatchInputError,
    );
  });
});
