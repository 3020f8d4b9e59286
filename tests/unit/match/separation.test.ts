import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { separationArcsec } from '@/lib/match';

/** Haversine separation in arcsec (Sinnott 1984), an independent formula for comparison. */
function haversineArcsec(l1: number, b1: number, l2: number, b2: number): number {
  const d = Math.PI / 180;
  const h =
    Math.sin(((b2 - b1) * d) / 2) ** 2 +
    Math.cos(b1 * d) * Math.cos(b2 * d) * Math.sin(((l2 - l1) * d) / 2) ** 2;
  return ((2 * Math.asin(Math.min(1, Math.sqrt(h)))) / d) * 3600;
}

describe('separationArcsec (Vincenty form)', () => {
  it('gives the textbook angles', () => {
    expect(separationArcsec(0, 0, 90, 0)).toBeCloseTo(324000, 6); // quarter great circle, from the geometry
    expect(separationArcsec(0, 0, 0, 90)).toBeCloseTo(324000, 6); // centre to pole, from the geometry
    expect(separationArcsec(0, 90, 123, -90)).toBeCloseTo(648000, 6); // pole to pole, from the geometry
    expect(separationArcsec(12.5, -3.25, 12.5, -3.25)).toBe(0); // same point
    expect(separationArcsec(359.5, 0, 0.5, 0)).toBeCloseTo(3600, 6); // 1° across the seam, from the geometry
    expect(separationArcsec(0, 0, 1 / 3600, 0)).toBeCloseTo(1, 9); // 1″ along the equator, from the geometry
  });

  it('stays accurate near 180°, where the law of cosines and haversine lose digits', () => {
    // 180° − 1e-6° between (0, 0) and (180, 1e-6): from the geometry (spherical right triangle)
    expect(separationArcsec(0, 0, 180, 1e-6)).toBeCloseTo(648000 - 0.0036, 6);
  });

  it('agrees with haversine to a microarcsecond below 90°', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 360, noNaN: true }),
        fc.double({ min: -89, max: 89, noNaN: true }),
        fc.double({ min: -1, max: 1, noNaN: true }),
        fc.double({ min: -1, max: 1, noNaN: true }),
        (l, b, dl, db) => {
          const vincenty = separationArcsec(l, b, l + dl, b + db);
          expect(Math.abs(vincenty - haversineArcsec(l, b, l + dl, b + db))).toBeLessThan(1e-6); // Sinnott 1984
        },
      ),
    );
  });
});
