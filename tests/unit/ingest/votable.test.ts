import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { readAll } from './helpers';

const fixture = (name: string): string => path.join(__dirname, '../../fixtures/ingest', name);

describe('VOTable reader', () => {
  it('reads a VOTable 1.3 (default namespace): FIELD metadata, TR lines, nulls and escapes', async () => {
    const { header, rows } = await readAll(await readFile(fixture('hi-table-v13.vot')));
    expect(header.format).toBe('votable');
    expect(header.delimiter).toBeNull();
    expect(header.headerLine).toBe(6);
    expect(header.columns).toEqual([
      { name: 'GLON', datatype: 'double', unit: 'deg', ucd: 'pos.galactic.lon' },
      { name: 'GLAT', datatype: 'double', unit: 'deg', ucd: 'pos.galactic.lat' },
      {
        name: 'VLSR',
        datatype: 'float',
        unit: 'km/s',
        ucd: 'spect.dopplerVeloc.radio',
        description: 'centroid velocity & frame: LSR',
      },
      { name: 'Name', datatype: 'char', arraysize: '*', ucd: 'meta.id;meta.main' },
    ]);
    expect(rows).toEqual([
      { row: 1, line: 15, values: ['45.10', '0.20', '55.5', 'HI <1>'] },
      // VALUES null="-999" becomes an empty cell; <TD/> is empty.
      { row: 2, line: 16, values: ['46.00', '-0.35', '', ''] },
    ]);
  });

  it('reads a VOTable 1.4 with prefixed namespace elements, in tiny chunks', async () => {
    const bytes = await readFile(fixture('ucd-only-v14.vot'));
    const { header, rows } = await readAll(bytes, { chunkBytes: 13 });
    expect(header.columns.map((c) => c.name)).toEqual([
      'c1',
      'c2',
      'c3',
      'c4',
      'c5',
      'c6',
      'c7',
      'c8',
      'c9',
    ]);
    expect(header.columns[2].ucd).toBe('spect.dopplerVeloc.opt;pos.heliocentric');
    expect(rows).toEqual([
      {
        row: 1,
        line: 17,
        values: ['270.9175', '-24.3786', '10.0', '0.5', '1.5', '2.0', '1.9', '0.2', 'M1'],
      },
    ]);
  });
});
