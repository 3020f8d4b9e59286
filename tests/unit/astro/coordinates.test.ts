import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  MakeTime,
  RotateVector,
  Rotation_EQJ_GAL,
  SphereFromVector,
  Vector,
} from 'astronomy-engine';
import {
  CoordinateParseError,
  angularSeparationDeg,
  equatorialToGalactic,
  equatorialToGalacticBulk,
  formatSexagesimal,
  galacticToEquatorial,
  galacticToEquatorialBulk,
  parseDecDeg,
  parseRaDeg,
  positionAngleDeg,
} from '@/lib/astro/coordinates';
import { makeRng } from '@/lib/stats/rng';

const ARCSEC = 1 / 3600;

describe('Galactic ↔ equatorial constants', () => {
  it('puts the J2000 north Galactic pole at b = +90°', () => {
    // Hipparcos Catalogue Vol. 1 §1.5.3: NGP at α = 192.85948°, δ = +27.12825°
    const g = equatorialToGalactic(192.85948, 27.12825);
    expect(Math.abs(g.bDeg - 90)).toBeLessThan(0.05 * ARCSEC);
  });

  it('gives the north celestial pole l = θ = 122.93192°, b = δ_NGP', () => {
    // Hipparcos Catalogue Vol. 1 §1.5.3: θ = 122.93192°
    const g = equatorialToGalactic(0, 90);
    expect(Math.abs(g.lDeg - 122.93192)).toBeLessThan(0.05 * ARCSEC);
    expect(Math.abs(g.bDeg - 27.12825)).toBeLessThan(0.05 * ARCSEC);
  });

  it('puts the Galactic centre at α = 266.40499°, δ = −28.93617°', () => {
    // Hipparcos Catalogue Vol. 1 §1.5.3 (GC of the J2000 Galactic system)
    const e = galacticToEquatorial(0, 0);
    expect(Math.abs(e.raDeg - 266.40499) * Math.cos((e.decDeg * Math.PI) / 180)).toBeLessThan(
      0.05 * ARCSEC,
    );
    expect(Math.abs(e.decDeg - -28.93617)).toBeLessThan(0.05 * ARCSEC);
    const g = equatorialToGalactic(266.40499, -28.93617);
    expect(angularSeparationDeg(g.lDeg, g.bDeg, 0, 0)).toBeLessThan(0.05 * ARCSEC);
  });

  it('agrees with astronomy-engine Rotation_EQJ_GAL within 15″ on 1000 random points', () => {
    // astronomy-engine (independent realisation of the 1958 system; agrees to ~10″, common practice)
    const rot = Rotation_EQJ_GAL();
    const t = MakeTime(0);
    const rng = makeRng(2024);
    let worst = 0;
    for (let i = 0; i < 1000; i++) {
      const ra = rng.next() * 360;
      const dec = (Math.asin(2 * rng.next() - 1) * 180) / Math.PI;
      const c = Math.cos((dec * Math.PI) / 180);
      const v = new Vector(
        c * Math.cos((ra * Math.PI) / 180),
        c * Math.sin((ra * Math.PI) / 180),
        Math.sin((dec * Math.PI) / 180),
        t,
      );
      const s = SphereFromVector(RotateVector(rot, v));
      const ours = equatorialToGalactic(ra, dec);
      worst = Math.max(worst, angularSeparationDeg(ours.lDeg, ours.bDeg, s.lon, s.lat));
    }
    expect(worst).toBeLessThan(15 * ARCSEC);
  });

  it('round-trips equatorial → Galactic → equatorial to 1e-9°', () => {
    // exact inverse rotation (common practice)
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 359.999999, noNaN: true }),
        fc.double({ min: -89.9999, max: 89.9999, noNaN: true }),
        (ra, dec) => {
          const g = equatorialToGalactic(ra, dec);
          const e = galacticToEquatorial(g.lDeg, g.bDeg);
          expect(angularSeparationDeg(ra, dec, e.raDeg, e.decDeg)).toBeLessThan(1e-9);
          expect(g.lDeg).toBeGreaterThanOrEqual(0);
          expect(g.lDeg).toBeLessThan(360);
        },
      ),
      { numRuns: 2000 },
    );
  });

  it('bulk conversions equal the scalar ones', () => {
    // brute-force oracle: scalar conversion per point
    const rng = makeRng(5);
    const ra = Float64Array.from({ length: 500 }, () => rng.next() * 360);
    const dec = Float64Array.from({ length: 500 }, () => rng.next() * 180 - 90);
    const g = equatorialToGalacticBulk(ra, dec);
    const e = galacticToEquatorialBulk(g.lDeg, g.bDeg);
    for (let i = 0; i < 500; i++) {
      const s = equatorialToGalactic(ra[i], dec[i]);
      expect(g.lDeg[i]).toBe(s.lDeg);
      expect(g.bDeg[i]).toBe(s.bDeg);
      expect(angularSeparationDeg(ra[i], dec[i], e.raDeg[i], e.decDeg[i])).toBeLessThan(1e-9);
    }
  });
});

describe('RA / Dec text', () => {
  const ra = (18 + 3 / 60 + 40.2 / 3600) * 15; // 18h03m40.2s in degrees, exact arithmetic
  it.each([
    ['18:03:40.2'],
    ['18h03m40.2s'],
    ['18 03 40.2'],
    ['18h 03m 40.2s'],
    ['  18:03:40.2  '],
    ['18H03M40.2S'],
  ])('reads RA %j as sexagesimal hours', (text) => {
    // exact arithmetic: (18 + 3/60 + 40.2/3600) × 15
    expect(parseRaDeg(text)).toBeCloseTo(ra, 10);
  });

  it('reads decimal degrees, decimal hours and explicit units', () => {
    // exact arithmetic
    expect(parseRaDeg('270.9175')).toBe(270.9175);
    expect(parseRaDeg(270.9175)).toBe(270.9175);
    expect(parseRaDeg('18.5h')).toBe(277.5);
    expect(parseRaDeg('18.5', 'hours')).toBe(277.5);
    expect(parseRaDeg(18.5, 'hours')).toBe(277.5);
    expect(parseRaDeg('270.5d')).toBe(270.5);
    expect(parseRaDeg('270.5°')).toBe(270.5);
    expect(parseRaDeg('270:30:00', 'deg')).toBe(270.5);
    expect(parseRaDeg('270°30′00″')).toBe(270.5);
    expect(parseRaDeg('0')).toBe(0);
  });

  it.each([
    ['-24:22:43', -(24 + 22 / 60 + 43 / 3600)],
    ['-24 22 43', -(24 + 22 / 60 + 43 / 3600)],
    ['-24d22m43s', -(24 + 22 / 60 + 43 / 3600)],
    ['\u221224\u00b022\u203243\u2033', -(24 + 22 / 60 + 43 / 3600)],
    ['-24°22\'43"', -(24 + 22 / 60 + 43 / 3600)],
    ["-24°22'43''", -(24 + 22 / 60 + 43 / 3600)],
    ['+24:22:43', 24 + 22 / 60 + 43 / 3600],
    ['24 22 43.5', 24 + 22 / 60 + 43.5 / 3600],
    ['-00 30 00', -0.5],
    ['-0:30', -0.5],
    ['\u221200\u00b030\u2032', -0.5],
    ['-24.3786', -24.3786],
    ['+90:00:00', 90],
  ])('reads Dec %j', (text, expected) => {
    // exact arithmetic; the sign applies to the whole angle (common practice)
    expect(parseDecDeg(text)).toBeCloseTo(expected, 12);
  });

  it.each([
    ['', 'empty'],
    ['abc', 'expected'],
    ['24:00:00', 'below 24'],
    ['25h', 'below 24'],
    ['18:60:00', 'minutes'],
    ['18:03:60', 'seconds'],
    ['18:03.5:20', 'whole'],
    ['-18:03:40', 'negative'],
    ['360.0', 'below 360'],
    ['1.2.3', 'expected'],
  ])('rejects RA %j', (text, why) => {
    // input validation rules of the brief (RA hours < 24, minutes/seconds < 60)
    expect(() => parseRaDeg(text)).toThrow(CoordinateParseError);
    expect(() => parseRaDeg(text)).toThrow(why);
    if (text !== '') expect(() => parseRaDeg(text)).toThrow(JSON.stringify(text));
  });

  it.each([
    ['91', '90'],
    ['-90:00:01', '90'],
    ['12:61:00', 'minutes'],
    ['12:00:75', 'seconds'],
    ['12h30m', 'hours'],
    ['north', 'expected'],
  ])('rejects Dec %j', (text, why) => {
    // input validation rules of the brief (|Dec| ≤ 90, minutes/seconds < 60)
    expect(() => parseDecDeg(text)).toThrow(CoordinateParseError);
    expect(() => parseDecDeg(text)).toThrow(why);
  });

  it('rejects non-finite numbers', () => {
    // input validation
    expect(() => parseRaDeg(Number.NaN)).toThrow(CoordinateParseError);
    expect(() => parseDecDeg(Infinity)).toThrow(CoordinateParseError);
  });

  it('formats sexagesimal with carry and round-trips through the parser', () => {
    // exact arithmetic
    expect(formatSexagesimal(ra, { hours: true })).toBe('18:03:40.20');
    expect(formatSexagesimal(-0.5)).toBe('-00:30:00.0');
    expect(formatSexagesimal(29.99999999)).toBe('+30:00:00.0');
    fc.assert(
      fc.property(fc.double({ min: -90, max: 90, noNaN: true }), (dec) => {
        const text = formatSexagesimal(dec, { secondsDecimals: 4 });
        expect(Math.abs(parseDecDeg(text) - dec)).toBeLessThan(0.6e-4 / 3600);
      }),
    );
  });
});

describe('separations and position angles', () => {
  it('matches simple geometry', () => {
    // spherical geometry (common practice)
    expect(angularSeparationDeg(0, 0, 90, 0)).toBeCloseTo(90, 12);
    expect(angularSeparationDeg(10, 20, 10, 20)).toBe(0);
    expect(angularSeparationDeg(0, 0, 180, 0)).toBeCloseTo(180, 12);
    expect(angularSeparationDeg(359.9, 0, 0.1, 0)).toBeCloseTo(0.2, 12);
    expect(angularSeparationDeg(0, 89.999, 180, 89.999)).toBeCloseTo(0.002, 9);
    expect(positionAngleDeg(10, 0, 10, 1)).toBeCloseTo(0, 9);
    expect(positionAngleDeg(10, 0, 11, 0)).toBeCloseTo(90, 9);
    expect(positionAngleDeg(10, 0, 10, -1)).toBeCloseTo(180, 9);
    expect(positionAngleDeg(10, 0, 9, 0)).toBeCloseTo(270, 9);
  });

  it('agrees with the cosine formula away from small angles', () => {
    // spherical law of cosines (brute-force oracle)
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 360, noNaN: true }),
        fc.double({ min: -90, max: 90, noNaN: true }),
        fc.double({ min: 0, max: 360, noNaN: true }),
        fc.double({ min: -90, max: 90, noNaN: true }),
        (a, b, c, d) => {
          const r = Math.PI / 180;
          const cos =
            Math.sin(b * r) * Math.sin(d * r) +
            Math.cos(b * r) * Math.cos(d * r) * Math.cos((a - c) * r);
          const ref = Math.acos(Math.min(1, Math.max(-1, cos))) / r;
          fc.pre(ref > 0.01 && ref < 179.99);
          expect(angularSeparationDeg(a, b, c, d)).toBeCloseTo(ref, 7);
        },
      ),
    );
  });
});
