import { Readable } from 'node:stream';
import { createReadStream } from 'node:fs';
import { openDelimited } from './delimited';
import { IngestFileError } from './errors';
import { TextSource } from './textSource';
import { openVotable } from './votable';
import type { OpenedTable, OpenTableOptions, TableFormat } from './types';

/**
 * Decides the format from the start of the text: XML (`<?xml` or a `<VOTABLE` element near
 * the start) is a VOTable, anything else delimited text.
 */
export function detectFormat(head: string): TableFormat {
  const start = head.trimStart();
  if (start.startsWith('<?xml') || /^<(?:\w+:)?VOTABLE[\s>]/.test(start)) return 'votable';
  if (start.startsWith('<') && /<(?:\w+:)?VOTABLE[\s>]/.test(head.slice(0, 8192))) return 'votable';
  return 'delimited';
}

/**
 * Opens an uploaded table from a Node stream of its bytes: rejects empty and binary files,
 * detects VOTable vs delimited text (and the delimiter), and returns the header plus a
 * one-pass async iterator of row batches (default 5 000 rows) with file line numbers. Memory
 * stays flat: one text chunk and one batch at a time. Throws {@link IngestFileError}.
 */
export async function openTable(
  stream: Readable,
  options: OpenTableOptions = {},
): Promise<OpenedTable> {
  const source = new TextSource(stream);
  try {
    const head = await source.peek(1024);
    if (head.trim().length === 0) {
      throw new IngestFileError(
        'empty-file',
        head.length === 0 ? 'the file is empty (0 bytes)' : 'the file holds only blank space',
      );
    }
    const format = options.format ?? detectFormat(head);
    return format === 'votable'
      ? await openVotable(source, options)
      : await openDelimited(source, options);
  } catch (e) {
    await source.close();
    throw e;
  }
}

/** A Node stream over a file path or an in-memory Buffer. */
export function streamOf(input: string | Buffer): Readable {
  return typeof input === 'string' ? createReadStream(input) : Readable.from([input]);
}
