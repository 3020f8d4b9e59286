/**
 * Streaming file output: writes text chunks from a (sync or async) iterable to a file with
 * back-pressure, so that catalogs of millions of rows never sit in memory as one string.
 */
import { createWriteStream } from 'node:fs';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';

/** Rows joined per chunk handed to the file stream. */
const ROWS_PER_CHUNK = 4096;

/** Writes every chunk of `chunks` to `path` (UTF-8, replacing the file); resolves with the bytes written. */
export async function writeChunks(
  path: string,
  chunks: Iterable<string> | AsyncIterable<string>,
): Promise<number> {
  const out = createWriteStream(path, { encoding: 'utf8' });
  await pipeline(Readable.from(chunks), out);
  return out.bytesWritten;
}

/** Groups `count` lines made by line(i) into newline-terminated chunks, after the given head lines. */
export function* lineChunks(
  head: readonly string[],
  count: number,
  line: (i: number) => string,
): Generator<string> {
  if (head.length > 0) yield head.join('\n') + '\n';
  for (let start = 0; start < count; start += ROWS_PER_CHUNK) {
    const end = Math.min(count, start + ROWS_PER_CHUNK);
    const lines = new Array<string>(end - start);
    for (let i = start; i < end; i++) lines[i - start] = line(i);
    yield lines.join('\n') + '\n';
  }
}

/** Joins the pieces of an async text source into chunks of about ROWS_PER_CHUNK pieces each. */
export async function* batchChunks(source: AsyncIterable<string>): AsyncGenerator<string> {
  let parts: string[] = [];
  for await (const piece of source) {
    parts.push(piece);
    if (parts.length >= ROWS_PER_CHUNK) {
      yield parts.join('');
      parts = [];
    }
  }
  if (parts.length > 0) yield parts.join('');
}
