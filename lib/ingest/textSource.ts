import type { Readable } from 'node:stream';
import { IngestFileError } from './errors';

/** Bytes checked for NUL bytes and invalid UTF-8 before anything is parsed. */
const SNIFF_BYTES = 1024;
const REPLACEMENT = '\uFFFD';
const ENCODED_REPLACEMENT = Buffer.from([0xef, 0xbf, 0xbd]);

/**
 * Decoded text of an uploaded file, pulled chunk by chunk so that memory stays flat. The UTF-8
 * byte-order mark is dropped. `next()` returns `null` at the end of the file; `unread()` puts
 * text back in front (used after sniffing the format).
 */
export class TextSource {
  private readonly bytes: AsyncIterator<unknown>;
  private readonly decoder = new TextDecoder('utf-8');
  private pushedBack: string[] = [];
  private started = false;
  private done = false;
  private linesSeen = 0;
  private bytesSeen = 0;

  constructor(stream: Readable) {
    this.bytes = stream[Symbol.asyncIterator]();
  }

  /** The next chunk of text, or `null` at the end of the file. */
  async next(): Promise<string | null> {
    if (this.pushedBack.length > 0) return this.pushedBack.pop() as string;
    if (this.done) return null;
    const raw = this.started ? await this.nextBytes() : await this.firstBytes();
    this.started = true;
    if (raw === null) {
      this.done = true;
      const tail = this.decoder.decode();
      this.checkDecoded(tail, Buffer.alloc(0));
      return tail.length > 0 ? tail : null;
    }
    const text = this.decoder.decode(raw, { stream: true });
    this.checkDecoded(text, raw);
    return text;
  }

  /** Puts text back so that the next `next()` returns it first. */
  unread(text: string): void {
    if (text.length > 0) this.pushedBack.push(text);
  }

  /** Reads at least `minChars` characters (or up to the end of the file) and returns them unread. */
  async peek(minChars: number): Promise<string> {
    let text = '';
    for (;;) {
      const chunk = await this.next();
      if (chunk === null) break;
      text += chunk;
      if (text.length >= minChars) break;
    }
    this.unread(text);
    return text;
  }

  /** Stops reading and releases the underlying stream. */
  async close(): Promise<void> {
    this.done = true;
    await this.bytes.return?.();
  }

  private async nextBytes(): Promise<Buffer | null> {
    const r = await this.bytes.next();
    if (r.done) return null;
    const v = r.value;
    if (typeof v === 'string') return Buffer.from(v, 'utf8');
    if (v instanceof Uint8Array) return Buffer.from(v.buffer, v.byteOffset, v.byteLength);
    throw new TypeError('The upload stream must yield bytes or strings.');
  }

  /** Gathers the first KB and rejects binary or non-UTF-8 content before any parsing. */
  private async firstBytes(): Promise<Buffer | null> {
    const parts: Buffer[] = [];
    let length = 0;
    while (length < SNIFF_BYTES) {
      const b = await this.nextBytes();
      if (b === null) break;
      parts.push(b);
      length += b.length;
    }
    if (length === 0) return null;
    const head = Buffer.concat(parts, length);
    checkHead(head.subarray(0, SNIFF_BYTES));
    return head;
  }

  /**
   * Invalid UTF-8 past the first KB decodes to U+FFFD; that is an error naming the line,
   * unless the file really contains encoded U+FFFD characters. A NUL byte anywhere rejects the
   * whole file: no text table holds one, and a stored `X\0Y` would break names and exports.
   */
  private checkDecoded(text: string, raw: Buffer): void {
    const nulAt = text.indexOf('\0');
    if (nulAt !== -1) {
      const line = this.linesSeen + countChar(text, 10, 0, nulAt) + 1;
      const byte = this.bytesSeen + raw.indexOf(0) + 1;
      throw new IngestFileError(
        'binary-file',
        `line ${line} (byte ${byte}): binary data (a NUL byte) in the file; a text table or VOTable cannot contain one, so nothing was stored — remove it or export the table again as text`,
        { line, byte },
      );
    }
    this.bytesSeen += raw.length;
    const bad = text.indexOf(REPLACEMENT);
    if (bad !== -1 && !raw.includes(ENCODED_REPLACEMENT)) {
      const line = this.linesSeen + countChar(text, 10, 0, bad) + 1;
      throw new IngestFileError(
        'invalid-encoding',
        `line ${line}: the file is not valid UTF-8 here; save it as UTF-8 and upload it again`,
        { line },
      );
    }
    this.linesSeen += countChar(text, 10, 0, text.length);
  }
}

function checkHead(head: Buffer): void {
  if (
    head.length >= 2 &&
    ((head[0] === 0xff && head[1] === 0xfe) || (head[0] === 0xfe && head[1] === 0xff))
  ) {
    throw new IngestFileError(
      'invalid-encoding',
      'line 1: the file is UTF-16 encoded; save it as UTF-8 (or plain ASCII) and upload it again',
      { line: 1 },
    );
  }
  const nul = head.indexOf(0);
  if (nul !== -1) {
    throw new IngestFileError(
      'binary-file',
      `byte ${nul + 1}: the file contains NUL bytes, so it is a binary file, not a text table or VOTable`,
      { byte: nul + 1 },
    );
  }
  try {
    new TextDecoder('utf-8', { fatal: true }).decode(head, { stream: true });
  } catch {
    throw new IngestFileError(
      'binary-file',
      'the first KB of the file is not valid UTF-8 text; upload a CSV/TSV text table or a VOTable',
    );
  }
}

/** Number of occurrences of the UTF-16 code unit `code` in `text[from, to)`. */
export function countChar(text: string, code: number, from: number, to: number): number {
  const ch = String.fromCharCode(code);
  let n = 0;
  let p = text.indexOf(ch, from);
  while (p !== -1 && p < to) {
    n++;
    p = text.indexOf(ch, p + 1);
  }
  return n;
}
