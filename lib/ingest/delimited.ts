import Papa from 'papaparse';
import { IngestFileError } from './errors';
import { isNumericLikeCell } from './cells';
import { RowQueue, rowBatches } from './rowQueue';
import { TextSource } from './textSource';
import type { Delimiter, OpenedTable, OpenTableOptions, TableHeader } from './types';

/** Characters of the file inspected to detect the line break and the delimiter. */
const SAMPLE_CHARS = 64 * 1024;
/** Lines of the sample used to detect the delimiter. */
const SAMPLE_LINES = 200;
/**
 * Longest row the reader holds (1 MB of text): a longer one without a line break is not a
 * table; with line breaks inside, a quote was never closed. Bounding it keeps memory flat and
 * every stored row whole (catalog-tables.ts keeps up to 16 MB per raw row).
 */
export const MAX_ROW_CHARS = 1024 * 1024;
const MAX_ROW_MB = MAX_ROW_CHARS / (1024 * 1024);
const QUOTE = '"';
const CR = 13;

type LineBreak = '\n' | '\r';

/** Something that turns text into rows with their starting line numbers. */
interface RowEngine {
  /** Consumes `text` (appended to what is left over); `final` flushes the last row. */
  feed(text: string, final: boolean, sink: RowQueue): void;
}

/**
 * Comma, tab and semicolon files go through papaparse's low-level parser in step mode.
 * Line numbers: papaparse reports the cursor after each row; the physical line where the row
 * starts is the line at the previous cursor plus the line breaks consumed (comment lines skipped
 * by papaparse included), minus the line breaks inside the row's quoted fields.
 */
class PapaEngine implements RowEngine {
  private readonly parser: Papa.Parser;
  private readonly nlChar: string;
  private readonly nlCode: number;
  private readonly stripCr: boolean;
  private buffer = '';
  private lineAtBufferStart = 1;
  private input = '';
  private prevEnd = 0;
  private lineAtPrevEnd = 1;
  private nextNl = -1;
  private nextQuote = -1;
  private sink: RowQueue | null = null;

  constructor(delimiter: ',' | '\t' | ';', lineBreak: LineBreak) {
    this.nlChar = lineBreak;
    this.nlCode = lineBreak.charCodeAt(0);
    this.stripCr = lineBreak === '\n';
    this.parser = new Papa.Parser({
      delimiter,
      newline: lineBreak,
      comments: '#',
      step: (r: Papa.ParseStepResult<string[]>) => this.onRow(r),
    });
  }

  feed(text: string, final: boolean, sink: RowQueue): void {
    const input = this.buffer.length > 0 ? this.buffer + text : text;
    if (!final && text.indexOf(this.nlChar) === -1) {
      // No row can end in this chunk: keep it without re-parsing the held text (a long line
      // would otherwise be parsed once per chunk).
      this.buffer = input;
      this.checkHeld();
      return;
    }
    this.sink = sink;
    this.input = input;
    this.prevEnd = 0;
    this.lineAtPrevEnd = this.lineAtBufferStart;
    this.nextNl = input.indexOf(this.nlChar);
    this.nextQuote = input.indexOf(QUOTE);
    this.parser.parse(input, 0, !final);
    this.buffer = final ? '' : input.slice(this.prevEnd);
    this.lineAtBufferStart = this.lineAtPrevEnd;
    this.input = '';
    this.checkHeld();
  }

  private checkHeld(): void {
    if (this.buffer.length > MAX_ROW_CHARS) {
      if (this.buffer.indexOf(this.nlChar) === -1) throw lineTooLong(this.lineAtBufferStart);
      throw unclosedQuote(this.lineAtBufferStart, 'after');
    }
  }

  private onRow(r: Papa.ParseStepResult<string[]>): void {
    const input = this.input;
    const rowEnd: number = r.meta.cursor;
    let breaks = 0;
    while (this.nextNl !== -1 && this.nextNl < rowEnd) {
      breaks++;
      this.nextNl = input.indexOf(this.nlChar, this.nextNl + 1);
    }
    // An unclosed quote runs to the end of the input, so its last break is not a row end.
    const unclosed = r.errors.length > 0 && r.errors.some((e) => e.code === 'MissingQuotes');
    const terminated = !unclosed && rowEnd > 0 && input.charCodeAt(rowEnd - 1) === this.nlCode;
    let line = this.lineAtPrevEnd + breaks - (terminated ? 1 : 0);
    const values = (r.data as unknown as string[][])[0];
    if (this.nextQuote !== -1 && this.nextQuote < rowEnd) {
      line -= breaksInside(values, this.nlChar);
      this.nextQuote = input.indexOf(QUOTE, rowEnd);
    }
    this.lineAtPrevEnd += breaks;
    this.prevEnd = rowEnd;
    if (unclosed) throw unclosedQuote(line, 'at');
    if (this.stripCr) {
      const last = values[values.length - 1];
      if (last.charCodeAt(last.length - 1) === CR) values[values.length - 1] = last.slice(0, -1);
    }
    if (values.length === 1 && values[0].trim() === '') return;
    (this.sink as RowQueue).push(values, line);
  }
}

function breaksInside(values: string[], nl: string): number {
  let n = 0;
  for (const v of values) {
    let p = v.indexOf(nl);
    while (p !== -1) {
      n++;
      p = v.indexOf(nl, p + 1);
    }
  }
  return n;
}

function unclosedQuote(line: number, where: 'at' | 'after'): IngestFileError {
  const place = where === 'at' ? `line ${line}` : `a row starting at or after line ${line}`;
  return new IngestFileError(
    'unclosed-quote',
    `${place}: a quoted field (") is opened but never closed before the end of the file`,
    { line },
  );
}

function lineTooLong(line: number): IngestFileError {
  return new IngestFileError(
    'line-too-long',
    `line ${line} is longer than ${MAX_ROW_MB} MB; is this a delimited text file with line breaks?`,
    { line },
  );
}

/**
 * Whitespace-separated files (runs of spaces/tabs): one row per physical line, `#` comments,
 * double-quoted tokens may contain spaces.
 */
class WhitespaceEngine implements RowEngine {
  private buffer = '';
  private line = 1;

  constructor(private readonly lineBreak: LineBreak) {}

  feed(text: string, final: boolean, sink: RowQueue): void {
    const input = this.buffer.length > 0 ? this.buffer + text : text;
    let start = 0;
    for (;;) {
      const nl = input.indexOf(this.lineBreak, start);
      if (nl === -1) break;
      this.handleLine(input.slice(start, nl), sink);
      start = nl + 1;
    }
    if (final && start < input.length) this.handleLine(input.slice(start), sink);
    this.buffer = final ? '' : input.slice(start);
    if (this.buffer.length > MAX_ROW_CHARS) throw lineTooLong(this.line);
  }

  private handleLine(raw: string, sink: RowQueue): void {
    const line = this.line++;
    const text = raw.trim();
    if (text.length === 0 || text.charCodeAt(0) === 35) return;
    sink.push(splitWhitespace(text), line);
  }
}

/** Splits a trimmed line on runs of spaces/tabs; `"…"` tokens keep their spaces (`""` = quote). */
export function splitWhitespace(text: string): string[] {
  if (text.indexOf(QUOTE) === -1) return text.split(/[ \t]+/);
  const out: string[] = [];
  let i = 0;
  while (i < text.length) {
    while (i < text.length && (text[i] === ' ' || text[i] === '\t')) i++;
    if (i >= text.length) break;
    if (text[i] === QUOTE) {
      let token = '';
      i++;
      while (i < text.length) {
        if (text[i] === QUOTE) {
          if (text[i + 1] === QUOTE) {
            token += QUOTE;
            i += 2;
            continue;
          }
          i++;
          break;
        }
        token += text[i++];
      }
      out.push(token);
    } else {
      const start = i;
      while (i < text.length && text[i] !== ' ' && text[i] !== '\t') i++;
      out.push(text.slice(start, i));
    }
  }
  return out;
}

/** `\n` when the text has one (CRLF is handled by dropping the trailing CR), else `\r` if present. */
export function detectLineBreak(sample: string): LineBreak {
  if (sample.indexOf('\n') !== -1) return '\n';
  return sample.indexOf('\r') !== -1 ? '\r' : '\n';
}

/**
 * Guesses the delimiter from a text sample: the first of tab, comma, semicolon whose field
 * count is above one on the header and agrees on at least 80 % of the sampled lines (the
 * largest count wins); otherwise whitespace if that is consistent; otherwise comma (a
 * one-column reading that the mapping step reports as a wrong delimiter).
 */
export function detectDelimiter(sample: string, complete: boolean): Delimiter {
  const text = usableSample(sample, complete);
  let best: { delimiter: Delimiter; fields: number } | null = null;
  for (const delimiter of ['\t', ',', ';'] as const) {
    const rows = Papa.parse<string[]>(text, {
      delimiter,
      comments: '#',
      skipEmptyLines: 'greedy',
      preview: SAMPLE_LINES,
    }).data;
    const fields = consistentFieldCount(rows.map((r) => r.length));
    if (fields > 1 && (best === null || fields > best.fields)) best = { delimiter, fields };
  }
  if (best) return best.delimiter;
  const counts: number[] = [];
  for (const line of text.split(/\r\n|\n|\r/)) {
    const t = line.trim();
    if (t.length === 0 || t.startsWith('#')) continue;
    counts.push(splitWhitespace(t).length);
    if (counts.length >= SAMPLE_LINES) break;
  }
  return consistentFieldCount(counts) > 1 ? 'whitespace' : ',';
}

/** Cuts the sample at its last line break unless it is the whole file. */
function usableSample(sample: string, complete: boolean): string {
  if (complete) return sample;
  const cut = Math.max(sample.lastIndexOf('\n'), sample.lastIndexOf('\r'));
  return cut > 0 ? sample.slice(0, cut) : sample;
}

/** The header's field count when at least 80 % of the lines share it, else 0. */
function consistentFieldCount(counts: number[]): number {
  if (counts.length === 0) return 0;
  const k = counts[0];
  const agree = counts.filter((c) => c === k).length;
  return agree >= 0.8 * counts.length ? k : 0;
}

/**
 * Opens a delimited text table (CSV, TSV, semicolon or whitespace separated) from a text
 * source: detects the line break and (unless given) the delimiter, reads the header row, and
 * returns the header with a one-pass iterator over batches of data rows. A first row that is
 * mostly numbers is taken as data; its column names then come from a `#` comment line just
 * above it with the same number of fields, or are `col1`…`colN`.
 */
export async function openDelimited(
  source: TextSource,
  options: OpenTableOptions = {},
): Promise<OpenedTable> {
  const sample = await source.peek(SAMPLE_CHARS);
  if (sample.trim().length === 0) {
    throw new IngestFileError('empty-file', 'the file is empty (no text at all)');
  }
  const complete = sample.length < SAMPLE_CHARS;
  const lineBreak = detectLineBreak(sample);
  const delimiter = options.delimiter ?? detectDelimiter(sample, complete);
  const engine: RowEngine =
    delimiter === 'whitespace'
      ? new WhitespaceEngine(lineBreak)
      : new PapaEngine(delimiter, lineBreak);
  const queue = new RowQueue();
  let ended = false;
  const pull = async (): Promise<void> => {
    const text = await source.next();
    if (text === null) {
      engine.feed('', true, queue);
      ended = true;
    } else {
      engine.feed(text, false, queue);
    }
  };
  while (queue.length === 0 && !ended) await pull();
  const first = queue.shift();
  if (!first) {
    throw new IngestFileError(
      'empty-file',
      'the file holds only comment lines (#) and blank lines, no header or data',
    );
  }
  const header = buildHeader(first.values, first.line, sample, delimiter, lineBreak);
  if (header.headerLine === null) queue.unshift(first.values, first.line);
  checkDuplicateNames(header);

  const batches = rowBatches(queue, options.batchSize ?? 5000, {
    pull,
    ended: () => ended,
    whenEmpty: () => noDataRows(header),
    close: () => source.close(),
  });
  return { header, batches };
}

function buildHeader(
  firstValues: string[],
  firstLine: number,
  sample: string,
  delimiter: Delimiter,
  lineBreak: LineBreak,
): TableHeader {
  const numeric = firstValues.filter(isNumericLikeCell).length;
  if (numeric * 2 < firstValues.length || firstValues.length === 1) {
    return {
      format: 'delimited',
      delimiter,
      columns: firstValues.map((v) => ({ name: v.trim() })),
      headerLine: firstLine,
    };
  }
  const names =
    commentHeader(sample, firstLine - 1, delimiter, lineBreak, firstValues.length) ??
    firstValues.map((_, i) => `col${i + 1}`);
  return {
    format: 'delimited',
    delimiter,
    columns: names.map((name) => ({ name })),
    headerLine: null,
  };
}

/** Column names from a `# a b c` comment on the given line, when it has `count` names. */
function commentHeader(
  sample: string,
  line: number,
  delimiter: Delimiter,
  lineBreak: LineBreak,
  count: number,
): string[] | null {
  if (line < 1) return null;
  const text = physicalLine(sample, line, lineBreak)?.replace(/\r$/, '').trim();
  if (!text || !text.startsWith('#')) return null;
  const body = text.replace(/^#+/, '').trim();
  const names =
    delimiter === 'whitespace'
      ? splitWhitespace(body)
      : (Papa.parse<string[]>(body, { delimiter }).data[0] ?? []).map((s) => s.trim());
  if (names.length !== count || names.some((n) => n === '' || isNumericLikeCell(n))) return null;
  return names;
}

function physicalLine(text: string, line: number, lineBreak: LineBreak): string | null {
  let start = 0;
  for (let i = 1; i < line; i++) {
    const nl = text.indexOf(lineBreak, start);
    if (nl === -1) return null;
    start = nl + 1;
  }
  const end = text.indexOf(lineBreak, start);
  return end === -1 ? null : text.slice(start, end);
}

/** Rejects headers that name two columns alike (case-sensitive, after trimming) or leave one empty. */
export function checkDuplicateNames(header: TableHeader): void {
  const seen = new Map<string, number>();
  const where = header.headerLine === null ? 'header' : `line ${header.headerLine}`;
  header.columns.forEach((c, i) => {
    if (c.name === '') {
      throw new IngestFileError(
        'duplicate-column',
        `${where}: column ${i + 1} has no name; every column needs a distinct name`,
        { line: header.headerLine, column: i + 1 },
      );
    }
    const previous = seen.get(c.name);
    if (previous !== undefined) {
      throw new IngestFileError(
        'duplicate-column',
        `${where}: column name \`${c.name}\` appears twice (columns ${previous + 1} and ${i + 1}); rename one of them`,
        { line: header.headerLine, column: c.name },
      );
    }
    seen.set(c.name, i);
  });
}

export function noDataRows(header: TableHeader): IngestFileError {
  const where = header.headerLine === null ? '' : ` (line ${header.headerLine})`;
  return new IngestFileError(
    'no-data-rows',
    `the file has a header${where} but no data rows`,
    header.headerLine === null ? undefined : { line: header.headerLine },
  );
}
