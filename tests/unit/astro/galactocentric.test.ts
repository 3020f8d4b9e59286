import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  ROTATION_SENSE,
  azimuthDeg,
  fromGalactocentric,
  polarToXy,
  toGalactocentric,
} from '@/lib/astro/galactocentric';

describe('Galactocentric frame (Reid et al. 2014 convention)', () => {
  it('puts the Sun on +x at R0 and the Galactic centre at the origin', () => {
    // Reid et al. 2014: Sun on the positive x axis, β = 0 toward the Sun
    const gc = toGalactocentric(0, 0, 8.34, 8.34);
    expect(gc.xKpc).toBeCloseTo(0, 12);
    expect(gc.yKpc).toBeCloseTo(0, 12);
    const sun = toGalactocentric(123, 4, 0, 8.34);
    expect(sun.xKpc).toBe(8.34);
    expect(sun.betaDeg).toBeCloseTo(0, 12);
  });

  it('has β increasing with Galactic longitude and the rotation toward +β', () => {
    // Reid et al. 2014: β increases with l; the Sun moves toward l = 90° (common practice)
    expect(toGalactocentric(30, 0, 3, 8.5).betaDeg).toBeGreaterThan(0);
    expect(toGalactocentric(330, 0, 3, 8.5).betaDeg).toBeLessThan(0);
    const ahead = toGalactocentric(90, 0, 0.01, 8.5);
    expect(ahead.yKpc).toBeLessThan(0);
    expect(Math.sign(ahead.betaDeg)).toBe(ROTATION_SENSE);
    expect(ROTATION_SENSE).toBe(1);
  });

  it('places l = 90°, d = R0 at 45° azimuth and the anticentre at β = 0', () => {
    // plane geometry
    const p = toGalactocentric(90, 0, 8, 8);
    expect(p.RKpc).toBeCloseTo(8 * Math.SQRT2, 12);
    expect(p.betaDeg).toBeCloseTo(45, 12);
    expect(toGalactocentric(180, 0, 2, 8).betaDeg).toBeCloseTo(0, 12);
    expect(toGalactocentric(180, 0, 2, 8).RKpc).toBeCloseTo(10, 12);
  });

  it('round-trips heliocentric ↔ Galactocentric', () => {
    // exact inverse
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 359.999, noNaN: true }),
        fc.double({ min: -89, max: 89, noNaN: true }),
        fc.double({ min: 0.001, max: 30, noNaN: true }),
        (l, b, d) => {
          const g = toGalactocentric(l, b, d, 8.15);
          const h = fromGalactocentric(g.xKpc, g.yKpc, g.zKpc, 8.15);
          expect(h.distKpc).toBeCloseTo(d, 9);
          expect(h.bDeg).toBeCloseTo(b, 9);
          const dl = Math.abs(((h.lDeg - l + 540) % 360) - 180);
          expect(dl * Math.cos((b * Math.PI) / 180) * d).toBeLessThan(1e-9);
          const q = polarToXy(g.RKpc, g.betaDeg);
          expect(q.xKpc).toBeCloseTo(g.xKpc, 9);
          expect(q.yKpc).toBeCloseTo(g.yKpc, 9);
          expect(azimuthDeg(g.xKpc, g.yKpc)).toBe(g.betaDeg);
        },
      ),
    );
  });
});
