import { inArray } from 'drizzle-orm';
import type { RowDataPacket } from 'mysql2';
import { db, pool } from '@/db/client';
import { catalogs } from '@/db/schema';
import { csvLine } from '@/lib/export/csv';
import { csvCellSql, csvLineSql, sqlLiteral, type CsvSqlKind } from '@/lib/export/csv-sql';
import {
  EXPORT_DECIMALS,
  EXPORT_PRECISION_TEXT,
  type ExportQuantity,
} from '@/lib/export/precision';
import { votableStream, type VotableField } from '@/lib/export/votable';
import { rowsTableName } from './catalog-tables';
import { requireDoneRun } from './link-runs';
import pkg from '@/package.json';

export type ExportShape = 'links' | 'complexes' | 'sources';

/** `originalColumns`: every uploaded column of each source's catalog follows the canonical ones. */
export interface ExportOptions {
  originalColumns?: boolean;
}

/** A catalog of the run as its exports need it: id, name and the uploaded header. */
interface RunCatalog {
  id: string;
  name: string;
  columns: string[];
}

/**
 * One query's worth of an export, read in ranges of `key` from `lo` to `hi`: `from` holds the
 * tables and a WHERE clause whose `?` are `values`; `a`, `b` (links) or `source` (sources) are
 * the catalogs whose rows the segment reads.
 */
interface Segment {
  from: string;
  values: unknown[];
  key: string;
  lo: number;
  hi: number;
  a?: RunCatalog;
  b?: RunCatalog;
  source?: RunCatalog;
}

/**
 * A column of an export: its VOTable field, the SQL that reads it (per segment when it depends
 * on the segment's catalogs) and how it becomes CSV. Doubles are written to the field's
 * `precision` in decimals, in the CSV and the VOTable alike (lib/export/decimals.ts).
 */
interface Column {
  field: VotableField;
  sql: string | ((s: Segment) => string);
  kind: CsvSqlKind;
}

interface Table {
  columns: Column[];
  segments: Segment[];
  /** Rows per range: bounds each chunk's text (the longest review note is 4 000 characters). */
  chunkRows: number;
}

const sqlOf = (c: Column, s: Segment) => (typeof c.sql === 'string' ? c.sql : c.sql(s));

// UCDs are words of the IVOA UCD1+ controlled vocabulary (IVOA Recommendation "UCD1+
// controlled vocabulary", version 1.5, 2023); units are VOUnits (IVOA Recommendation 1.0, 2014).
type Extra = Omit<Partial<VotableField>, 'name' | 'datatype'> & { description: string };

/** A double written to the decimals of its quantity. */
const num = (name: string, sql: string, quantity: ExportQuantity, extra: Extra): Column => ({
  field: { name, datatype: 'double', precision: EXPORT_DECIMALS[quantity], ...extra },
  sql,
  kind: 'number',
});
const int = (name: string, sql: string, extra: Extra): Column => ({
  field: { name, datatype: 'int', ...extra },
  sql,
  kind: 'number',
});
/** User text (names, notes, original cells): any Unicode, any length. */
const text = (name: string, sql: Column['sql'], extra: Extra): Column => ({
  field: { name, datatype: 'unicodeChar', arraysize: '*', ...extra },
  sql,
  kind: 'text',
});
/** Our UUIDs: 36 ASCII characters. */
const uuid = (name: string, sql: string, extra: Extra): Column => ({
  field: { name, datatype: 'char', arraysize: '36', ...extra },
  sql,
  kind: 'raw',
});
const flag = (name: string, sql: string, extra: Extra): Column => ({
  field: { name, datatype: 'boolean', ...extra },
  sql,
  kind: 'boolean',
});
/** ISO 8601 UTC with milliseconds: `2026-03-04T05:06:07.089Z`, 24 characters. */
const time = (name: string, sql: string, extra: Extra): Column => ({
  field: { name, datatype: 'char', arraysize: '24', xtype: 'timestamp', ...extra },
  sql,
  kind: 'time',
});

/** The segment of `from` between the keys `lo` and `hi`, or nothing when there are no rows. */
function segment(
  from: string,
  values: unknown[],
  key: string,
  range: RowDataPacket,
  catalogsOf: Pick<Segment, 'a' | 'b' | 'source'>,
): Segment[] {
  return range.lo === null
    ? []
    : [{ from, values, key, lo: Number(range.lo), hi: Number(range.hi), ...catalogsOf }];
}

/** The run's catalogs with names and uploaded headers, by id. */
async function runCatalogMap(ids: string[]): Promise<Map<string, RunCatalog>> {
  const rows = await db
    .select({ id: catalogs.id, name: catalogs.name, columns: catalogs.columns })
    .from(catalogs)
    .where(inArray(catalogs.id, ids));
  return new Map(rows.map((r) => [r.id, { id: r.id, name: r.name, columns: r.columns ?? [] }]));
}

function catalogOf(map: Map<string, RunCatalog>, id: string): RunCatalog {
  const c = map.get(id);
  if (!c) throw new Error(`catalog ${id} of the run no longer exists`);
  return c;
}

/**
 * The uploaded cell of column `name` of a row whose raw cells are the JSON array `original`
 * (catalog-ingest.ts stores them so), or NULL when the row's catalog has no such column.
 */
function originalCellSql(alias: string, catalog: RunCatalog | undefined, name: string): string {
  const i = catalog ? catalog.columns.indexOf(name) : -1;
  return i < 0 ? 'NULL' : `JSON_VALUE(${alias}.original, '$[${i}]')`;
}

/**
 * Columns for the uploaded columns of the catalogs in `cats` (the union of their names, in
 * order of first appearance), each named `prefix` + the uploaded name, read from the catalog
 * `pick(segment)` of each segment and empty where that catalog lacks the column.
 */
function originalColumns(
  cats: RunCatalog[],
  prefix: string,
  alias: string,
  pick: (s: Segment) => RunCatalog | undefined,
): Column[] {
  const names = [...new Set(cats.flatMap((c) => c.columns))];
  return names.map((n) => {
    const from = cats.filter((c) => c.columns.includes(n)).map((c) => `“${c.name}”`);
    // No UCD or unit: what an uploaded column measures is for its catalog to say.
    return text(`${prefix}${n}`, (s) => originalCellSql(alias, pick(s), n), {
      description: `column “${n}” as uploaded in ${from.join(', ')} (empty for rows of a catalog without it)`,
    });
  });
}

/** A column prefix per catalog for the sources export: its name in letters and digits, unique. */
export function catalogPrefixes(names: string[]): string[] {
  const taken = new Set<string>();
  return names.map((name) => {
    const base = name.replace(/[^\p{L}\p{N}]+/gu, '_').replace(/^_+|_+$/g, '') || 'catalog';
    let prefix = base;
    for (let k = 2; taken.has(prefix); k++) prefix = `${base}_${k}`;
    taken.add(prefix);
    return prefix;
  });
}

/**
 * Column names made unique (a later duplicate, e.g. an uploaded `name` beside our `a_name`,
 * gets `_2`, `_3`, …) and XML IDs made valid NCNames for the VOTable.
 */
function settleNames(columns: Column[]): Column[] {
  const names = new Set<string>();
  const ids = new Set<string>();
  const unique = (base: string, seen: Set<string>) => {
    let x = base;
    for (let k = 2; seen.has(x); k++) x = `${base}_${k}`;
    seen.add(x);
    return x;
  };
  return columns.map((c) => {
    const name = unique(c.field.name, names);
    const idBase = name.replace(/[^A-Za-z0-9_.-]/g, '_').replace(/^(?![A-Za-z_])/, '_');
    return { ...c, field: { ...c.field, name, id: unique(idBase, ids) } };
  });
}

const sourceColumns = (alias: 'a' | 'b'): Column[] => [
  text(`${alias}_name`, `${alias}.name`, {
    ucd: 'meta.id',
    description: `source name in catalog ${alias.toUpperCase()}`,
  }),
  num(`${alias}_l`, `${alias}.l`, 'positionDeg', {
    unit: 'deg',
    ucd: 'pos.galactic.lon',
    description: `Galactic longitude of source ${alias.toUpperCase()}`,
  }),
  num(`${alias}_b`, `${alias}.b`, 'positionDeg', {
    unit: 'deg',
    ucd: 'pos.galactic.lat',
    description: `Galactic latitude of source ${alias.toUpperCase()}`,
  }),
  num(`${alias}_v`, `${alias}.v`, 'velocityKms', {
    unit: 'km/s',
    ucd: 'spect.dopplerVeloc.radio',
    description: `v_LSR of source ${alias.toUpperCase()} (radio convention)`,
  }),
];

async function linksTable(
  runId: string,
  cats: Map<string, RunCatalog>,
  options: ExportOptions,
): Promise<Table> {
  const [pairs] = await pool().query<RowDataPacket[]>(
    'SELECT catalog_a, catalog_b, MIN(id) AS lo, MAX(id) AS hi FROM links WHERE run_id = ? GROUP BY catalog_a, catalog_b ORDER BY lo',
    [runId],
  );
  const segments: Segment[] = [];
  for (const p of pairs) {
    // Both catalogs' rows are joined on their primary keys; links are read in id ranges.
    const from = `links l JOIN \`${rowsTableName(p.catalog_a)}\` a ON a.\`row\` = l.row_a JOIN \`${rowsTableName(p.catalog_b)}\` b ON b.\`row\` = l.row_b
      WHERE l.run_id = ? AND l.catalog_a = ? AND l.catalog_b = ?`;
    const sides = { a: catalogOf(cats, p.catalog_a), b: catalogOf(cats, p.catalog_b) };
    segments.push(...segment(from, [runId, p.catalog_a, p.catalog_b], 'l.id', p, sides));
  }
  const side = (k: 'a' | 'b') => [...new Set(segments.map((s) => s[k]!))];
  const columns: Column[] = [
    uuid('catalog_a', 'l.catalog_a', {
      ucd: 'meta.id;meta.dataset',
      description: 'id of catalog A',
    }),
    int('row_a', 'l.row_a', {
      ucd: 'meta.record',
      description: '1-based data row of catalog A as uploaded',
    }),
    uuid('catalog_b', 'l.catalog_b', {
      ucd: 'meta.id;meta.dataset',
      description: 'id of catalog B',
    }),
    int('row_b', 'l.row_b', {
      ucd: 'meta.record',
      description: '1-based data row of catalog B as uploaded',
    }),
    num('separation_arcsec', 'l.sep_arcsec', 'angleArcsec', {
      unit: 'arcsec',
      ucd: 'pos.angDistance',
      description: 'great-circle separation of A and B',
    }),
    num('delta_v_kms', 'l.dv_kms', 'velocityKms', {
      unit: 'km/s',
      ucd: 'spect.dopplerVeloc.radio;arith.diff',
      description: 'v_LSR(B) − v_LSR(A)',
    }),
    int('complex_id', 'l.complex_id', {
      ucd: 'meta.id.parent',
      description: 'the complex the link belongs to',
    }),
    // The names follow the documented leading columns (README), which stay in their order.
    text('catalog_a_name', (s) => sqlLiteral(s.a!.name), {
      ucd: 'meta.title;meta.dataset',
      description: 'name of catalog A',
    }),
    text('catalog_b_name', (s) => sqlLiteral(s.b!.name), {
      ucd: 'meta.title;meta.dataset',
      description: 'name of catalog B',
    }),
    num('reliability', 'l.reliability', 'fraction', {
      ucd: 'stat.probability',
      description: '1 − chance/real links at this separation',
    }),
    num('match_radius_arcsec', 'l.radius_arcsec', 'angleArcsec', {
      unit: 'arcsec',
      ucd: 'pos.angDistance;stat.max',
      description: 'match radius that applied to this pair',
    }),
    ...sourceColumns('a'),
    ...sourceColumns('b'),
    ...(options.originalColumns
      ? [
          ...originalColumns(side('a'), 'a_', 'a', (s) => s.a),
          ...originalColumns(side('b'), 'b_', 'b', (s) => s.b),
        ]
      : []),
  ];
  return { columns: settleNames(columns), segments, chunkRows: 10_000 };
}

async function complexesTable(runId: string): Promise<Table> {
  const count = (name: string, sql: string, description: string) =>
    int(name, sql, { ucd: 'meta.number', description });
  const columns: Column[] = [
    int('complex_id', 'c.id', { ucd: 'meta.id;meta.main', description: 'id of the complex' }),
    text('name', 'c.name', { ucd: 'meta.id', description: 'name of its first member' }),
    count('size', 'c.size', 'member sources'),
    count('links', 'c.link_count', 'links between its members'),
    count('n_hi', 'c.n_hi', 'HI members'),
    count('n_co', 'c.n_co', 'CO members'),
    count('n_hii', 'c.n_hii', 'HII-region members'),
    count('n_ob', 'c.n_ob', 'OB-star members'),
    count('n_other', 'c.n_other', 'members of other kinds'),
    num('l_deg', 'c.l', 'positionDeg', {
      unit: 'deg',
      ucd: 'pos.galactic.lon;stat.mean',
      description: 'centroid longitude',
    }),
    num('b_deg', 'c.b', 'positionDeg', {
      unit: 'deg',
      ucd: 'pos.galactic.lat;stat.mean',
      description: 'centroid latitude',
    }),
    num('v_lsr_kms', 'c.v', 'velocityKms', {
      unit: 'km/s',
      ucd: 'spect.dopplerVeloc.radio;stat.mean',
      description: 'mean v_LSR of members with a velocity (radio convention)',
    }),
    num('max_separation_arcsec', 'c.max_sep_arcsec', 'angleArcsec', {
      unit: 'arcsec',
      ucd: 'pos.angDistance;stat.max',
      description: 'largest separation of its links',
    }),
    num('max_abs_delta_v_kms', 'c.max_dv_kms', 'velocityKms', {
      unit: 'km/s',
      ucd: 'spect.dopplerVeloc.radio;arith.diff;stat.max',
      description: 'largest |Δv_LSR| of its links',
    }),
    num('reliability', 'c.reliability', 'fraction', {
      ucd: 'stat.probability',
      description: 'lowest reliability of its links',
    }),
    flag('over_cap', 'c.over_cap', {
      ucd: 'meta.code',
      description: 'true when the complex grew past the size cap',
    }),
    text('review', 'c.review', {
      ucd: 'meta.code.qual',
      description: 'accepted, doubtful or rejected; empty before review',
    }),
    text('review_note', 'c.review_note', { ucd: 'meta.note', description: "reviewer's note" }),
    time('reviewed_at', 'c.reviewed_at', {
      ucd: 'time.processing',
      description: 'time of the last review (UTC)',
    }),
  ];
  const [[range]] = await pool().query<RowDataPacket[]>(
    'SELECT MIN(id) AS lo, MAX(id) AS hi FROM complexes WHERE run_id = ?',
    [runId],
  );
  return {
    columns: settleNames(columns),
    segments: segment('complexes c WHERE c.run_id = ?', [runId], 'c.id', range, {}),
    chunkRows: 2_000,
  };
}

/** Every source of the run's catalogs with its complex (empty when it has no link). */
async function sourcesTable(
  runId: string,
  cats: RunCatalog[],
  options: ExportOptions,
): Promise<Table> {
  const segments: Segment[] = [];
  for (const cat of cats) {
    // The one-row `k` carries the catalog id into every line (rowsTableName checked it is a UUID).
    const from = `\`${rowsTableName(cat.id)}\` s JOIN (SELECT '${cat.id}' AS id) k
      LEFT JOIN complex_members m ON m.run_id = ? AND m.catalog_id = k.id AND m.\`row\` = s.\`row\` WHERE TRUE`;
    const [[range]] = await pool().query<RowDataPacket[]>(
      `SELECT MIN(\`row\`) AS lo, MAX(\`row\`) AS hi FROM \`${rowsTableName(cat.id)}\``,
    );
    segments.push(...segment(from, [runId], 's.`row`', range, { source: cat }));
  }
  const prefixes = catalogPrefixes(cats.map((c) => c.name));
  const columns: Column[] = [
    uuid('catalog_id', 'k.id', { ucd: 'meta.id;meta.dataset', description: 'id of the catalog' }),
    text('catalog_name', (s) => sqlLiteral(s.source!.name), {
      ucd: 'meta.title;meta.dataset',
      description: 'name of the catalog',
    }),
    int('row', 's.`row`', {
      ucd: 'meta.record',
      description: '1-based data row of the catalog as uploaded',
    }),
    text('name', 's.name', { ucd: 'meta.id', description: 'source name' }),
    num('l_deg', 's.l', 'positionDeg', {
      unit: 'deg',
      ucd: 'pos.galactic.lon',
      description: 'Galactic longitude',
    }),
    num('b_deg', 's.b', 'positionDeg', {
      unit: 'deg',
      ucd: 'pos.galactic.lat',
      description: 'Galactic latitude',
    }),
    num('v_lsr_kms', 's.v', 'velocityKms', {
      unit: 'km/s',
      ucd: 'spect.dopplerVeloc.radio',
      description: 'v_LSR (radio convention)',
    }),
    num('radius_arcsec', 's.radius_arcsec', 'angleArcsec', {
      unit: 'arcsec',
      ucd: 'phys.angSize',
      description: 'angular radius of the source',
    }),
    num('pos_err_arcsec', 's.pos_err_arcsec', 'angleArcsec', {
      unit: 'arcsec',
      ucd: 'stat.error;pos',
      description: 'position error',
    }),
    num('v_err_kms', 's.v_err_kms', 'velocityKms', {
      unit: 'km/s',
      ucd: 'stat.error;spect.dopplerVeloc.radio',
      description: 'v_LSR error',
    }),
    num('line_width_sigma_kms', 's.line_width_kms', 'velocityKms', {
      unit: 'km/s',
      ucd: 'phys.veloc.dispersion',
      description: 'line width as a velocity dispersion σ',
    }),
    num('dist_kpc', 's.dist_kpc', 'lengthKpc', {
      unit: 'kpc',
      ucd: 'pos.distance',
      description: 'distance given in the catalog (not kinematic)',
    }),
    num('dist_err_kpc', 's.dist_err_kpc', 'lengthKpc', {
      unit: 'kpc',
      ucd: 'stat.error;pos.distance',
      description: 'error of that distance',
    }),
    int('complex_id', 'm.complex_id', {
      ucd: 'meta.id.parent',
      description: 'the complex of the source; empty when it has no link',
    }),
    ...(options.originalColumns
      ? cats.flatMap((c, i) =>
          originalColumns([c], `${prefixes[i]}_`, 's', (s) => (s.source === c ? c : undefined)),
        )
      : []),
  ];
  return { columns: settleNames(columns), segments, chunkRows: 10_000 };
}

async function table(runId: string, shape: ExportShape, options: ExportOptions): Promise<Table> {
  const run = await requireDoneRun(runId);
  if (shape === 'complexes') return complexesTable(runId);
  const cats = await runCatalogMap(run.catalogIds);
  if (shape === 'links') return linksTable(runId, cats, options);
  return sourcesTable(
    runId,
    run.catalogIds.map((id) => catalogOf(cats, id)),
    options,
  );
}

/**
 * Runs `fetch` over every key range of every segment, in order, with the next range already
 * being read while the caller consumes this one: the database works on one core while Node
 * writes the response on the other.
 */
async function* ranges<T>(
  t: Table,
  fetch: (s: Segment, lo: number, hi: number) => Promise<T>,
): AsyncGenerator<T> {
  const todo = t.segments.flatMap((s) => {
    const out: [Segment, number][] = [];
    for (let lo = s.lo; lo <= s.hi; lo += t.chunkRows) out.push([s, lo]);
    return out;
  });
  const read = (i: number) =>
    i < todo.length ? fetch(todo[i][0], todo[i][1], todo[i][1] + t.chunkRows) : undefined;
  let pending = read(0);
  for (let i = 0; pending; i++) {
    const ahead = read(i + 1);
    // Keep the read-ahead from raising an unhandled rejection if the consumer stops first.
    ahead?.catch(() => undefined);
    yield await pending;
    pending = ahead;
  }
}

const rangeWhere = (s: Segment) => `${s.from} AND ${s.key} >= ? AND ${s.key} < ?`;

/** Longest text MariaDB may build for one chunk; a chunk that reaches it is refused, never cut. */
const MAX_CHUNK_BYTES = 256 * 1024 * 1024;

/**
 * A run's links, complexes or sources as CSV: the header as text, then one piece of UTF-8 per
 * chunk of rows, each assembled by MariaDB (see lib/export/csv-sql.ts).
 */
export async function* runCsv(
  runId: string,
  shape: ExportShape,
  options: ExportOptions = {},
): AsyncGenerator<string | Uint8Array> {
  const t = await table(runId, shape, options);
  yield csvLine(t.columns.map((c) => c.field.name));
  for await (const piece of ranges(t, async (s, lo, hi) => {
    const line = csvLineSql(
      t.columns.map((c) => ({ sql: sqlOf(c, s), kind: c.kind, decimals: c.field.precision })),
    );
    const [[r]] = await pool().query<RowDataPacket[]>(
      `SET STATEMENT group_concat_max_len = ${MAX_CHUNK_BYTES} FOR
       SELECT CAST(GROUP_CONCAT(${line} ORDER BY ${s.key} SEPARATOR '') AS BINARY) AS text FROM ${rangeWhere(s)}`,
      [...s.values, lo, hi],
    );
    const text = r.text as Buffer | null;
    if (text && text.length >= MAX_CHUNK_BYTES)
      throw new Error(`export chunk of ${shape} from ${s.key} = ${lo} is too large to write`);
    return text;
  })) {
    if (piece?.length) yield piece;
  }
}

/**
 * Rows of a table as arrays of JavaScript values (booleans and times converted). Rounded
 * doubles come as the text the CSV holds, written by MariaDB (csv-sql.ts): the two exports
 * agree digit for digit, and the driver's number parser, which can be an ulp off, is not used.
 */
async function* tableRows(t: Table): AsyncGenerator<unknown[]> {
  const kinds = t.columns.map((c) => c.kind);
  const rounded = t.columns.map((c) => c.field.precision !== undefined);
  for await (const chunk of ranges(t, async (s, lo, hi) => {
    const select = t.columns
      .map((c) =>
        c.field.precision === undefined
          ? sqlOf(c, s)
          : csvCellSql(sqlOf(c, s), 'number', c.field.precision),
      )
      .join(', ');
    const [rows] = await pool().query({
      sql: `SELECT ${select} FROM ${rangeWhere(s)} ORDER BY ${s.key}`,
      values: [...s.values, lo, hi],
      rowsAsArray: true,
    });
    return rows as unknown as unknown[][];
  })) {
    for (const r of chunk) {
      for (let i = 0; i < r.length; i++) {
        if (rounded[i]) r[i] = r[i] === '' ? null : String(r[i]);
        else if (kinds[i] === 'boolean' && r[i] !== null) r[i] = !!r[i];
        else if (kinds[i] === 'time' && r[i] !== null) r[i] = new Date(r[i] as Date).toISOString();
      }
      yield r;
    }
  }
}

/** The same tables as VOTable 1.4 TABLEDATA. */
export async function runVotable(
  runId: string,
  shape: ExportShape,
  options: ExportOptions = {},
): Promise<AsyncGenerator<string>> {
  const t = await table(runId, shape, options);
  return votableStream({
    resourceName: `lanewise-link-run-${runId}`,
    tableName: shape,
    description: `Lanewise link run ${runId}: ${shape}${options.originalColumns ? ', with the uploaded columns of each catalog' : ''}; numbers to the decimals in each field's precision`,
    fields: t.columns.map((c) => c.field),
    rows: tableRows(t),
  });
}

/** Everything needed to reproduce and cite a run: parameters, versions and references. */
export async function runMethods(runId: string) {
  const run = await requireDoneRun(runId);
  const cats = await db
    .select({
      id: catalogs.id,
      name: catalogs.name,
      kind: catalogs.kind,
      fileName: catalogs.fileName,
      rowCount: catalogs.rowCount,
      mapping: catalogs.mapping,
    })
    .from(catalogs)
    .where(inArray(catalogs.id, run.catalogIds));
  const deps = pkg.dependencies as Record<string, string>;
  return {
    run: {
      id: run.id,
      name: run.name,
      createdAt: run.createdAt.toISOString(),
      finishedAt: run.finishedAt?.toISOString() ?? null,
    },
    parameters: run.params,
    catalogs: cats,
    summary: run.summary,
    software: {
      lanewise: pkg.version,
      node: process.version,
      kdbush: deps.kdbush,
      mariadbDriver: deps.mysql2,
    },
    conventions: {
      positions:
        'Galactic l, b (IAU 1958 system, J2000 realisation; Hipparcos Catalogue Vol. 1 §1.5.3), degrees',
      velocities:
        'v_LSR (kinematic LSR: 20 km/s toward α = 18h, δ = +30° B1900), radio convention, km/s',
      separation: 'great-circle separation, Vincenty formula (Vincenty 1975)',
      rows: '1-based data rows of each file as uploaded (header lines not counted)',
      exportColumns:
        'links: catalog_a, row_a, catalog_b, row_b, separation_arcsec, delta_v_kms, complex_id, catalog_a_name, catalog_b_name, … then a_*, b_* of each side; sources: catalog_id, catalog_name, row, … With columns=original, every uploaded column follows as a_<column>, b_<column> (links) or <catalog>_<column> (sources), text exactly as uploaded, empty where a row’s catalog has no such column; a name already taken gets _2.',
    },
    exportPrecision: {
      rule: 'shortest decimal that reads back as the stored double, rounded half away from zero to the decimal places of its quantity, trailing zeros dropped (docs/methods.md, Exports)',
      decimals: EXPORT_PRECISION_TEXT,
    },
    methods: [
      'Candidate pairs from a k-d tree over (l, b) (kdbush), widened by 1/cos b and split at l = 0°/360°; caps near the poles; every pair decided by its exact separation.',
      'Radius fixed, or k·(r_A + r_B) with a floor, position errors added in quadrature; velocity window fixed or k·√(σ_A² + σ_B²).',
      'Complexes: connected components of the links, by union–find (Tarjan & van Leeuwen 1984).',
      'Chance links: the match repeated with catalog A rotated in longitude by each offset; expected chance links = mean over offsets; reliability per link = 1 − N_chance/N_real in its separation bin (common practice).',
    ],
    references: [
      'ESA 1997, The Hipparcos and Tycho Catalogues, ESA SP-1200, Vol. 1, §1.5.3',
      'Vincenty, T. 1975, Survey Review 23, 88',
      'Tarjan, R. E. & van Leeuwen, J. 1984, J. ACM 31, 245',
    ],
  };
}
