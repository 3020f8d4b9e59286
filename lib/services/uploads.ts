import Busboy from 'busboy';
import fs from 'node:fs';
import path from 'node:path';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { ReadableStream as WebReadableStream } from 'node:stream/web';
import { env } from '@/lib/env';
import { HttpError } from '@/lib/http/errors';

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
