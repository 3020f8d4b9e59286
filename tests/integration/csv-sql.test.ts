import { afterAll, describe, expect, it } from 'vitest';
import type { RowDataPacket } from 'mysql2';
import { closeDb, pool } from '@/db/client';
import fc from 'fast-check';
import { csvCell } from '@/lib/export/csv';
import { formatDecimals } from '@/lib/export/decimals';
import { csvCellSql, csvLineSql, type CsvSqlKind } from '@/lib/export/csv-sql';

/** Asks the real MariaDB for the CSV cell of `value` held in a column of type `type`. */
async function sqlCell(value: unknown, type: string, kind: CsvSqlKind): Promise<string> {
  const [[r]] = await pool().query<RowDataPacket[]>(
    `SELECT ${csvCellSql('t.x', kind)} AS cell FROM (SELECT CAST(? AS ${type}) AS x) t`,
    [value],
  );
  return String(r.cell);
}

afterAll(() => closeDb());

// The oracle is the JavaScript writer (lib/export/csv.ts, itself tested against RFC 4180 and
// the OWASP formula-injection rules): exports built by MariaDB must match it cell for cell.
describe('CSV cells written by MariaDB', () => {
  it('escape text exactly as the JavaScript writer does', async () => {
    const texts = [
      'G012.80-00.20',
      'plain',
      'Núcleo Ω',
      '=HYPERLINK("http://x")',
      '+cmd',
      '-2+3',
      '@SUM(A1)',
      '\tx',
      '\rx',
      'a,b',
      'say "hi"',
      'two\nlines',
      '-12.5',
      '+3',
      '-1.5e-3',
      '.5',
      '-.5e+7',
      '-12.5\n',
      '-',
      '+',
      '=',
      "it's",
      'back\\slash',
      '',
      '-1e',
      '1-2',
      ' -3',
    ];
    for (const t of texts)
      expect([t, await sqlCell(t, 'CHAR CHARACTER SET utf8mb4', 'text')]).toEqual([t, csvCell(t)]);
    expect(await sqlCell(null, 'CHAR', 'text')).toBe('');
  });

  it('write doubles as the same numbers, in the same digits for ordinary values', async () => {
    const numbers = [
      0,
      -0.2,
      12.8,
      0.1 + 0.2,
      177.64216939984394,
      -57.31,
      1 / 3,
      1e-5,
      123456789.125,
      -89.99999,
      359.999999999,
    ];
    for (const x of numbers)
      expect([x, await sqlCell(x, 'DOUBLE', 'number')]).toEqual([x, csvCell(x)]);
    // Very large and very small magnitudes differ only in how the exponent is spelled.
    for (const x of [1.5e-8, 6.02e23, -2.5e-300])
      expect(Number(await sqlCell(x, 'DOUBLE', 'number'))).toBe(x);
    expect(await sqlCell(null, 'DOUBLE', 'number')).toBe('');
    expect(await sqlCell(42, 'SIGNED', 'number')).toBe('42');
  });

  it('write doubles rounded to stated decimals exactly as formatDecimals does', async () => {
    const edge = [
      41.204450000115116, // issue #18
      1.2699999999999996, // issue #18
      1.005,
      -1.005,
      0.125,
      2.675,
      9.9995,
      -0.004,
      -0,
      1.5e-8,
      5e-9,
      4.9e-9,
      6.02e23,
      359.999999996,
      -89.99999999,
      123456789.125,
      1e-300,
    ];
    const random = fc.sample(fc.double({ min: -1e7, max: 1e7, noNaN: true }), 400);
    const values = [...edge, ...random];
    for (const d of [3, 4, 8]) {
      const rows = values.map(() => `SELECT ? AS i, CAST(? AS DOUBLE) AS x`).join(' UNION ALL ');
      const [out] = await pool().query<RowDataPacket[]>(
        `SELECT t.i, CAST(t.x AS CHAR) AS x, ${csvCellSql('t.x', 'number', d)} AS cell FROM (${rows}) t ORDER BY t.i`,
        // As text: MariaDB reads a string into a double correctly rounded (a DECIMAL literal is not).
        values.flatMap((x, i) => [i, String(x)]),
      );
      expect(out.length).toBe(values.length);
      for (const r of out) {
        const x = values[Number(r.i)];
        // The database holds the same double (read as text: the driver's own number parser
        // can be an ulp off), so any difference is in the writing.
        expect(Number(r.x)).toBe(x === 0 ? Number(r.x) : x);
        expect([x, d, String(r.cell)]).toEqual([x, d, formatDecimals(x, d)]);
      }
    }
    expect(await sqlCell(null, 'DOUBLE', 'number')).toBe('');
  });

  it('write booleans and times as the JavaScript writer does', async () => {
    expect(await sqlCell(1, 'SIGNED', 'boolean')).toBe(csvCell(true));
    expect(await sqlCell(0, 'SIGNED', 'boolean')).toBe(csvCell(false));
    expect(await sqlCell(null, 'SIGNED', 'boolean')).toBe('');
    expect(await sqlCell('2026-03-04 05:06:07.089', 'DATETIME(3)', 'time')).toBe(
      new Date('2026-03-04T05:06:07.089Z').toISOString(),
    );
    expect(await sqlCell('2026-12-31 23:59:59.000', 'DATETIME(3)', 'time')).toBe(
      '2026-12-31T23:59:59.000Z',
    );
    expect(await sqlCell(null, 'DATETIME(3)', 'time')).toBe('');
  });

  it('join cells into a CRLF record, empty cells kept in place', async () => {
    const line = csvLineSql([
      { sql: 't.a', kind: 'raw' },
      { sql: 't.b', kind: 'number' },
      { sql: 't.c', kind: 'text' },
      { sql: 't.d', kind: 'number' },
    ]);
    const [[r]] = await pool().query<RowDataPacket[]>(
      `SELECT ${line} AS line FROM (SELECT 'x' AS a, NULL AS b, 'a,b' AS c, CAST(-1.25 AS DOUBLE) AS d) t`,
    );
    expect(String(r.line)).toBe('x,,"a,b",-1.25\r\n');
  });
});
