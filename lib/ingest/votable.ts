import { SaxesParser, type SaxesTagNS } from 'saxes';
import { IngestFileError } from './errors';
import { checkDuplicateNames, noDataRows } from './delimited';
import { RowQueue, rowBatches } from './rowQueue';
import { TextSource } from './textSource';
import type { ColumnInfo, OpenedTable, OpenTableOptions, TableHeader } from './types';

/** Serialisations other than TABLEDATA that a VOTable may use; Lanewise reads TABLEDATA only. */
const OTHER_SERIALISATIONS = new Set(['BINARY', 'BINARY2', 'FITS']);

interface OpenElement {
  local: string;
  line: number;
}

/**
 * Streaming reader of the first TABLE of a VOTable (IVOA VOTable 1.3/1.4, any namespace or
 * prefix; elements are matched by local name). FIELDs give the header (name, unit, ucd,
 * datatype, arraysize, DESCRIPTION); each TR becomes a row whose line is the line of its `<TR>`.
 * A cell equal to its FIELD's `<VALUES null="…">` is returned as an empty string.
 */
class VotableParser {
  private readonly sax = new SaxesParser({ xmlns: true, position: true });
  private readonly stack: OpenElement[] = [];
  readonly columns: ColumnInfo[] = [];
  private readonly nulls: (string | undefined)[] = [];
  firstFieldLine: number | null = null;
  version: string | undefined;
  /** 0 = before the first TABLE, 1 = inside it, 2 = after it. */
  private tableState = 0;
  private inTableData = false;
  private row: string[] | null = null;
  private rowLine = 0;
  private cell: string | null = null;
  private description: string | null = null;
  private sink: RowQueue | null = null;
  headerComplete = false;
  private tagStartLine = 1;

  constructor() {
    this.sax.on('opentagstart', () => {
      this.tagStartLine = this.sax.line;
    });
    this.sax.on('opentag', (tag) => this.open(tag));
    this.sax.on('closetag', (tag) => this.close(tag));
    this.sax.on('text', (t) => this.text(t));
    this.sax.on('cdata', (t) => this.text(t));
    this.sax.on('error', (e) => {
      throw new IngestFileError(
        'malformed-xml',
        `line ${this.sax.line}, column ${this.sax.column}: the VOTable is not well-formed XML (${e.message.replace(/^(?:.*?:)?\d+:\d+: /, '')})`,
        { line: this.sax.line },
      );
    });
  }

  write(text: string, sink: RowQueue): void {
    this.sink = sink;
    this.sax.write(text);
  }

  end(sink: RowQueue): void {
    this.sink = sink;
    if (this.stack.length > 0) {
      const inner = this.stack[this.stack.length - 1];
      throw new IngestFileError(
        'truncated-votable',
        `line ${this.sax.line}: the VOTable ends before <${inner.local}> (opened on line ${inner.line}) is closed; the file looks truncated`,
        { line: this.sax.line, element: inner.local, openedOnLine: inner.line },
      );
    }
    this.sax.close();
    if (this.tableState === 0) {
      throw new IngestFileError('unsupported-votable', 'the VOTable contains no TABLE element');
    }
  }

  private open(tag: SaxesTagNS): void {
    const local = tag.local;
    const line = this.tagStartLine;
    if (!tag.isSelfClosing) this.stack.push({ local, line });
    if (local === 'VOTABLE') this.version = attr(tag, 'version');
    if (this.tableState === 0 && local === 'TABLE') this.tableState = 1;
    if (this.tableState !== 1) return;
    switch (local) {
      case 'FIELD':
        this.openField(tag, line);
        break;
      case 'VALUES': {
        const nullValue = attr(tag, 'null');
        if (nullValue !== undefined && this.inField())
          this.nulls[this.columns.length - 1] = nullValue;
        break;
      }
      case 'DESCRIPTION':
        if (this.inField()) this.description = '';
        break;
      case 'DATA':
        this.headerComplete = true;
        break;
      case 'TABLEDATA':
        this.inTableData = true;
        break;
      case 'TR':
        if (this.inTableData) {
          this.row = [];
          this.rowLine = line;
          if (tag.isSelfClosing) this.endRow();
        }
        break;
      case 'TD':
        if (this.row) {
          this.cell = '';
          if (tag.isSelfClosing) this.endCell();
        }
        break;
      default:
        if (OTHER_SERIALISATIONS.has(local)) {
          throw new IngestFileError(
            'unsupported-votable',
            `line ${line}: the table data are serialised as ${local}; Lanewise reads VOTable TABLEDATA only — re-save the table with TABLEDATA serialisation`,
            { line, serialization: local },
          );
        }
    }
  }

  private inField(): boolean {
    const parent = this.stack[this.stack.length - 2];
    const self = this.stack[this.stack.length - 1];
    return (self?.local === 'FIELD' || parent?.local === 'FIELD') && this.columns.length > 0;
  }

  private openField(tag: SaxesTagNS, line: number): void {
    if (this.firstFieldLine === null) this.firstFieldLine = line;
    const name = attr(tag, 'name') ?? attr(tag, 'ID') ?? '';
    const info: ColumnInfo = { name: name.trim() };
    for (const key of ['unit', 'ucd', 'datatype', 'arraysize'] as const) {
      const v = attr(tag, key);
      if (v !== undefined && v !== '') info[key] = v;
    }
    this.columns.push(info);
    this.nulls.push(undefined);
  }

  private close(tag: SaxesTagNS): void {
    const local = tag.local;
    this.stack.pop();
    if (this.tableState !== 1) return;
    if (local === 'TD' && this.cell !== null) this.endCell();
    else if (local === 'TR' && this.row) this.endRow();
    else if (local === 'TABLEDATA') this.inTableData = false;
    else if (local === 'DESCRIPTION' && this.description !== null) {
      const col = this.columns[this.columns.length - 1];
      if (col) col.description = this.description.trim();
      this.description = null;
    } else if (local === 'TABLE') {
      this.tableState = 2;
      this.headerComplete = true;
    }
  }

  private text(t: string): void {
    if (this.cell !== null) this.cell += t;
    else if (this.description !== null) this.description += t;
  }

  private endCell(): void {
    const row = this.row as string[];
    const value = (this.cell as string).trim();
    this.cell = null;
    const nullValue = this.nulls[row.length];
    row.push(nullValue !== undefined && value === nullValue ? '' : value);
  }

  private endRow(): void {
    (this.sink as RowQueue).push(this.row as string[], this.rowLine);
    this.row = null;
  }
}

function attr(tag: SaxesTagNS, local: string): string | undefined {
  for (const a of Object.values(tag.attributes)) {
    if (a.local === local && a.prefix === '') return a.value;
  }
  return undefined;
}

/**
 * Opens a VOTable (TABLEDATA serialisation) from a text source: reads up to the end of the
 * first TABLE's FIELD list for the header, then streams the TR rows in batches. Errors: a
 * truncated file (elements still open at the end) names the last line and the unclosed
 * element; BINARY/BINARY2/FITS data and malformed XML are errors with their line.
 */
export async function openVotable(
  source: TextSource,
  options: OpenTableOptions = {},
): Promise<OpenedTable> {
  const parser = new VotableParser();
  const queue = new RowQueue();
  let ended = false;
  const pull = async (): Promise<void> => {
    const text = await source.next();
    if (text === null) {
      parser.end(queue);
      ended = true;
    } else {
      parser.write(text, queue);
    }
  };
  while (!parser.headerComplete && !ended) await pull();
  if (parser.columns.length === 0) {
    throw new IngestFileError('unsupported-votable', 'the VOTable TABLE has no FIELD elements', {
      line: parser.firstFieldLine,
    });
  }
  const header: TableHeader = {
    format: 'votable',
    delimiter: null,
    columns: parser.columns,
    headerLine: parser.firstFieldLine,
  };
  checkDuplicateNames(header);

  const batches = rowBatches(queue, options.batchSize ?? 5000, {
    pull,
    ended: () => ended,
    whenEmpty: () => noDataRows(header),
    close: () => source.close(),
  });
  return { header, batches };
}
