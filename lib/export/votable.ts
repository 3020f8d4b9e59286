import { formatDecimals } from './decimals';
import { textToByteStream } from './stream';

/** VOTable primitive datatypes Lanewise writes (`unicodeChar` for text that may not be ASCII). */
export type VotableDatatype =
  'double' | 'float' | 'int' | 'long' | 'char' | 'unicodeChar' | 'boolean';

/**
 * A column of the written table (IVOA VOTable 1.4 FIELD). Text columns default to
 * `arraysize="*"`. `precision` is the number of decimal places (the VOTable 1.4 `precision` attribute, "F" form)
 * each value of a floating-point column is written to (see lib/export/decimals.ts).
 */
export interface VotableField {
  name: string;
  datatype: VotableDatatype;
  /** An XML ID, for readers that key fields by ID; must be an NCName. */
  id?: string;
  unit?: string;
  ucd?: string;
  arraysize?: string;
  precision?: number;
  xtype?: string;
  description?: string;
}

/** A constant of the table (PARAM), e.g. the match radius used. */
export interface VotableParam extends VotableField {
  value: string | number | boolean;
}

export interface VotableOptions {
  resourceName: string;
  tableName: string;
  description?: string;
  fields: VotableField[];
  params?: VotableParam[];
  rows: AsyncIterable<readonly unknown[]> | Iterable<readonly unknown[]>;
}

const XML_ESCAPES: Record<string, string> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&quot;',
  "'": '&apos;',
};

/**
 * Escapes text for XML content and attributes; drops characters XML 1.0 forbids (C0 controls
 * other than tab, LF, CR, and lone surrogates) since no escape can carry them.
 */
export function xmlEscape(text: string): string {
  return text
    .replace(
      /[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g,
      '',
    )
    .replace(/[&<>"']/g, (c) => XML_ESCAPES[c]);
}

function cellText(value: unknown, field: VotableField): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) return '';
    if (field.datatype === 'int' || field.datatype === 'long') return String(Math.trunc(value));
    return field.precision === undefined ? String(value) : formatDecimals(value, field.precision);
  }
  if (typeof value === 'boolean') return value ? 'T' : 'F';
  return xmlEscape(String(value));
}

const isText = (d: VotableDatatype) => d === 'char' || d === 'unicodeChar';

function attrs(f: VotableField): string {
  let s = f.id ? ` ID="${xmlEscape(f.id)}"` : '';
  s += ` name="${xmlEscape(f.name)}" datatype="${f.datatype}"`;
  const arraysize = f.arraysize ?? (isText(f.datatype) ? '*' : undefined);
  if (arraysize !== undefined) s += ` arraysize="${xmlEscape(arraysize)}"`;
  if (f.precision !== undefined) s += ` precision="${f.precision}"`;
  if (f.unit) s += ` unit="${xmlEscape(f.unit)}"`;
  if (f.ucd) s += ` ucd="${xmlEscape(f.ucd)}"`;
  if (f.xtype) s += ` xtype="${xmlEscape(f.xtype)}"`;
  return s;
}

function describe(description: string | undefined, indent: string): string {
  return description ? `${indent}<DESCRIPTION>${xmlEscape(description)}</DESCRIPTION>\n` : '';
}

/**
 * Writes a VOTable 1.4 document with one RESOURCE and one TABLE in TABLEDATA serialisation,
 * as text pieces pulled lazily (rows in pieces of about 64 kB), so exports of millions of rows
 * stream. Cells: null, undefined and NaN/±Infinity become empty `<TD></TD>`; booleans `T`/`F`;
 * numbers of a field with `precision` to that many decimals; text is XML-escaped.
 */
export async function* votableStream(options: VotableOptions): AsyncGenerator<string> {
  const { fields } = options;
  let head =
    '<?xml version="1.0" encoding="UTF-8"?>\n' +
    '<VOTABLE version="1.4" xmlns="http://www.ivoa.net/xml/VOTable/v1.3"' +
    ' xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance"' +
    ' xsi:schemaLocation="http://www.ivoa.net/xml/VOTable/v1.3 http://www.ivoa.net/xml/VOTable/v1.4">\n' +
    `  <RESOURCE name="${xmlEscape(options.resourceName)}">\n` +
    `    <TABLE name="${xmlEscape(options.tableName)}">\n` +
    describe(options.description, '      ');
  for (const p of options.params ?? []) {
    const value = typeof p.value === 'boolean' ? (p.value ? 'T' : 'F') : xmlEscape(String(p.value));
    head += `      <PARAM${attrs(p)} value="${value}"`;
    head += p.description ? `>\n${describe(p.description, '        ')}      </PARAM>\n` : '/>\n';
  }
  for (const f of fields) {
    head += `      <FIELD${attrs(f)}`;
    head += f.description ? `>\n${describe(f.description, '        ')}      </FIELD>\n` : '/>\n';
  }
  yield `${head}      <DATA>\n        <TABLEDATA>\n`;
  // Rows are gathered into pieces of about 64 kB: one piece per row costs more than the rows.
  let piece = '';
  for await (const row of options.rows) {
    if (row.length !== fields.length) {
      throw new RangeError(
        `VOTable row has ${row.length} cells but the table has ${fields.length} fields`,
      );
    }
    piece += '          <TR>';
    for (let i = 0; i < row.length; i++) piece += `<TD>${cellText(row[i], fields[i])}</TD>`;
    piece += '</TR>\n';
    if (piece.length > 65_536) {
      yield piece;
      piece = '';
    }
  }
  if (piece) yield piece;
  yield '        </TABLEDATA>\n      </DATA>\n    </TABLE>\n  </RESOURCE>\n</VOTABLE>\n';
}

/** {@link votableStream} as UTF-8 bytes for a route handler's `Response`. */
export function votableByteStream(options: VotableOptions): ReadableStream<Uint8Array> {
  return textToByteStream(votableStream(options));
}
