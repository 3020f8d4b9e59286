import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { previewFile } from '@/lib/ingest/preview';
import { readAll } from './helpers';

const fixture = (name: string): string => path.join(__dirname, '../../fixtures/ingest', name);

describe('delimited reader', () => {
  it('detects comma, tab, semicolon and whitespace delimiters', async () => {
    const cases: [string, string][] = [
      ['l,b,v\n1,2,3\n4,5,6\n', ','],
      ['l\tb\tv\n1\t2\t3\n4\t5\t6\n', '\t'],
      ['l;b;v\n1,5;2;3\n4;5,5;6\n', ';'],
      ['l   b  v\n 1  2   3\n4 5 6\n', 'whitespace'],
    ];
    for (const [text, delimiter] of cases) {
      const { header, rows } = await readAll(text);
      expect(header.delimiter).toBe(delimiter);
      expect(header.columns.map((c) => c.name)).toEqual(['l', 'b', 'v']);
      expect(rows.map((r) => r.values.length)).toEqual([3, 3]);
    }
  });

  it('keeps whitespace-separated quoted tokens together', async () => {
    const { rows } = await readAll('name l b\n"Sh 2-104" 74.76 0.58\n');
    expect(rows[0].values).toEqual(['Sh 2-104', '74.76', '0.58']);
  });

  it('skips # comments and blank lines but counts them in line numbers', async () => {
    const text = '# survey notes\n\nl,b\n# between\n1,2\n\n3,4\n';
    const { header, rows } = await readAll(text);
    expect(header.headerLine).toBe(3);
    expect(rows.map((r) => [r.row, r.line])).toEqual([
      [1, 5],
      [2, 7],
    ]);
  });

  it('reads quoted fields with embedded delimiters, quotes and newlines, keeping line numbers right', async () => {
    const { rows } = await readAll(await readFile(fixture('co-clouds-glon.csv')));
    expect(rows.map((r) => r.values[4])).toEqual([
      'Cloud A, core',
      'Cloud "B"',
      'Cloud\nspanning two lines',
      'Cloud D',
    ]);
    // Lines 1-2 comments, 3 header, 5 a comment, the third cloud spans lines 7-8.
    expect(rows.map((r) => r.line)).toEqual([4, 6, 7, 9]);
    expect(rows.map((r) => r.row)).toEqual([1, 2, 3, 4]);
  });

  it('gets the same rows and lines whatever the chunk boundaries', async () => {
    const bytes = await readFile(fixture('co-clouds-glon.csv'));
    const whole = await readAll(bytes);
    for (const chunkBytes of [1, 3, 7, 64]) {
      expect(await readAll(bytes, { chunkBytes })).toEqual(whole);
    }
  });

  it('drops a UTF-8 byte-order mark and handles CRLF line ends', async () => {
    const bom = Buffer.from([0xef, 0xbb, 0xbf]);
    const text = Buffer.from('GLON,GLAT,Name\r\n10,0.5,"A\r\nB"\r\n11,0.6,C\r\n');
    const { header, rows } = await readAll(Buffer.concat([bom, text]), { chunkBytes: 5 });
    expect(header.columns.map((c) => c.name)).toEqual(['GLON', 'GLAT', 'Name']);
    expect(rows.map((r) => r.values)).toEqual([
      ['10', '0.5', 'A\r\nB'],
      ['11', '0.6', 'C'],
    ]);
    expect(rows.map((r) => r.line)).toEqual([2, 4]);
  });

  it('reads a headerless whitespace table, naming columns from the # line above', async () => {
    const { header, rows } = await readAll('# l b v\n12.1 0.2 35\n13.0 -0.1 40\n');
    expect(header.headerLine).toBeNull();
    expect(header.columns.map((c) => c.name)).toEqual(['l', 'b', 'v']);
    expect(rows.map((r) => r.line)).toEqual([2, 3]);
  });

  it('keeps rows with the wrong number of fields for the normaliser to reject', async () => {
    const { rows } = await readAll('l,b,v\n1,2\n1,2,3,4\n');
    expect(rows.map((r) => r.values.length)).toEqual([2, 4]);
  });

  it('hands rows out in batches of the requested size, numbered consecutively', async () => {
    const text = 'l,b\n' + Array.from({ length: 12 }, (_, i) => `${i},0`).join('\n');
    const { rows } = await readAll(text, { batchSize: 5 });
    expect(rows.map((r) => r.row)).toEqual(Array.from({ length: 12 }, (_, i) => i + 1));
    expect(rows.map((r) => r.line)).toEqual(Array.from({ length: 12 }, (_, i) => i + 2));
  });

  it('previews the first rows with the detected format and delimiter', async () => {
    const p = await previewFile(fixture('ob-sexagesimal.txt'), 2);
    expect(p.format).toBe('delimited');
    expect(p.delimiter).toBe('whitespace');
    expect(p.rows).toEqual([
      { row: 1, line: 3, values: ['18:03:40.2', '-24:22:43', '12.5', '1.2', 'Star 1'] },
      { row: 2, line: 4, values: ['18:04:12.9', '-24:10:05.5', '-3.0', '0.8', 'Star_2'] },
    ]);
    expect(p.more).toBe(true);
    const all = await previewFile(await readFile(fixture('hii-semicolon.csv')), 10);
    expect(all.rows).toHaveLength(2);
    expect(all.more).toBe(false);
  });
});
