import fs from 'node:fs';
import { sql, type SQL } from 'drizzle-orm';
import { z } from 'zod';
import { pool } from '@/db/client';
import { withStatementTimeout, type LimitedDb } from '@/db/statement-timeout';
import { HttpError } from '@/lib/http/errors';
import { csvLine } from '@/lib/export/csv';
import { formatDecimals } from '@/lib/export/decimals';
import { EXPORT_DECIMALS } from '@/lib/export/precision';
import type { RowDataPacket } from 'mysql2';
import { optionalQueryNumber, queryPaging } from '@/lib/schemas/query';
import { catalogState, pointsPath } from './catalogs';
import { rowsTable, rowsTableName } from './catalog-tables';

/** Canonical columns a table may sort on, each backed by an index of the catalog's rows table. */
const SORTABLE = {
  row: 'row',
  name: 'name',
  l: 'l',
  b: 'b',
  v: 'v',
  radiusArcsec: 'radius_arcsec',
  lineWidthKms: 'line_width_kms',
  distKpc: 'dist_kpc',
} as const;

const num = optionalQueryNumber;

export const rowsQuerySchema = z.object({
  page: queryPaging(1, Number.MAX_SAFE_INTEGER, 1),
  pageSize: queryPaging(1, 500, 50),
  sort: z.enum(Object.keys(SORTABLE) as [keyof typeof SORTABLE]).default('row'),
  dir: z.enum(['asc', 'desc']).default('asc'),
  q: z.string().trim().max(128).optional(),
  lMin: num,
  lMax: num,
  bMin: num,
  bMax: num,
  vMin: num,
  vMax: num,
});

export type RowsQuery = z.infer<typeof rowsQuerySchema>;

async function assertReady(catalogId: string) {
  const c = await catalogState(catalogId);
  if (c.status !== 'ready') {
    throw new HttpError(
      409,
      'not_ready',
      `The catalog is ${c.status}; its rows are available once it is ready.`,
    );
  }
  return c;
}

/** The filters of a rows query as one SQL condition (`1 = 1` when there are none). */
function rowsWhere(q: RowsQuery): { whereSql: SQL; filtered: boolean } {
  const where: SQL[] = [];
  if (q.q) where.push(sql`name LIKE ${`%${q.q.replace(/[%_\\]/g, (m) => `\\${m}`)}%`}`);
  if (q.lMin !== undefined && q.lMax !== undefined && q.lMin > q.lMax) {
    // From 340° to 20°, say: the range runs through l = 0°.
    where.push(sql`(l >= ${q.lMin} OR l <= ${q.lMax})`);
  } else {
    if (q.lMin !== undefined) where.push(sql`l >= ${q.lMin}`);
    if (q.lMax !== undefined) where.push(sql`l <= ${q.lMax}`);
  }
  if (q.bMin !== undefined) where.push(sql`b >= ${q.bMin}`);
  if (q.bMax !== undefined) where.push(sql`b <= ${q.bMax}`);
  if (q.vMin !== undefined) where.push(sql`v >= ${q.vMin}`);
  if (q.vMax !== undefined) where.push(sql`v <= ${q.vMax}`);
  return {
    whereSql: where.length ? sql.join(where, sql` AND `) : sql`1 = 1`,
    filtered: !!where.length,
  };
}

/**
 * The SQL of one page of rows. The page's row numbers are found first in the sort column's
 * index alone (each secondary index also holds the primary key `row`, so the index covers
 * "sort column, row"); only those rows are then read whole. With OFFSET over whole rows,
 * MariaDB instead read and sorted the entire table for a deep page. Given the row count of an
 * unfiltered table, a page in its far half is counted from the other end of the index, so the
 * walk is never longer than half the table; (column, row) is a total order, so reversed it is
 * exactly the same sequence backwards, and the outer ORDER BY puts the page back.
 */
export function rowsPageSql(catalogId: string, q: RowsQuery, rowCount?: number): SQL {
  const table = rowsTable(catalogId);
  const { whereSql } = rowsWhere(q);
  const column = sql.raw(`\`${SORTABLE[q.sort]}\``);
  const offset = (q.page - 1) * q.pageSize;
  const fromEnd = rowCount !== undefined && offset > rowCount / 2 && offset < rowCount;
  const walk = fromEnd
    ? {
        desc: q.dir === 'asc',
        limit: Math.min(q.pageSize, rowCount - offset),
        offset: Math.max(0, rowCount - offset - q.pageSize),
      }
    : { desc: q.dir === 'desc', limit: q.pageSize, offset };
  const walkDir = sql.raw(walk.desc ? 'DESC' : 'ASC');
  const dir = sql.raw(q.dir === 'desc' ? 'DESC' : 'ASC');
  return sql`
    SELECT t.\`row\`, t.line, t.name, t.l, t.b, t.v, t.radius_arcsec AS radiusArcsec,
           t.pos_err_arcsec AS posErrArcsec, t.v_err_kms AS vErrKms, t.line_width_kms AS lineWidthKms,
           t.dist_kpc AS distKpc, t.dist_err_kpc AS distErrKpc
    FROM (SELECT \`row\` FROM ${table} WHERE ${whereSql}
          ORDER BY ${column} ${walkDir}, \`row\` ${walkDir}
          LIMIT ${walk.limit} OFFSET ${walk.offset}) page
    JOIN ${table} t ON t.\`row\` = page.\`row\`
    ORDER BY t.${column} ${dir}, t.\`row\` ${dir}`;
}

/**
 * One page of canonical rows, sorted and filtered in SQL under the request statement limit
 * (503 past it).
 */
export async function catalogRowsPage(catalogId: string, q: RowsQuery) {
  const c = await assertReady(catalogId);
  const { whereSql, filtered } = rowsWhere(q);
  return withStatementTimeout('page of rows', async (conn) => {
    const sqlOfPage = rowsPageSql(catalogId, q, filtered ? undefined : c.rowCount);
    const [rows] = (await conn.execute(sqlOfPage)) as unknown as [Record<string, unknown>[]];
    // Unfiltered, the total is the catalog's row count; counting a million rows per page is waste.
    const total = filtered ? await countRows(conn, rowsTable(catalogId), whereSql) : c.rowCount;
    return { rows, total, page: q.page, pageSize: q.pageSize };
  });
}

async function countRows(conn: LimitedDb, table: SQL, whereSql: SQL) {
  const [[count]] = (await conn.execute(
    sql`SELECT COUNT(*) AS n FROM ${table} WHERE ${whereSql}`,
  )) as unknown as [[{ n: number }]];
  return Number(count.n);
}

/** The plot points file (Float32 l, b, v triples) of a ready catalog. */
export async function catalogPoints(catalogId: string) {
  const c = await assertReady(catalogId);
  const file = pointsPath(catalogId);
  if (!fs.existsSync(file))
    throw new HttpError(
      404,
      'not_found',
      'The plot points of this catalog are missing; ingest it again.',
    );
  return { path: file, count: c.rowCount, bytes: fs.statSync(file).size };
}

const EXPORT_CHUNK = 5000;

/**
 * The normalised catalog as CSV lines. Readiness is checked before the first line (409 while
 * the response can still say so, rather than a stream that breaks off); the lines are then read
 * in primary-key order a chunk at a time so memory stays flat.
 */
export async function catalogCsv(catalogId: string): Promise<AsyncGenerator<string>> {
  const c = await assertReady(catalogId);
  const [[named]] = await pool().query<RowDataPacket[]>('SELECT name FROM catalogs WHERE id = ?', [
    catalogId,
  ]);
  return catalogCsvLines(catalogId, String(named.name), c.columns ?? []);
}

const D = EXPORT_DECIMALS;
/** Decimal places of each canonical double (docs/methods.md, "Exports"). */
const rounded = (x: unknown, decimals: number) =>
  x === null || x === undefined ? null : formatDecimals(Number(x), decimals);

/**
 * The catalog's name follows the canonical columns, then the original columns, prefixed
 * `orig_`, exactly as uploaded.
 */
async function* catalogCsvLines(
  catalogId: string,
  catalogName: string,
  columns: string[],
): AsyncGenerator<string> {
  const original = columns.map((n) => `orig_${n}`);
  yield csvLine([
    'row',
    'line',
    'name',
    'l_deg',
    'b_deg',
    'v_lsr_kms',
    'radius_arcsec',
    'pos_err_arcsec',
    'v_err_kms',
    'line_width_sigma_kms',
    'dist_kpc',
    'dist_err_kpc',
    'catalog_name',
    ...original,
  ]);
  let after = 0;
  for (;;) {
    const [rows] = await pool().query<RowDataPacket[]>(
      `SELECT \`row\`, line, name, l, b, v, radius_arcsec, pos_err_arcsec, v_err_kms, line_width_kms, dist_kpc, dist_err_kpc, original FROM \`${rowsTableName(catalogId)}\` WHERE \`row\` > ? ORDER BY \`row\` LIMIT ?`,
      [after, EXPORT_CHUNK],
    );
    if (!rows.length) return;
    let out = '';
    for (const r of rows) {
      const orig = (
        typeof r.original === 'string' ? JSON.parse(r.original) : r.original
      ) as string[];
      out += csvLine([
        r.row,
        r.line,
        r.name,
        rounded(r.l, D.positionDeg),
        rounded(r.b, D.positionDeg),
        rounded(r.v, D.velocityKms),
        rounded(r.radius_arcsec, D.angleArcsec),
        rounded(r.pos_err_arcsec, D.angleArcsec),
        rounded(r.v_err_kms, D.velocityKms),
        rounded(r.line_width_kms, D.velocityKms),
        rounded(r.dist_kpc, D.lengthKpc),
        rounded(r.dist_err_kpc, D.lengthKpc),
        catalogName,
        ...(orig ?? []),
      ]);
    }
    yield out;
    after = rows[rows.length - 1].row;
  }
}
