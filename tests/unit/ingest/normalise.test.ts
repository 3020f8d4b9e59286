import { describe, expect, it } from 'vitest';
import { equatorialToGalactic } from '@/lib/astro/coordinates';
import { isRejection, makeBatchNormaliser, makeRowNormaliser } from '@/lib/ingest/normalise';
import { mappingSchema, type Mapping } from '@/lib/ingest/mapping';
import { rejectionMessage, type CanonicalRecord } from '@/lib/ingest/canonical';
import type { TableHeader } from '@/lib/ingest/types';

function header(names: string[]): TableHeader {
  return {
    format: 'delimited',
    delimiter: ',',
    headerLine: 1,
    columns: names.map((name) => ({ name })),
  };
}

const galactic = (extra: Partial<Mapping> = {}): Mapping =>
  mappingSchema.parse({
    position: {
      system: 'galactic',
      lon: { column: 'glon', unit: 'deg' },
      lat: { column: 'glat', unit: 'deg' },
    },
    ...extra,
  });

function record(r: ReturnType<ReturnType<typeof makeRowNormaliser>>): CanonicalRecord {
  if (isRejection(r)) throw new Error(`unexpected rejection: ${r.reason}`);
  return r;
}

const C_KMS = 299792.458; // speed of light, exact by definition (SI)

describe('row normaliser', () => {
  const cols = ['glon', 'glat', 'v', 'size', 'width', 'dist', 'name'];

  it('converts heliocentric velocities to LSR with the kinematic-LSR formula', () => {
    const n = makeRowNormaliser(
      header(cols),
      galactic({
        velocity: { column: 'v', unit: 'km/s', frame: 'heliocentric', convention: 'radio' },
      }),
    );
    for (const [l, b, v] of [
      [30, 0.5, 50],
      [120, -3, -40],
      [250, 10, 12.5],
    ]) {
      const rec = record(n([String(l), String(b), String(v), '', '', '', ''], 2, 1));
      const rad = Math.PI / 180;
      // Kinematic LSR (common practice): v_LSR = v_helio + U cos l cos b + V sin l cos b + W sin b,
      // (U, V, W) = (10.27, 15.32, 7.74) km/s.
      const expected =
        v +
        10.27 * Math.cos(l * rad) * Math.cos(b * rad) +
        15.32 * Math.sin(l * rad) * Math.cos(b * rad) +
        7.74 * Math.sin(b * rad);
      expect(rec.vLsrKms).toBeCloseTo(expected, 10);
    }
  });

  it('converts optical velocities to the radio convention and m/s to km/s', () => {
    const n = makeRowNormaliser(
      header(cols),
      galactic({ velocity: { column: 'v', unit: 'm/s', frame: 'lsr', convention: 'optical' } }),
    );
    const rec = record(n(['10', '0', '3000000', '', '', '', ''], 2, 1));
    const vOpt = 3000;
    // Radio and optical conventions (definitions): ν/ν₀ = 1/(1 + v_opt/c), v_radio = c(1 − ν/ν₀) = c·v_opt/(c + v_opt).
    expect(rec.vLsrKms).toBeCloseTo((C_KMS * vOpt) / (C_KMS + vOpt), 9);
  });

  it('halves diameters and converts arcmin to arcsec; FWHM line widths become σ; pc to kpc', () => {
    const n = makeRowNormaliser(
      header(cols),
      galactic({
        size: { column: 'size', unit: 'arcmin', kind: 'diameter' },
        lineWidth: { column: 'width', unit: 'km/s', kind: 'fwhm' },
        distance: { column: 'dist', unit: 'pc' },
        name: { column: 'name' },
      }),
    );
    const rec = record(n(['350', '-1', '', '2', '4.7096', '2500', ' G350 '], 7, 3));
    expect(rec.radiusArcsec).toBe(60); // 2 arcmin diameter → 1 arcmin radius = 60″ (definition)
    // σ = FWHM / (2√(2 ln 2)), 2√(2 ln 2) = 2.354820045 (Gaussian, common practice)
    expect(rec.sigmaVKms).toBeCloseTo(4.7096 / 2.354820045, 8);
    expect(rec.distKpc).toBeCloseTo(2.5, 12);
    expect(rec.name).toBe('G350');
    expect(rec.vLsrKms).toBeNull();
    expect(rec).toMatchObject({ row: 3, line: 7, lDeg: 350, bDeg: -1 });
    expect(rec.original).toEqual(['350', '-1', '', '2', '4.7096', '2500', ' G350 ']);
  });

  it('wraps negative Galactic longitudes into [0, 360)', () => {
    const n = makeRowNormaliser(header(['glon', 'glat']), galactic());
    expect(record(n(['-10.5', '0'], 2)).lDeg).toBeCloseTo(349.5, 12);
  });

  it('reads equatorial degrees, hours and sexagesimal through the J2000 → Galactic rotation', () => {
    const h = header(['ra', 'dec']);
    const eq = (raUnit: string, decUnit: string): Mapping =>
      mappingSchema.parse({
        position: {
          system: 'equatorial',
          lon: { column: 'ra', unit: raUnit },
          lat: { column: 'dec', unit: decUnit },
        },
      });
    // Galactic centre at α = 266.40499°, δ = −28.93617° (Hipparcos Catalogue, ESA 1997, Vol. 1, §1.5.3).
    const gcDeg = record(makeRowNormaliser(h, eq('deg', 'deg'))(['266.40499', '-28.93617'], 2));
    expect(Math.min(gcDeg.lDeg, 360 - gcDeg.lDeg)).toBeLessThan(1e-4);
    expect(gcDeg.bDeg).toBeCloseTo(0, 4);
    const hours = record(
      makeRowNormaliser(h, eq('hours', 'deg'))([String(266.40499 / 15), '-28.93617'], 2),
    );
    expect(hours.lDeg).toBeCloseTo(gcDeg.lDeg, 8);
    const sex = record(
      makeRowNormaliser(h, eq('sexagesimal', 'sexagesimal'))(['18:03:40.2', '-24:22:43'], 2),
    );
    // 18:03:40.2 = 270.9175°, −24:22:43 = −24.378611° (arithmetic); the rotation is lib/astro's.
    const g = equatorialToGalactic(270.9175, -24.378611111111);
    expect(sex.lDeg).toBeCloseTo(g.lDeg, 8);
    expect(sex.bDeg).toBeCloseTo(g.bDeg, 8);
  });

  it('rejects bad rows with the field, the value and the rule', () => {
    const n = makeRowNormaliser(
      header(cols),
      galactic({ velocity: { column: 'v', unit: 'km/s', frame: 'lsr', convention: 'radio' } }),
    );
    const reasons = [
      n(['10', '95.2', '1', '', '', '', ''], 12, 1),
      n(['10', 'abc', '1', '', '', '', ''], 13, 2),
      n(['10', '1', 'fast', '', '', '', ''], 14, 3),
      n(['', '1', '1', '', '', '', ''], 15, 4),
      n(['10', '1'], 16, 5),
      n(['10', '1', '1', '', '', '', '', 'extra'], 17, 6),
    ].map((r) => (isRejection(r) ? rejectionMessage(r) : 'accepted'));
    expect(reasons).toEqual([
      'line 12: field `glat` value `95.2`: |b| must be ≤ 90°',
      'line 13: field `glat` value `abc`: not a number',
      'line 14: field `v` value `fast`: not a number',
      'line 15: field `glon` value ``: a value is required',
      'line 16: too few fields: expected 7 (as in the header), found 2',
      'line 17: too many fields: expected 7 (as in the header), found 8',
    ]);
  });

  it('rejects RA hours ≥ 24 and |Dec| > 90', () => {
    const n = makeRowNormaliser(
      header(['ra', 'dec']),
      mappingSchema.parse({
        position: {
          system: 'equatorial',
          lon: { column: 'ra', unit: 'hours' },
          lat: { column: 'dec', unit: 'deg' },
        },
      }),
    );
    const hours = n(['24.5', '10'], 4);
    expect(isRejection(hours) && hours.reason).toMatch(
      /^field `ra` value `24.5`: .*hours must be below 24/,
    );
    const dec = n(['12', '-91'], 5);
    expect(isRejection(dec) && dec.reason).toMatch(/^field `dec` value `-91`: .*exceeds 90/);
  });

  it('rejects negative sizes and distances', () => {
    const n = makeRowNormaliser(
      header(cols),
      galactic({
        size: { column: 'size', unit: 'arcsec', kind: 'radius' },
        distance: { column: 'dist', unit: 'kpc' },
      }),
    );
    const size = n(['1', '0', '', '-3', '', '', ''], 8);
    expect(isRejection(size) && size.reason).toBe(
      'field `size` value `-3`: angular size must be ≥ 0',
    );
    const dist = n(['1', '0', '', '', '', '0', ''], 9);
    expect(isRejection(dist) && dist.reason).toBe('field `dist` value `0`: distance must be > 0');
  });
});

describe('batch normaliser', () => {
  it('writes accepted rows into flat columns and collects rejections', () => {
    const normalise = makeBatchNormaliser(
      header(['glon', 'glat', 'v']),
      galactic({ velocity: { column: 'v', unit: 'km/s', frame: 'lsr', convention: 'radio' } }),
    );
    const out = normalise({
      firstRow: 11,
      lines: Uint32Array.from([20, 21, 23]),
      values: [
        ['10', '0.5', '-5'],
        ['10', '99', '1'],
        ['20', '-0.5', 'NaN'],
      ],
    });
    expect(out.columns.count).toBe(2);
    expect(Array.from(out.columns.row)).toEqual([11, 13]);
    expect(Array.from(out.columns.line)).toEqual([20, 23]);
    expect(Array.from(out.columns.lDeg)).toEqual([10, 20]);
    expect(Array.from(out.columns.vLsrKms)).toEqual([-5, NaN]);
    expect(Array.from(out.columns.radiusArcsec)).toEqual([NaN, NaN]);
    expect(out.rejected).toEqual([
      { row: 12, line: 21, reason: 'field `glat` value `99`: |b| must be ≤ 90°' },
    ]);
  });
});
