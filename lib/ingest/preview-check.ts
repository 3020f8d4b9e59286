import { IngestFileError } from './errors';
import type { Mapping } from './mapping';
import { makeCellChecker, type NormaliseOptions } from './normalise';
import type { TableHeader } from './types';

/** A previewed cell that would fail normalisation: row index in the preview, column index (-1: the row), reason. */
export interface BadCell {
  rowIndex: number;
  column: number;
  reason: string;
}

/**
 * The preview's bad cells under a mapping: every cell of the shown rows that the ingest would
 * reject, with its reason, or the file-level problem that stops the mapping from applying
 * (a column the file lacks, a one-column header).
 */
export function previewBadCells(
  header: TableHeader,
  mapping: Mapping,
  rows: string[][],
  options: NormaliseOptions = {},
): { cells: BadCell[] } | { problem: string } {
  let check: ReturnType<typeof makeCellChecker>;
  try {
    check = makeCellChecker(header, mapping, options);
  } catch (e) {
    if (e instanceof IngestFileError) return { problem: e.message };
    throw e;
  }
  const cells: BadCell[] = [];
  rows.forEach((values, rowIndex) => {
    for (const p of check(values)) cells.push({ rowIndex, column: p.column, reason: p.reason });
  });
  return { cells };
}
