import { describe, expect, it } from 'vitest';
import { decimalCommaColumns, withDecimalPoints } from '@/lib/ingest/decimal-comma';
import { mappingSchema } from '@/lib/ingest/mapping';
import { isRejection, makeRowNormaliser } from '@/lib/ingest/normalise';
import type { TableHeader } from '@/lib/ingest/types';
import { readAll } from './helpers';

const semicolon = [
  'GLON;GLAT;VLSR;NAME',
  '30,1;-0,25;95,5;A',
  '45,75;0,5;58,25;B',
  '310,2;-1,125;-42,5;C',
].join('\n');

const galactic = mappingSchema.parse({
  position: {
    system: 'galactic',
    lon: { column: 'GLON', unit: 'deg' },
    lat: { column: 'GLAT', unit: 'deg' },
  },
  velocity: { column: 'VLSR', unit: 'km/s', frame: 'lsr', convention: 'radio' },
});

describe('decimal commas', () => {
  it('finds the columns whose cells are written 30,1 in a semicolon file', async () => {
    const { header, rows } = await readAll(semicolon);
    expect(header.delimiter).toBe(';');
    const values = rows.map((r) => r.values);
    expect(decimalCommaColumns(header, values)).toEqual(['GLON', 'GLAT', 'VLSR']);
    expect(withDecimalPoints(values)[0]).toEqual(['30.1', '-0.25', '95.5', 'A']);
  });

  it('needs most filled cells of a column to match, and never flags a comma-separated file', () => {
    const header: TableHeader = {
      format: 'delimited',
      delimiter: '\t',
      columns: [{ name: 'a' }, { name: 'b' }],
      headerLine: 1,
    };
    // a: 4 of 5 filled cells (80 %) have a decimal comma; b: 1 of 5.
    const rows = [
      ['1,5', '2,5'],
      ['2,5', '3'],
      ['3,5', '4'],
      ['4,5', '5'],
      ['5', '6'],
      ['', '7'],
    ];
    expect(decimalCommaColumns(header, rows)).toEqual(['a']);
    expect(decimalCommaColumns({ ...header, delimiter: ',' }, rows)).toEqual([]);
  });

  it('the normaliser reads decimal commas only when asked; values are the decimal reading', async () => {
    const { header, rows } = await readAll(semicolon);
    const plain = makeRowNormaliser(header, galactic);
    const first = plain(rows[0].values, rows[0].line, rows[0].row);
    expect(isRejection(first)).toBe(true);
    expect(isRejection(first) && first.reason).toBe('field `GLON` value `30,1`: not a number');

    const comma = makeRowNormaliser(header, galactic, { decimalComma: true });
    const read = rows.map((r) => comma(r.values, r.line, r.row));
    // 30,1 is 30.1 by definition of the decimal comma; l, b, v as written.
    expect(read.map((r) => (isRejection(r) ? r.reason : [r.lDeg, r.bDeg, r.vLsrKms]))).toEqual([
      [30.1, -0.25, 95.5],
      [45.75, 0.5, 58.25],
      [310.2, -1.125, -42.5],
    ]);
    // A point still reads as a point, and text with two commas is still not a number.
    expect(comma(['12.5', '0,5', '1', 'D'], 5, 4)).toMatchObject({ lDeg: 12.5, bDeg: 0.5 });
    expect(comma(['1,2,3', '0', '1', 'E'], 6, 5)).toMatchObject({
      reason: 'field `GLON` value `1,2,3`: not a number',
    });
  });
});
