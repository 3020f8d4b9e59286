import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { weightedMedianInPlace } from '@/lib/stats/weighted-median';

/** Oracle: sort, then walk the cumulative weight (the definition itself). */
function bySort(values: number[], weights: number[]): number {
  const order = values.map((_, i) => i).sort((a, b) => values[a] - values[b]);
  const total = weights.reduce((s, w) => s + w, 0);
  let cum = 0;
  for (const i of order) {
    cum += weights[i];
    if (cum >= total / 2) return values[i];
  }
  return NaN;
}

describe('weightedMedianInPlace', () => {
  it('equals the sort-and-accumulate definition (property, ties included)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: -20, max: 20 }), fc.integer({ min: 1, max: 5 })), {
          minLength: 1,
          maxLength: 60,
        }),
        (pairs) => {
          const v = pairs.map((p) => p[0] / 4);
          const w = pairs.map((p) => p[1]);
          const got = weightedMedianInPlace(Float64Array.from(v), Float64Array.from(w), v.length);
          expect(got).toBe(bySort(v, w));
        },
      ),
    );
  });

  it('is the ordinary median for equal weights and an odd count', () => {
    const v = Float64Array.from([5, 1, 4, 2, 3]);
    expect(weightedMedianInPlace(v, new Float64Array(5).fill(1), 5)).toBe(3); // definition
    expect(weightedMedianInPlace(new Float64Array(0), new Float64Array(0), 0)).toBeNaN();
  });
});
