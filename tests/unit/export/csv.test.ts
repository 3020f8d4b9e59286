import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { csvCell, csvLine, csvStream } from '@/lib/export/csv';

describe('CSV writer', () => {
  it('escapes cells that a spreadsheet would run as formulas', () => {
    expect(csvCell('=HYPERLINK("http://x")')).toBe('"\'=HYPERLINK(""http://x"")"');
    expect(csvCell('+cmd')).toBe("'+cmd");
    expect(csvCell('-2+3')).toBe("'-2+3");
    expect(csvCell('@SUM(A1)')).toBe("'@SUM(A1)");
    expect(csvCell('\tx')).toBe("'\tx");
    expect(csvCell('\rx')).toBe('"\'\rx"');
  });

  it('leaves plain numbers alone, as numbers or as numeric strings', () => {
    expect(csvCell(-12.5)).toBe('-12.5');
    expect(csvCell('-12.5')).toBe('-12.5');
    expect(csvCell('+3')).toBe('+3');
    expect(csvCell('-1.5e-3')).toBe('-1.5e-3');
    expect(csvCell(0.1 + 0.2)).toBe('0.30000000000000004');
  });

  it('writes empty cells for null, undefined and non-finite numbers, and quotes per RFC 4180', () => {
    expect(csvLine([null, undefined, NaN, Infinity, 'a,b', 'say "hi"', 'two\nlines', true])).toBe(
      ',,,,"a,b","say ""hi""","two\nlines",true\r\n',
    );
  });

  it('streams header and rows as UTF-8 bytes that parse back to the same cells', async () => {
    async function* rows(): AsyncGenerator<unknown[]> {
      yield ['G12.8', 12.8, -0.2, 'Núcleo, "A"'];
      yield ['=bad', -5, null, 'x'];
    }
    const text = await new Response(csvStream(['name', 'l', 'b', 'note'], rows())).text();
    const parsed = Papa.parse<string[]>(text.trim(), { newline: '\r\n' }).data;
    expect(parsed).toEqual([
      ['name', 'l', 'b', 'note'],
      ['G12.8', '12.8', '-0.2', 'Núcleo, "A"'],
      ["'=bad", '-5', '', 'x'],
    ]);
  });
});
