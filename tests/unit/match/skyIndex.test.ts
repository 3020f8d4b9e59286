import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  buildSkyIndex,
  capCandidates,
  IdBuffer,
  separationArcsec,
  wrapLongitudeDeg,
} from '@/lib/match';
import { anywhere, atSeam, highLatitude, nearPoles } from './arbitraries';

const num = (min: number, max: number) => fc.double({ min, max, noNaN: true });
const regions = [anywhere, atSeam, nearPoles, highLatitude];
/** Sources and a query point drawn from the same region of the sky. */
const sourcesAndQuery = fc
  .integer({ min: 0, max: regions.length - 1 })
  .chain((k) => fc.tuple(fc.array(regions[k], { maxLength: 200, size: 'max' }), regions[k]));

describe('capCandidates', { timeout: 60_000 }, () => {
  it('returns every source within the radius, each once', () => {
    fc.assert(
      fc.property(
        sourcesAndQuery,
        fc.oneof(num(0, 0.2), num(0, 10), num(0, 200)),
        ([points, [lq, bq]], radiusDeg) => {
          const index = buildSkyIndex({
            lDeg: Float64Array.from(points, (p) => p[0]),
            bDeg: Float64Array.from(points, (p) => p[1]),
          });
          const out = new IdBuffer(1);
          capCandidates(index, lq, bq, radiusDeg, out);
          const found = Array.from(out.ids.subarray(0, out.count), (slot) => index.tree.ids[slot]);
          expect(new Set(found).size).toBe(found.length);
          const inside = points
            .map(([l, b], k) => (separationArcsec(lq, bq, l, b) <= radiusDeg * 3600 ? k : -1))
            .filter((k) => k >= 0);
          const foundSet = new Set(found);
          for (const k of inside) expect(foundSet.has(k)).toBe(true); // brute-force oracle
        },
      ),
      { numRuns: 300 },
    );
  });

  it('keeps the box tight away from the seam and poles', () => {
    // Sources 1° apart along b = 0; a 0.5° cap around l = 10 can only hold the source at l = 10.
    const lDeg = Float64Array.from({ length: 360 }, (_, k) => k);
    const index = buildSkyIndex({ lDeg, bDeg: new Float64Array(360) });
    const out = new IdBuffer();
    capCandidates(index, 10, 0, 0.5, out);
    expect(Array.from(out.ids.subarray(0, out.count), (slot) => index.tree.ids[slot])).toEqual([
      10,
    ]); // from the geometry
  });
});

describe('wrapLongitudeDeg', () => {
  it('maps any longitude into [0, 360)', () => {
    expect(wrapLongitudeDeg(360)).toBe(0); // from the definition
    expect(wrapLongitudeDeg(-1e-20)).toBe(0); // 360 − 1e-20 rounds to 360, which wraps to 0
    expect(wrapLongitudeDeg(-90)).toBe(270); // from the definition
    expect(wrapLongitudeDeg(725)).toBe(5); // from the definition
  });
});
