import { openTable, streamOf } from './table';
import type { Delimiter, OpenTableOptions, TableFormat, TableHeader } from './types';

/** One previewed data row: 1-based data-row number, file line and raw cells. */
export interface PreviewRow {
  row: number;
  line: number;
  values: string[];
}

/** What the mapping screen shows: format, delimiter, header and the first rows. */
export interface FilePreview {
  format: TableFormat;
  delimiter: Delimiter | null;
  header: TableHeader;
  rows: PreviewRow[];
  /** True when the file has more data rows than were returned. */
  more: boolean;
}

/**
 * Reads the first `n` data rows of a file (a path or a Buffer) with the detected format,
 * delimiter and header, then stops reading. File-level problems throw {@link IngestFileError}
 * exactly as a full ingest would (a header-only file included).
 */
export async function previewFile(
  input: string | Buffer,
  n = 20,
  options: Omit<OpenTableOptions, 'batchSize'> = {},
): Promise<FilePreview> {
  const table = await openTable(streamOf(input), { ...options, batchSize: Math.max(1, n) });
  const rows: PreviewRow[] = [];
  let more = false;
  for await (const batch of table.batches) {
    for (let i = 0; i < batch.values.length; i++) {
      if (rows.length === n) {
        more = true;
        break;
      }
      rows.push({ row: batch.firstRow + i, line: batch.lines[i], values: batch.values[i] });
    }
    if (more) break;
    if (rows.length === n) {
      more = await hasMore(table.batches);
      break;
    }
  }
  return {
    format: table.header.format,
    delimiter: table.header.delimiter,
    header: table.header,
    rows,
    more,
  };
}

async function hasMore(batches: AsyncIterable<unknown>): Promise<boolean> {
  const it = batches[Symbol.asyncIterator]();
  try {
    const r = await it.next();
    return !r.done;
  } finally {
    await it.return?.();
  }
}
