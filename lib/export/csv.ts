import { textToByteStream } from './stream';

/** Characters that make a spreadsheet read a cell as a formula (OWASP CSV injection). */
const FORMULA_START = /^[=+\-@\t\r]/;
/** A plain decimal number, e.g. `-12.5`, `+3`, `1.2e-5`: exported as is, never quoted. */
const PLAIN_NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/**
 * One CSV cell (RFC 4180). null/undefined and non-finite numbers become empty cells; numbers
 * are written with full precision; booleans as `true`/`false`. Strings that a spreadsheet
 * would run as a formula (starting with `=`, `+`, `-`, `@`, tab or CR) get a leading `'`,
 * except strings that are plain numbers such as `-12.5`: those stay numbers, because a
 * negative velocity or latitude is data, not a formula, and a spreadsheet cannot execute a
 * bare number. Cells holding the delimiter, a quote or a line break are quoted.
 */
export function csvCell(value: unknown): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  if (typeof value === 'bigint' || typeof value === 'boolean') return String(value);
  let s = value instanceof Date ? value.toISOString() : String(value);
  if (FORMULA_START.test(s) && !PLAIN_NUMBER.test(s)) s = `'${s}`;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** One CSV record, comma-separated, ending in CRLF (RFC 4180). */
export function csvLine(values: readonly unknown[]): string {
  let out = '';
  for (let i = 0; i < values.length; i++) {
    if (i > 0) out += ',';
    out += csvCell(values[i]);
  }
  return `${out}\r\n`;
}

/** The lines of a CSV file: the header, then one line per row, pulled lazily. */
export async function* csvLines(
  header: readonly string[],
  rows: AsyncIterable<readonly unknown[]> | Iterable<readonly unknown[]>,
): AsyncGenerator<string> {
  yield csvLine(header);
  for await (const row of rows) yield csvLine(row);
}

/**
 * A streamed CSV file as UTF-8 bytes for a route handler
 * (`new Response(csvStream(header, rows), { headers: { 'content-type': 'text/csv' } })`).
 */
export function csvStream(
  header: readonly string[],
  rows: AsyncIterable<readonly unknown[]> | Iterable<readonly unknown[]>,
): ReadableStream<Uint8Array> {
  return textToByteStream(csvLines(header, rows));
}
