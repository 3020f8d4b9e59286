import { describe, expect, it } from 'vitest';
import { IngestFileError } from '@/lib/ingest/errors';
import { MAX_ROW_CHARS } from '@/lib/ingest/delimited';
import { readAll } from './helpers';

async function fileError(p: Promise<unknown>): Promise<IngestFileError> {
  const e = await p.then(
    () => null,
    (err: unknown) => err,
  );
  expect(e).toBeInstanceOf(IngestFileError);
  return e as IngestFileError;
}

/** A small valid CSV of `n` rows; row k sits on file line k + 1. */
function csv(n: number): string {
  const lines = ['glon,glat,vlsr,name'];
  for (let i = 0; i < n; i++) lines.push(`${(i * 3.7) % 360},${(i % 7) - 3},${i - 50},S${i}`);
  return lines.join('\n') + '\n';
}

describe('hostile files', () => {
  it('a NUL byte after the first KB rejects the file, naming its line and byte', async () => {
    const text = csv(200).replace('S150\n', 'X\0Y\n');
    const byte = Buffer.from(text).indexOf(0) + 1; // exact: position in the bytes
    expect(byte).toBeGreaterThan(1024);
    // In one chunk and split into many small ones: the same line and byte.
    for (const chunkBytes of [undefined, 97]) {
      const e = await fileError(readAll(text, { chunkBytes }));
      expect(e.code).toBe('binary-file');
      expect(e.details).toEqual({ line: 152, byte }); // row 150 + header line + 1 (0-based i)
      expect(e.message).toMatch(/^line 152 \(byte \d+\): binary data/);
    }
  });

  it(
    'a single line longer than the row bound is a long line, not an unclosed quote',
    { timeout: 20_000 },
    async () => {
      const line = Array.from({ length: 300_000 }, (_, i) => i % 360).join(',');
      expect(line.length).toBeGreaterThan(MAX_ROW_CHARS);
      const e = await fileError(readAll(line, { chunkBytes: 65_536 }));
      expect(e.code).toBe('line-too-long');
      expect(e.message).toBe(
        'line 1 is longer than 1 MB; is this a delimited text file with line breaks?',
      );
      // Whitespace-separated text is bounded the same way.
      const spaced = await fileError(
        readAll(line.replace(/,/g, ' '), { chunkBytes: 65_536, delimiter: 'whitespace' }),
      );
      expect(spaced.code).toBe('line-too-long');
    },
  );

  it('a long line after good rows names its own line', async () => {
    const text = csv(5) + 'x'.repeat(MAX_ROW_CHARS + 10);
    const e = await fileError(readAll(text, { chunkBytes: 65_536 }));
    expect(e.code).toBe('line-too-long');
    expect(e.details).toEqual({ line: 7 }); // header + 5 rows
  });

  it('an unclosed quote over many lines is still reported as one', async () => {
    const body = Array.from({ length: 80_000 }, (_, i) => `${i},1,2,x`).join('\n');
    const text = `glon,glat,vlsr,name\n1,2,3,"open\n${body}\n`;
    const e = await fileError(readAll(text, { chunkBytes: 65_536 }));
    expect(e.code).toBe('unclosed-quote');
  });

  it('rows up to the bound are read whole (a 70 000-character cell is kept intact)', async () => {
    const long = 'N'.repeat(70_000);
    const { rows } = await readAll(csv(2) + `1,0,5,${long}\n`, { chunkBytes: 4096 });
    expect(rows).toHaveLength(3);
    expect(rows[2].values[3]).toBe(long);
  });
});
