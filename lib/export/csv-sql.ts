/**
 * SQL expressions that make MariaDB write CSV cells exactly as {@link csvCell} does in
 * JavaScript, so large exports can be assembled by the database (one string per chunk of rows)
 * instead of one JavaScript object per cell. `tests/integration/csv-sql.test.ts` checks every
 * kind against `csvCell` on the real server.
 */

import { checkDecimals } from './decimals';

/**
 * How a column's values become CSV text. `raw`: our own identifiers and integers, never user
 * text; `number`: integers as stored, doubles rounded to the column's decimals.
 */
export type CsvSqlKind = 'raw' | 'number' | 'text' | 'boolean' | 'time';

/** A MariaDB string literal holding `text` (backslash and quote escaped; other characters as is). */
export function sqlLiteral(text: string): string {
  return `'${text.replace(/\\/g, '\\\\').replace(/'/g, "\\'")}'`;
}

// The same rules as csvCell: a cell starting like a formula gets a leading `'` unless it is a
// plain number; a cell holding a quote, comma or line break is quoted. `\z` (not `$`) so that a
// trailing newline does not pass as a number, as in JavaScript.
const RISKY = sqlLiteral('^[-=+@\t\r]|[",\r\n]');
const FORMULA_START = sqlLiteral('^[-=+@\t\r]');
const PLAIN_NUMBER = sqlLiteral('^[+-]?([0-9]+[.]?[0-9]*|[.][0-9]+)([eE][+-]?[0-9]+)?\\z');
const NEEDS_QUOTES = sqlLiteral('[",\r\n]');

function textCell(x: string): string {
  const escaped = `IF(${x} REGEXP ${FORMULA_START} AND NOT ${x} REGEXP ${PLAIN_NUMBER}, CONCAT('''', ${x}), ${x})`;
  const quoted = `IF(${x} REGEXP ${NEEDS_QUOTES}, CONCAT('"', REPLACE(${escaped}, '"', '""'), '"'), ${escaped})`;
  // Most cells are plain: one pattern test decides, the slow path runs only for the rest.
  return `CASE WHEN ${x} IS NULL THEN '' WHEN ${x} REGEXP ${RISKY} THEN ${quoted} ELSE ${x} END`;
}

/**
 * The cell of a DOUBLE rounded to `decimals` places as {@link formatDecimals} writes it: the cast
 * rounds half away from zero the shortest decimal of the double; trailing zeros and then a bare
 * point are cut (decimals ≥ 1, so a point is always there to stop the cut); zero is never `-0`.
 */
function decimalsSql(x: string, decimals: number): string {
  checkDecimals(decimals, 'csvCellSql');
  return `IFNULL(TRIM(TRAILING '.' FROM TRIM(TRAILING '0' FROM CAST(${x} AS DECIMAL(65, ${decimals})))), '')`;
}

/**
 * The CSV cell of SQL expression `x` (NULL → empty cell); a `number` with `decimals` is rounded
 * to that many places.
 */
export function csvCellSql(x: string, kind: CsvSqlKind, decimals?: number): string {
  switch (kind) {
    case 'number':
      if (decimals !== undefined) return decimalsSql(x, decimals);
      return `IFNULL(${x}, '')`;
    case 'raw':
      // Integers and our own identifiers: written as stored.
      return `IFNULL(${x}, '')`;
    case 'boolean':
      return `IF(${x} IS NULL, '', IF(${x}, 'true', 'false'))`;
    case 'time':
      // ISO 8601 in UTC with milliseconds, as Date#toISOString (DATETIME values are stored in UTC).
      return `IFNULL(CONCAT(DATE_FORMAT(${x}, '%Y-%m-%dT%H:%i:%s.'), LPAD(MICROSECOND(${x}) DIV 1000, 3, '0'), 'Z'), '')`;
    case 'text':
      return textCell(x);
  }
}

/** One CSV record (RFC 4180, CRLF) of the given cells. */
export function csvLineSql(cells: { sql: string; kind: CsvSqlKind; decimals?: number }[]): string {
  return `CONCAT(CONCAT_WS(',', ${cells.map((c) => csvCellSql(c.sql, c.kind, c.decimals)).join(', ')}), '\\r\\n')`;
}
