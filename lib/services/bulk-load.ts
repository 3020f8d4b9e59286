import { Readable } from 'node:stream';
import { pool } from '@/db/client';

const NEEDS_ESCAPE = /[\\\t\n\r]/;

/** A TSV cell for LOAD DATA: `\N` is NULL; backslash, tab and newline are escaped. */
export function tsvCell(v: string | number | null | undefined): string {
  if (v === null || v === undefined) return '\\N';
  if (typeof v === 'number') return Number.isFinite(v) ? String(v) : '\\N';
  if (!NEEDS_ESCAPE.test(v)) return v;
  return v.replace(/[\\\t\n\r]/g, (m) =>
    m === '\\' ? '\\\\' : m === '\t' ? '\\t' : m === '\n' ? '\\n' : '\\r',
  );
}

/**
 * Stores rows with LOAD DATA LOCAL INFILE fed from an in-process stream (no file on disk): several times faster than multi-row
 * INSERT statements for millions of rows. `lines` are already TSV (see {@link tsvCell}): one
 * string per row, or the whole text with a newline after each row.
 * `table` and `columns` are our own identifiers, never user input.
 */
export async function loadTsv(table: string, columns: string, lines: string[] | string) {
  if (!lines.length) return;
  const body = Buffer.from(typeof lines === 'string' ? lines : lines.join('\n') + '\n');
  await pool().query({
    sql: `LOAD DATA LOCAL INFILE 'rows.tsv' INTO TABLE ${table} CHARACTER SET utf8mb4 (${columns})`,
    infileStreamFactory: () => Readable.from([body]),
  });
}
