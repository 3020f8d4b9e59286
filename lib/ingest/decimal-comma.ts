import { isDecimalCommaCell, isMissingCell } from './cells';
import type { TableHeader } from './types';

/** Share of a column's filled cells that must look like `30,1` for it to count as decimal-comma. */
const MOST = 0.8;

/**
 * Columns of a preview whose filled cells are mostly numbers written with a decimal comma
 * (`-?digits,digits`). A comma-separated file cannot hold such cells unquoted, so only other
 * delimiters (and VOTables) are checked, and a column needs at least one such cell.
 */
export function decimalCommaColumns(header: TableHeader, rows: string[][]): string[] {
  if (header.delimiter === ',') return [];
  const found: string[] = [];
  header.columns.forEach((c, i) => {
    let filled = 0;
    let comma = 0;
    for (const r of rows) {
      const text = r[i];
      if (text === undefined || isMissingCell(text)) continue;
      filled++;
      if (isDecimalCommaCell(text)) comma++;
    }
    if (comma > 0 && comma >= MOST * filled) found.push(c.name);
  });
  return found;
}

/** The cells as they read with decimal commas: `30,1` becomes `30.1`, everything else stays. */
export function withDecimalPoints(rows: string[][]): string[][] {
  return rows.map((r) => r.map((v) => (isDecimalCommaCell(v) ? v.replace(',', '.') : v)));
}
