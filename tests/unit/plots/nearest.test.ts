import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { NearestPicker, type PixelMap } from '@/components/plots/nearest';

/** Brute force: every point measured in pixels; ties to the earlier point. */
function bruteNearest(
  xs: Float32Array,
  ys: Float32Array,
  m: PixelMap,
  qx: number,
  qy: number,
  r: number,
): number {
  let best = -1;
  let bestD2 = Infinity;
  for (let i = 0; i < xs.length; i++) {
    if (Number.isNaN(xs[i]) || Number.isNaN(ys[i])) continue;
    const dx = m.ox + (xs[i] - m.xLo) * m.sx - qx;
    const dy = m.oy + (ys[i] - m.yLo) * m.sy - qy;
    const d2 = dx * dx + dy * dy;
    if (d2 <= r * r && d2 < bestD2) {
      bestD2 = d2;
      best = i;
    }
  }
  return best;
}

const coord = fc.oneof(
  { weight: 9, arbitrary: fc.float({ min: -200, max: 200, noNaN: true }) },
  { weight: 1, arbitrary: fc.constant(Number.NaN) },
);

describe('NearestPicker', () => {
  it('picks what a brute-force search over every point picks, in any view', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(coord, coord), { minLength: 0, maxLength: 300 }),
        fc.record({
          xLo: fc.double({ min: -200, max: 0, noNaN: true }),
          yLo: fc.double({ min: -200, max: 0, noNaN: true }),
          // Reversed axes (l grows to the left, y downwards) and very unequal aspects.
          sx: fc.oneof(fc.double({ min: 0.05, max: 40 }), fc.double({ min: -40, max: -0.05 })),
          sy: fc.oneof(fc.double({ min: 0.05, max: 40 }), fc.double({ min: -40, max: -0.05 })),
          ox: fc.double({ min: -500, max: 500, noNaN: true }),
          oy: fc.double({ min: -500, max: 500, noNaN: true }),
        }),
        fc.double({ min: -100, max: 900, noNaN: true }),
        fc.double({ min: -100, max: 600, noNaN: true }),
        fc.double({ min: 0, max: 60, noNaN: true }),
        (pairs, map, qx, qy, r) => {
          const xs = Float32Array.from(pairs.map((p) => p[0]));
          const ys = Float32Array.from(pairs.map((p) => p[1]));
          const picked = new NearestPicker(xs, ys).nearest(map, qx, qy, r);
          const expected = bruteNearest(xs, ys, map, qx, qy, r);
          if (expected === -1) expect(picked).toBe(-1);
          else {
            // Equal pixel distances may pick either point; the distance must be the same.
            const d = (i: number) =>
              Math.hypot(
                map.ox + (xs[i] - map.xLo) * map.sx - qx,
                map.oy + (ys[i] - map.yLo) * map.sy - qy,
              );
            expect(picked).not.toBe(-1);
            expect(d(picked)).toBeCloseTo(d(expected), 9);
          }
        },
      ),
      { numRuns: 400 },
    );
  });

  it('measures on screen, not in data units', () => {
    // exact geometry: with x stretched 100 px per unit and y 1 px per unit, the point 0.1 away in
    // x (10 px) is farther on screen than the one 5 away in y (5 px).
    const xs = Float32Array.from([0.1, 0]);
    const ys = Float32Array.from([0, 5]);
    const map = { xLo: 0, yLo: 0, sx: 100, sy: 1, ox: 0, oy: 0 };
    expect(new NearestPicker(xs, ys).nearest(map, 0, 0, 20)).toBe(1);
    expect(new NearestPicker(xs, ys).nearest(map, 0, 0, 4)).toBe(-1);
  });

  it('names mismatched arrays', () => {
    expect(() => new NearestPicker(new Float32Array(2), new Float32Array(3))).toThrow(RangeError);
  });
});
