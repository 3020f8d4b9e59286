/** Physical layout of a delimited text file; `whitespace` means runs of spaces and tabs. */
export type Delimiter = ',' | '\t' | ';' | 'whitespace';

/** The two table formats Lanewise reads. */
export type TableFormat = 'delimited' | 'votable';

/**
 * One column as the file describes it. Delimited text only has a name (a unit may sit inside
 * it, e.g. `v [km/s]`); a VOTable FIELD also gives unit, UCD, datatype and arraysize.
 */
export interface ColumnInfo {
  name: string;
  unit?: string;
  ucd?: string;
  datatype?: string;
  arraysize?: string;
  description?: string;
}

/**
 * The header of a table: its format, the delimiter for text files, the columns, and the
 * 1-based physical line of the header (the header row for text; the first FIELD for VOTable;
 * `null` for a headerless text file whose columns were named `col1`…`colN`).
 */
export interface TableHeader {
  format: TableFormat;
  delimiter: Delimiter | null;
  columns: ColumnInfo[];
  headerLine: number | null;
}

/**
 * A batch of consecutive data rows. Row i has the raw cell strings `values[i]`, the 1-based
 * physical file line `lines[i]` where it starts (header and comment lines counted; for
 * VOTable the line of its `<TR>`), and the 1-based data-row number `firstRow + i` (header,
 * comment and blank lines not counted).
 */
export interface RowBatch {
  firstRow: number;
  lines: Uint32Array;
  values: string[][];
}

/** Options for opening a table: force a format or delimiter, and the rows per batch (default 5 000). */
export interface OpenTableOptions {
  format?: TableFormat;
  delimiter?: Delimiter;
  batchSize?: number;
}

/** An opened table: the header is known; `batches` streams the data rows once, in file order. */
export interface OpenedTable {
  header: TableHeader;
  batches: AsyncIterable<RowBatch>;
}
