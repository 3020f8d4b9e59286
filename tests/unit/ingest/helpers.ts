import { Readable } from 'node:stream';
import { openTable } from '@/lib/ingest/table';
import type { OpenTableOptions, TableHeader } from '@/lib/ingest/types';

export interface ReadRow {
  row: number;
  line: number;
  values: string[];
}

/** Reads a whole table from text or bytes, optionally split into small chunks to exercise chunk boundaries. */
export async function readAll(
  content: string | Buffer,
  options: OpenTableOptions & { chunkBytes?: number } = {},
): Promise<{ header: TableHeader; rows: ReadRow[] }> {
  const bytes = typeof content === 'string' ? Buffer.from(content, 'utf8') : content;
  const size = options.chunkBytes ?? bytes.length;
  const chunks: Buffer[] = [];
  for (let i = 0; i < bytes.length; i += size) chunks.push(bytes.subarray(i, i + size));
  const table = await openTable(Readable.from(chunks), options);
  const rows: ReadRow[] = [];
  for await (const b of table.batches) {
    b.values.forEach((values, i) => rows.push({ row: b.firstRow + i, line: b.lines[i], values }));
  }
  return { header: table.header, rows };
}
