import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { mappingSchema } from '@/lib/ingest/mapping';
import { mappingFromSuggestion, suggestMapping } from '@/lib/ingest/suggest';
import type { TableHeader } from '@/lib/ingest/types';
import { IngestFileError } from '@/lib/ingest/errors';
import { readAll } from './helpers';

const fixture = (name: string): string => path.join(__dirname, '../../fixtures/ingest', name);

function textHeader(names: string[]): TableHeader {
  return {
    format: 'delimited',
    delimiter: ',',
    headerLine: 1,
    columns: names.map((name) => ({ name })),
  };
}

describe('suggestMapping', () => {
  it('GLON,GLAT,VLSR style', async () => {
    const { header, rows } = await readAll(await readFile(fixture('co-clouds-glon.csv')));
    const s = suggestMapping(
      header,
      rows.map((r) => r.values),
    );
    expect(s.positionUnambiguous).toBe(true);
    expect(s.mapping).toEqual({
      position: {
        system: 'galactic',
        lon: { column: 'GLON', unit: 'deg' },
        lat: { column: 'GLAT', unit: 'deg' },
      },
      velocity: { column: 'VLSR', unit: 'km/s', frame: 'lsr', convention: 'radio' },
      lineWidth: { column: 'dV', unit: 'km/s', kind: 'fwhm' },
      name: { column: 'Name' },
    });
    expect(s.notes).toContain('column `VLSR` has no unit; km/s assumed');
  });

  it('l_deg;b_deg;v_kms with units in the names', async () => {
    const { header, rows } = await readAll(await readFile(fixture('hii-semicolon.csv')));
    const s = suggestMapping(
      header,
      rows.map((r) => r.values),
    );
    expect(s.mapping).toEqual({
      position: {
        system: 'galactic',
        lon: { column: 'l_deg', unit: 'deg' },
        lat: { column: 'b_deg', unit: 'deg' },
      },
      velocity: { column: 'v_kms', unit: 'km/s', frame: 'lsr', convention: 'radio' },
      size: { column: 'r_arcsec', unit: 'arcsec', kind: 'radius' },
    });
  });

  it('RAJ2000 DEJ2000 Vhel with sexagesimal values', async () => {
    const { header, rows } = await readAll(await readFile(fixture('ob-sexagesimal.txt')));
    const s = suggestMapping(
      header,
      rows.map((r) => r.values),
    );
    expect(s.mapping).toEqual({
      position: {
        system: 'equatorial',
        lon: { column: 'RAJ2000', unit: 'sexagesimal' },
        lat: { column: 'DEJ2000', unit: 'sexagesimal' },
      },
      velocity: { column: 'Vhel', unit: 'km/s', frame: 'heliocentric', convention: 'radio' },
      velocityError: { column: 'e_Vhel', unit: 'km/s' },
      name: { column: 'Name' },
    });
  });

  it('a VOTable whose columns are identified by UCDs only', async () => {
    const { header, rows } = await readAll(await readFile(fixture('ucd-only-v14.vot')));
    const s = suggestMapping(
      header,
      rows.map((r) => r.values),
    );
    expect(s.candidates[0].evidence).toBe('ucd');
    expect(s.mapping).toEqual({
      position: {
        system: 'equatorial',
        lon: { column: 'c1', unit: 'deg' },
        lat: { column: 'c2', unit: 'deg' },
      },
      velocity: { column: 'c3', unit: 'km/s', frame: 'heliocentric', convention: 'optical' },
      velocityError: { column: 'c4', unit: 'km/s' },
      size: { column: 'c5', unit: 'arcmin', kind: 'diameter' },
      lineWidth: { column: 'c6', unit: 'km/s', kind: 'sigma' },
      distance: { column: 'c7', unit: 'kpc' },
      distanceError: { column: 'c8', unit: 'kpc' },
      name: { column: 'c9' },
    });
  });

  it('units in brackets and parentheses; distance and size told apart by unit', () => {
    const header = textHeader([
      'Name',
      'l (deg)',
      'b (deg)',
      'V [m/s]',
      'D (kpc)',
      'diam [arcmin]',
      'e_pos (arcsec)',
    ]);
    const s = suggestMapping(header, [['X', '10', '0.1', '5000', '3.2', '2', '1']]);
    expect(s.mapping).toMatchObject({
      position: { system: 'galactic', lon: { column: 'l (deg)' }, lat: { column: 'b (deg)' } },
      velocity: { column: 'V [m/s]', unit: 'm/s' },
      distance: { column: 'D (kpc)', unit: 'kpc' },
      size: { column: 'diam [arcmin]', unit: 'arcmin', kind: 'diameter' },
      positionError: { column: 'e_pos (arcsec)', unit: 'arcsec' },
      name: { column: 'Name' },
    });
  });

  it('prefers Galactic when both Galactic and equatorial columns are named', () => {
    const header = textHeader(['RAJ2000', 'DEJ2000', 'GLON', 'GLAT']);
    const s = suggestMapping(header, [['270.1', '-24.2', '6.1', '-1.2']]);
    expect(s.positionUnambiguous).toBe(true);
    expect(s.mapping?.position.system).toBe('galactic');
  });

  it('is ambiguous when only the values suggest a 0..360 column next to a −90..90 one', () => {
    const header = textHeader(['x1', 'x2', 'flux']);
    const rows = [
      ['120.5', '-30.2', '1e-3'],
      ['300.1', '45.0', '2e-3'],
    ];
    const s = suggestMapping(header, rows);
    expect(s.positionUnambiguous).toBe(false);
    expect(s.mapping).toBeNull();
    expect(s.candidates.map((c) => [c.system, c.lon.column, c.lat.column, c.evidence])).toEqual([
      ['galactic', 'x1', 'x2', 'values'],
      ['equatorial', 'x1', 'x2', 'values'],
    ]);
    try {
      mappingFromSuggestion(s, header);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(IngestFileError);
      expect((e as IngestFileError).code).toBe('ambiguous-position-columns');
      expect((e as IngestFileError).details).toEqual({ candidates: s.candidates });
    }
  });

  it('finds sexagesimal RA/Dec from the values alone', () => {
    const header = textHeader(['src', 'pos1', 'pos2']);
    const s = suggestMapping(header, [['a', '05:35:17.3', '-05:23:28']]);
    expect(s.candidates).toEqual([
      {
        system: 'equatorial',
        lon: { column: 'pos1', unit: 'sexagesimal' },
        lat: { column: 'pos2', unit: 'sexagesimal' },
        evidence: 'values',
      },
    ]);
    expect(s.mapping?.position.system).toBe('equatorial');
  });

  it('is ambiguous when two Galactic pairs are named', () => {
    const s = suggestMapping(textHeader(['l', 'b', 'GLON', 'GLAT']), [['1', '2', '1', '2']]);
    expect(s.positionUnambiguous).toBe(false);
    expect(s.candidates).toHaveLength(2);
  });

  it('every complete suggestion passes the mapping schema', () => {
    const s = suggestMapping(textHeader(['GLON', 'GLAT', 'VLSR']), [['1', '2', '3']]);
    expect(mappingSchema.safeParse(s.mapping).success).toBe(true);
  });
});

describe('mappingSchema', () => {
  it('rejects unknown units and RA units on Galactic columns', () => {
    const bad = mappingSchema.safeParse({
      position: {
        system: 'galactic',
        lon: { column: 'l', unit: 'hours' },
        lat: { column: 'b', unit: 'deg' },
      },
      velocity: { column: 'v', unit: 'furlong', frame: 'lsr', convention: 'radio' },
    });
    expect(bad.success).toBe(false);
    const paths = bad.error?.issues.map((i) => i.path.join('.'));
    expect(paths).toEqual(expect.arrayContaining(['position.lon.unit', 'velocity.unit']));
  });
});
