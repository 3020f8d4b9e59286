import { inArray } from 'drizzle-orm';
import type { RowDataPacket } from 'mysql2';
import { db, pool } from '@/db/client';
import { catalogs } from '@/db/schema';
import { csvLine } from '@/lib/export/csv';
import { csvLineSql, type CsvSqlKind } from '@/lib/export/csv-sql';
import { votableStream, type VotableField } from '@/lib/export/votable';
import { rowsTableName } from './catalog-tables';
import { requireDoneRun } from './link-runs';
import pkg from '@/package.json';

export type ExportShape = 'links' | 'complexes' | 'sources';

/** A column of an export: its VOTable field, the SQL that reads it and how it becomes CSV. */
interface Column {
  field: VotableField;
  sql: string;
  kind: CsvSqlKind;
}

/**
 * One query's worth of an export, read in ranges of `key` from `lo` to `hi`: `from` holds the
 * tables and a WHERE clause whose `?` are `values`.
 */
interface Segment {
  from: string;
  values: unknown[];
  key: string;
  lo: number;
  hi: number;
}

interface Table {
  columns: Column[];
  segments: Segment[];
  /** Rows per range: bounds each chunk's text (the longest review note is 4 000 characters). */
  chunkRows: number;
}

const col = (
  name: string,
  sql: string,
  kind: CsvSqlKind,
  extra: Partial<VotableField> = {},
): Column => ({
  field: {
    name,
    datatype:
      kind === 'text' || kind === 'time' || kind === 'raw'
        ? 'char'
        : kind === 'boolean'
          ? 'boolean'
          : 'double',
    ...extra,
  },
  sql,
  kind,
});
const intCol = (name: string, sql: string, extra: Partial<VotableField> = {}): Column => ({
  field: { name, datatype: 'int', ...extra },
  sql,
  kind: 'number',
});

/** The segment of `from` between the keys `lo` and `hi`, or nothing when there are no rows. */
function segment(from: string, values: unknown[], key: string, range: RowDataPacket): Segment[] {
  return range.lo === null
    ? []
    : [{ from, values, key, lo: Number(range.lo), hi: Number(range.hi) }];
}

const sourceColumns = (alias: 'a' | 'b'): Column[] => [
  col(`${alias}_name`, `${alias}.name`, 'text'),
  col(`${alias}_l`, `${alias}.l`, 'number'),
  col(`${alias}_b`, `${alias}.b`, 'number'),
  col(`${alias}_v`, `${alias}.v`, 'number'),
];

async function linksTable(runId: string): Promise<Table> {
  const columns: Column[] = [
    col('catalog_a', 'l.catalog_a', 'raw', { ucd: 'meta.id' }),
    intCol('row_a', 'l.row_a', { description: '1-based data row of catalog A as uploaded' }),
    col('catalog_b', 'l.catalog_b', 'raw', { ucd: 'meta.id' }),
    intCol('row_b', 'l.row_b', { description: '1-based data row of catalog B as uploaded' }),
    col('separation_arcsec', 'l.sep_arcsec', 'number', { unit: 'arcsec', ucd: 'pos.angDistance' }),
    col('delta_v_kms', 'l.dv_kms', 'number', { unit: 'km/s', description: 'v_LSR(B) − v_LSR(A)' }),
    intCol('complex_id', 'l.complex_id', { ucd: 'meta.id' }),
    col('reliability', 'l.reliability', 'number', {
      description: '1 − chance/real links at this separation',
    }),
    col('match_radius_arcsec', 'l.radius_arcsec', 'number', { unit: 'arcsec' }),
    ...sourceColumns('a'),
    ...sourceColumns('b'),
  ];
  const [pairs] = await pool().query<RowDataPacket[]>(
    'SELECT catalog_a, catalog_b, MIN(id) AS lo, MAX(id) AS hi FROM links WHERE run_id = ? GROUP BY catalog_a, catalog_b ORDER BY lo',
    [runId],
  );
  const segments: Segment[] = [];
  for (const p of pairs) {
    // Both catalogs' rows are joined on their primary keys; links are read in id ranges.
    const from = `links l JOIN \`${rowsTableName(p.catalog_a)}\` a ON a.\`row\` = l.row_a JOIN \`${rowsTableName(p.catalog_b)}\` b ON b.\`row\` = l.row_b
      WHERE l.run_id = ? AND l.catalog_a = ? AND l.catalog_b = ?`;
    segments.push(...segment(from, [runId, p.catalog_a, p.catalog_b], 'l.id', p));
  }
  return { columns, segments, chunkRows: 10_000 };
}

async function complexesTable(runId: string): Promise<Table> {
  const columns: Column[] = [
    intCol('complex_id', 'c.id', { ucd: 'meta.id' }),
    col('name', 'c.name', 'text', { description: 'name of its first member' }),
    intCol('size', 'c.size'),
    intCol('links', 'c.link_count'),
    intCol('n_hi', 'c.n_hi'),
    intCol('n_co', 'c.n_co'),
    intCol('n_hii', 'c.n_hii'),
    intCol('n_ob', 'c.n_ob'),
    intCol('n_other', 'c.n_other'),
    col('l_deg', 'c.l', 'number', {
      unit: 'deg',
      ucd: 'pos.galactic.lon',
      description: 'centroid',
    }),
    col('b_deg', 'c.b', 'number', {
      unit: 'deg',
      ucd: 'pos.galactic.lat',
      description: 'centroid',
    }),
    col('v_lsr_kms', 'c.v', 'number', {
      unit: 'km/s',
      ucd: 'spect.dopplerVeloc',
      description: 'mean of members with a velocity',
    }),
    col('max_separation_arcsec', 'c.max_sep_arcsec', 'number', { unit: 'arcsec' }),
    col('max_abs_delta_v_kms', 'c.max_dv_kms', 'number', { unit: 'km/s' }),
    col('reliability', 'c.reliability', 'number', {
      description: 'lowest reliability of its links',
    }),
    col('over_cap', 'c.over_cap', 'boolean'),
    col('review', 'c.review', 'text'),
    col('review_note', 'c.review_note', 'text'),
    col('reviewed_at', 'c.reviewed_at', 'time'),
  ];
  const [[range]] = await pool().query<RowDataPacket[]>(
    'SELECT MIN(id) AS lo, MAX(id) AS hi FROM complexes WHERE run_id = ?',
    [runId],
  );
  return {
    columns,
    segments: segment('complexes c WHERE c.run_id = ?', [runId], 'c.id', range),
    chunkRows: 2_000,
  };
}

/** Every source of the run's catalogs with its complex (empty when it has no link). */
async function sourcesTable(runId: string, catalogIds: string[]): Promise<Table> {
  const segments: Segment[] = [];
  for (const cat of catalogIds) {
    // The one-row `k` carries the catalog id into every line (rowsTableName checked it is a UUID).
    const from = `\`${rowsTableName(cat)}\` s JOIN (SELECT '${cat}' AS id) k
      LEFT JOIN complex_members m ON m.run_id = ? AND m.catalog_id = k.id AND m.\`row\` = s.\`row\` WHERE TRUE`;
    const [[range]] = await pool().query<RowDataPacket[]>(
      `SELECT MIN(\`row\`) AS lo, MAX(\`row\`) AS hi FROM \`${rowsTableName(cat)}\``,
    );
    segments.push(...segment(from, [runId], 's.`row`', range));
  }
  const columns: Column[] = [
    col('catalog_id', 'k.id', 'raw', { ucd: 'meta.id' }),
    intCol('row', 's.`row`'),
    col('name', 's.name', 'text'),
    col('l_deg', 's.l', 'number', { unit: 'deg', ucd: 'pos.galactic.lon' }),
    col('b_deg', 's.b', 'number', { unit: 'deg', ucd: 'pos.galactic.lat' }),
    col('v_lsr_kms', 's.v', 'number', { unit: 'km/s', ucd: 'spect.dopplerVeloc' }),
    intCol('complex_id', 'm.complex_id', { ucd: 'meta.id' }),
  ];
  return { columns, segments, chunkRows: 10_000 };
}

async function table(runId: string, shape: ExportShape): Promise<Table> {
  const run = await requireDoneRun(runId);
  if (shape === 'links') return linksTable(runId);
  if (shape === 'complexes') return complexesTable(runId);
  return sourcesTable(runId, run.catalogIds);
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
): AsyncGenerator<string | Uint8Array> {
  const t = await table(runId, shape);
  yield csvLine(t.columns.map((c) => c.field.name));
  const line = csvLineSql(t.columns);
  for await (const piece of ranges(t, async (s, lo, hi) => {
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

/** Rows of a table as arrays of JavaScript values (booleans and times converted). */
async function* tableRows(t: Table): AsyncGenerator<unknown[]> {
  const select = t.columns.map((c) => c.sql).join(', ');
  const kinds = t.columns.map((c) => c.kind);
  for await (const chunk of ranges(t, async (s, lo, hi) => {
    const [rows] = await pool().query({
      sql: `SELECT ${select} FROM ${rangeWhere(s)} ORDER BY ${s.key}`,
      values: [...s.values, lo, hi],
      rowsAsArray: true,
    });
    return rows as unknown as unknown[][];
  })) {
    for (const r of chunk) {
      for (let i = 0; i < r.length; i++) {
        if (kinds[i] === 'boolean' && r[i] !== null) r[i] = !!r[i];
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
): Promise<AsyncGenerator<string>> {
  const t = await table(runId, shape);
  return votableStream({
    resourceName: `lanewise-link-run-${runId}`,
    tableName: shape,
    description: `Lanewise link run ${runId}: ${shape}`,
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
