import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { IngestFileError } from '@/lib/ingest/errors';
import { mappingSchema } from '@/lib/ingest/mapping';
import { makeRowNormaliser } from '@/lib/ingest/normalise';
import { mappingFromSuggestion, suggestMapping } from '@/lib/ingest/suggest';
import { readAll } from './helpers';

const fixture = (name: string): string => path.join(__dirname, '../../fixtures/ingest', name);

async function fileError(p: Promise<unknown>): Promise<IngestFileError> {
  const e = await p.then(
    () => null,
    (err: unknown) => err,
  );
  expect(e).toBeInstanceOf(IngestFileError);
  return e as IngestFileError;
}

function syncError(f: () => unknown): IngestFileError {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(IngestFileError);
    return e as IngestFileError;
  }
  throw new Error('expected an IngestFileError');
}

describe('file-level errors', () => {
  it('empty file', async () => {
    const e = await fileError(readAll(''));
    expect(e.code).toBe('empty-file');
    expect(e.message).toBe('the file is empty (0 bytes)');
    const blank = await fileError(readAll('\n  \n'));
    expect(blank.code).toBe('empty-file');
    const comments = await fileError(readAll('# only a note\n# another\n'));
    expect(comments.code).toBe('empty-file');
    expect(comments.message).toMatch(/only comment lines/);
  });

  it('header only', async () => {
    const e = await fileError(readAll('# note\nGLON,GLAT,VLSR\n'));
    expect(e.code).toBe('no-data-rows');
    expect(e.message).toBe('the file has a header (line 2) but no data rows');
  });

  it('binary garbage: NUL bytes and invalid UTF-8 in the first KB', async () => {
    const nul = await fileError(readAll(Buffer.from([0x6c, 0x2c, 0x62, 0x0a, 0x00, 0x01])));
    expect(nul.code).toBe('binary-file');
    expect(nul.message).toMatch(/^byte 5: .*NUL bytes/);
    const bad = await fileError(readAll(Buffer.from([0x6c, 0x2c, 0xff, 0xfe, 0xc3, 0x28, 0x0a])));
    expect(bad.code).toBe('binary-file');
    expect(bad.message).toMatch(/not valid UTF-8/);
  });

  it('invalid UTF-8 after the first KB names the line', async () => {
    const head = 'l,b\n' + Array.from({ length: 300 }, () => '1.0,2.0').join('\n') + '\n';
    const bytes = Buffer.concat([Buffer.from(head), Buffer.from([0x31, 0xe9, 0x2c, 0x32, 0x0a])]);
    const e = await fileError(readAll(bytes));
    expect(e.code).toBe('invalid-encoding');
    expect(e.message).toMatch(/^line 302: the file is not valid UTF-8/);
  });

  it('wrong delimiter: one column detected while the mapping needs more', async () => {
    const { header } = await readAll('l|b|v\n1|2|3\n');
    expect(header.columns).toHaveLength(1);
    const mapping = mappingSchema.parse({
      position: {
        system: 'galactic',
        lon: { column: 'l', unit: 'deg' },
        lat: { column: 'b', unit: 'deg' },
      },
    });
    const e = syncError(() => makeRowNormaliser(header, mapping));
    expect(e.code).toBe('wrong-delimiter');
    expect(e.message).toBe(
      'only one column was found in the header on line 1 (`l|b|v`) but the mapping needs 2; the file is probably separated by a different delimiter than comma',
    );
    const s = suggestMapping(header, []);
    expect(syncError(() => mappingFromSuggestion(s, header)).code).toBe('wrong-delimiter');
  });

  it('no position columns', async () => {
    const { header, rows } = await readAll('name,flux,snr\nA,1.2,text\n');
    const s = suggestMapping(
      header,
      rows.map((r) => r.values),
    );
    const e = syncError(() => mappingFromSuggestion(s, header));
    expect(e.code).toBe('no-position-columns');
    expect(e.message).toBe(
      'no position columns found among `name`, `flux`, `snr`; map Galactic l/b or RA/Dec by hand',
    );
  });

  it('duplicate header names', async () => {
    const e = await fileError(readAll('GLON,GLAT,V,V\n1,2,3,4\n'));
    expect(e.code).toBe('duplicate-column');
    expect(e.message).toBe(
      'line 1: column name `V` appears twice (columns 3 and 4); rename one of them',
    );
  });

  it('truncated VOTable names the line and the unclosed element', async () => {
    const e = await fileError(readAll(await readFile(fixture('truncated.vot'))));
    expect(e.code).toBe('truncated-votable');
    expect(e.message).toBe(
      'line 16: the VOTable ends before <TABLEDATA> (opened on line 14) is closed; the file looks truncated',
    );
  });

  it('malformed XML and BINARY serialisation are errors with their line', async () => {
    const broken =
      '<?xml version="1.0"?>\n<VOTABLE>\n<RESOURCE><TABLE>\n<FIELD name="a"></TABLE>\n';
    const e = await fileError(readAll(broken));
    expect(e.code).toBe('malformed-xml');
    expect(e.message).toMatch(/^line 4, column \d+: the VOTable is not well-formed XML/);
    const binary =
      '<VOTABLE version="1.4"><RESOURCE><TABLE><FIELD name="a" datatype="int"/>\n<DATA><BINARY2><STREAM encoding="base64">AAAA</STREAM></BINARY2></DATA></TABLE></RESOURCE></VOTABLE>';
    const b = await fileError(readAll(binary));
    expect(b.code).toBe('unsupported-votable');
    expect(b.message).toMatch(/^line 2: the table data are serialised as BINARY2/);
  });

  it('a quote never closed names the line where it opens', async () => {
    const e = await fileError(readAll('l,b,name\n1,2,"ok"\n3,4,"open\n5,6,x\n'));
    expect(e.code).toBe('unclosed-quote');
    expect(e.message).toMatch(/^line 3: a quoted field/);
  });

  it('unknown units name the column and the unit', async () => {
    const header = {
      format: 'delimited' as const,
      delimiter: ',' as const,
      headerLine: 1,
      columns: [{ name: 'GLON' }, { name: 'GLAT' }, { name: 'V [furlong/fortnight]' }],
    };
    const s = suggestMapping(header, [['10', '0', '5']]);
    expect(s.mapping).toBeNull();
    const e = syncError(() => mappingFromSuggestion(s, header));
    expect(e.code).toBe('unknown-unit');
    expect(e.message).toBe(
      'column `V [furlong/fortnight]` has unit `furlong/fortnight`, which Lanewise cannot read as a velocity',
    );
    expect(e.details).toEqual({ column: 'V [furlong/fortnight]', unit: 'furlong/fortnight' });
  });

  it('a mapping naming a missing column says which', async () => {
    const { header } = await readAll('l,b\n1,2\n');
    const mapping = mappingSchema.parse({
      position: {
        system: 'galactic',
        lon: { column: 'l', unit: 'deg' },
        lat: { column: 'glat', unit: 'deg' },
      },
    });
    const e = syncError(() => makeRowNormaliser(header, mapping));
    expect(e.code).toBe('unknown-column');
    expect(e.message).toBe(
      'the mapping uses column `glat`, which the file does not have (columns: `l`, `b`)',
    );
  });
});
