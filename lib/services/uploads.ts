import Busboy from 'busboy';
import fs from 'node:fs';
import path from 'node:path';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { ReadableStream as WebReadableStream } from 'node:stream/web';
import { newId } from '@/lib/auth/secrets';
import { env } from '@/lib/env';
import { HttpError } from '@/lib/http/errors';
import { mappingAssumptions } from '@/lib/ingest/assumptions';
import { decimalCommaColumns, withDecimalPoints } from '@/lib/ingest/decimal-comma';
import { IngestFileError } from '@/lib/ingest/errors';
import { mappingSchema, type Mapping } from '@/lib/ingest/mapping';
import { makeBatchNormaliser } from '@/lib/ingest/normalise';
import { previewFile, type FilePreview } from '@/lib/ingest/preview';
import { mappingFromSuggestion, suggestMapping } from '@/lib/ingest/suggest';
import { previewFieldsSchema, uploadFieldsSchema } from '@/lib/schemas/catalogs';

export type ReceivedUpload = {
  fields: Record<string, string>;
  file: { path: string; fileName: string; bytes: number } | null;
};

const tooLarge = (limitBytes: number) =>
  new HttpError(
    413,
    'file_too_large',
    `The file is larger than the upload limit of ${Math.round(limitBytes / 1024 / 1024)} MB.`,
  );

/** Where a project's uploads live; each upload gets a folder of its own. */
export function uploadDir(id: string) {
  return path.resolve(/* turbopackIgnore: true */ env().LANEWISE_DATA_DIR, 'uploads', id);
}

/**
 * Streams a multipart request to disk without holding the file in memory: the one `file`
 * part goes to `dir`, the other parts come back as text fields. Past `limitBytes` the partial
 * file is removed and the request fails with 413.
 */
export async function receiveUpload(
  req: Request,
  dir: string,
  limitBytes = env().UPLOAD_LIMIT_MB * 1024 * 1024,
): Promise<ReceivedUpload> {
  const type = req.headers.get('content-type') ?? '';
  if (!type.startsWith('multipart/form-data')) {
    throw new HttpError(
      400,
      'not_multipart',
      'Send the file as multipart/form-data with a part named "file".',
    );
  }
  const declared = Number(req.headers.get('content-length') ?? 0);
  if (declared > limitBytes + 1024 * 1024) throw tooLarge(limitBytes);
  if (!req.body) throw new HttpError(400, 'empty_body', 'The request has no body.');
  fs.mkdirSync(dir, { recursive: true });

  const fields: Record<string, string> = {};
  let file: ReceivedUpload['file'] = null;
  const writes: Promise<void>[] = [];
  const bb = Busboy({
    headers: { 'content-type': type },
    limits: { fileSize: limitBytes, files: 1, fields: 20, fieldSize: 1024 * 1024 },
  });
  let overLimit = false;
  bb.on('field', (name, value) => {
    fields[name] = value;
  });
  bb.on('file', (name, stream, info) => {
    if (name !== 'file') {
      stream.resume();
      return;
    }
    const safeName =
      path
        .basename(info.filename || 'upload')
        .replace(/[^\w.\-]+/g, '_')
        .slice(0, 200) || 'upload';
    const target = path.join(/* turbopackIgnore: true */ dir, safeName);
    const record = { path: target, fileName: info.filename || safeName, bytes: 0 };
    file = record;
    stream.on('data', (d: Buffer) => {
      record.bytes += d.length;
    });
    stream.on('limit', () => {
      overLimit = true;
    });
    writes.push(pipeline(stream, fs.createWriteStream(target)));
  });
  try {
    await pipeline(Readable.fromWeb(req.body as unknown as WebReadableStream<Uint8Array>), bb);
    await Promise.all(writes);
  } catch (e) {
    fs.rmSync(dir, { recursive: true, force: true });
    if (e instanceof HttpError) throw e;
    throw new HttpError(
      400,
      'bad_upload',
      `The upload could not be read: ${e instanceof Error ? e.message : e}`,
    );
  }
  if (overLimit) {
    fs.rmSync(dir, { recursive: true, force: true });
    throw tooLarge(limitBytes);
  }
  return { fields, file };
}

/** A file-level problem of an upload as an HTTP answer saying what and where. */
export function fileError(e: IngestFileError): HttpError {
  const status =
    e.code === 'ambiguous-position-columns' || e.code === 'no-position-columns' ? 422 : 400;
  return new HttpError(status, e.code, e.message, e.details);
}

/** Bytes of the start of a file the preview accepts (the browser sends 256 KB). */
const PREVIEW_LIMIT_BYTES = 8 * 1024 * 1024;

/**
 * The mapping screen: format, delimiter, columns, first rows, the decimal-comma columns found
 * (and whether they are read as such: the request's `decimalComma`, by default as detected)
 * and the suggested mapping, made from the cells as they will be read. Nothing is kept.
 */
export async function previewUpload(req: Request) {
  const dir = uploadDir(`preview-${newId()}`);
  try {
    const { fields, file } = await receiveUpload(req, dir, PREVIEW_LIMIT_BYTES);
    if (!file) throw new HttpError(400, 'no_file', 'Attach the file as the multipart part "file".');
    const options = previewFieldsSchema.parse(fields);
    let buf = fs.readFileSync(file.path);
    // The browser sends only the start of a big file: drop a line cut in half at the end.
    const lastNewline = buf.lastIndexOf(0x0a);
    if (lastNewline > 0 && lastNewline < buf.length - 1) buf = buf.subarray(0, lastNewline + 1);
    const preview = await previewFile(buf, 20).catch((e) => {
      throw e instanceof IngestFileError ? fileError(e) : e;
    });
    const values = preview.rows.map((r) => r.values);
    const columns = decimalCommaColumns(preview.header, values);
    const applied = options.decimalComma ?? columns.length > 0;
    const suggestion = suggestMapping(preview.header, applied ? withDecimalPoints(values) : values);
    return {
      preview: {
        format: preview.format,
        delimiter: preview.delimiter,
        headerLine: preview.header.headerLine,
        columns: preview.header.columns,
        rows: preview.rows,
      },
      decimalComma: { columns, applied },
      suggestion,
    };
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

/** An upload checked as a whole, ready to be recorded as a catalog. */
export interface CheckedUpload {
  name: string;
  kind: 'hi' | 'co' | 'hii' | 'ob' | 'other';
  policy: 'skip-bad-rows' | 'reject-file';
  mapping: Mapping;
  decimalComma: boolean;
  assumptions: string[];
  preview: FilePreview;
}

/**
 * Checks an upload's fields and file as a whole: readable, has rows, the mapping (given, or
 * suggested from the first rows) fits the columns. Returns what the catalog stores, including
 * every assumption the normaliser will make. Throws HttpError (file problems as {@link fileError}).
 */
export async function checkUpload(
  fields: Record<string, string>,
  filePath: string,
): Promise<CheckedUpload> {
  const input = uploadFieldsSchema.parse(fields);
  try {
    const preview = await previewFile(filePath, 50);
    let mapping: Mapping;
    if (input.mapping) {
      let parsed: unknown;
      try {
        parsed = JSON.parse(input.mapping);
      } catch {
        throw new HttpError(400, 'invalid_mapping', 'The mapping field is not valid JSON.');
      }
      mapping = mappingSchema.parse(parsed);
    } else {
      const values = preview.rows.map((r) => r.values);
      const suggestion = suggestMapping(
        preview.header,
        input.decimalComma ? withDecimalPoints(values) : values,
      );
      mapping = mappingFromSuggestion(suggestion, preview.header);
    }
    const options = { decimalComma: input.decimalComma };
    // Building the normaliser checks that every mapped column exists in the file.
    makeBatchNormaliser(preview.header, mapping, options);
    return {
      name: input.name,
      kind: input.kind,
      policy: input.policy,
      mapping,
      decimalComma: input.decimalComma,
      assumptions: mappingAssumptions(preview.header, mapping, options),
      preview,
    };
  } catch (e) {
    throw e instanceof IngestFileError ? fileError(e) : e;
  }
}
