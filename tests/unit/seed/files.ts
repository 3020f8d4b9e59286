/**
 * Readers for the demo files as a user would receive them: delimited text with an optional `#`
 * comment header, and the OB VOTable (checked for well-formed XML with saxes). Tests use them to
 * compare what was written against the truth.
 */
import { readFile } from 'node:fs/promises';
import { SaxesParser } from 'saxes';

/** A delimited table: header names and rows of cells. */
export type TextTable = { header: string[]; rows: string[][]; comments: string[] };

/** Reads a delimited text file, collecting leading `#` lines as comments. */
export async function readDelimited(path: string, delimiter: string): Promise<TextTable> {
  const lines = (await readFile(path, 'utf8')).split('\n');
  if (lines[lines.length - 1] === '') lines.pop();
  const comments: string[] = [];
  let k = 0;
  while (k < lines.length && lines[k].startsWith('#')) comments.push(lines[k++]);
  const header = lines[k++].split(delimiter);
  const rows = lines.slice(k).map((line) => line.split(delimiter));
  return { header, rows, comments };
}

/** Column of a table as text, by header name; throws when the column is missing. */
export function column(table: TextTable, name: string): string[] {
  const j = table.header.indexOf(name);
  if (j < 0) throw new Error(`no column ${name} in [${table.header.join(', ')}]`);
  return table.rows.map((r) => r[j]);
}

/** Column as numbers (empty cells become NaN). */
export function numbers(table: TextTable, name: string): number[] {
  return column(table, name).map((s) => (s === '' ? NaN : Number(s)));
}

/** A parsed VOTable: its version, FIELD attributes and TABLEDATA cells. */
export type VoTable = {
  version: string;
  fields: Record<string, string>[];
  rows: string[][];
};

/** Parses a VOTable with saxes (throws on malformed XML) and returns fields and cells. */
export async function readVotable(path: string): Promise<VoTable> {
  const xml = await readFile(path, 'utf8');
  const parser = new SaxesParser({ xmlns: true });
  const out: VoTable = { version: '', fields: [], rows: [] };
  let row: string[] | null = null;
  let cell: string | null = null;
  parser.on('opentag', (tag) => {
    const attrs: Record<string, string> = {};
    for (const [k, v] of Object.entries(tag.attributes))
      attrs[k] = typeof v === 'string' ? v : v.value;
    if (tag.local === 'VOTABLE') out.version = attrs.version;
    if (tag.local === 'FIELD') out.fields.push(attrs);
    if (tag.local === 'TR') row = [];
    if (tag.local === 'TD') cell = '';
  });
  parser.on('text', (text) => {
    if (cell !== null) cell += text;
  });
  parser.on('closetag', (tag) => {
    if (tag.local === 'TD' && row && cell !== null) {
      row.push(cell);
      cell = null;
    }
    if (tag.local === 'TR' && row) {
      out.rows.push(row);
      row = null;
    }
  });
  parser.write(xml).close();
  return out;
}

/** Column of a VOTable as text, by FIELD name. */
export function votColumn(table: VoTable, name: string): string[] {
  const j = table.fields.findIndex((f) => f.name === name);
  if (j < 0) throw new Error(`no FIELD ${name}`);
  return table.rows.map((r) => r[j]);
}
