import { and, eq, inArray, isNotNull, isNull, ne, sql, type SQL } from 'drizzle-orm';
import type { z } from 'zod';
import type { RowDataPacket } from 'mysql2';
import { db, pool } from '@/db/client';
import { withStatementTimeout, type LimitedDb } from '@/db/statement-timeout';
import {
  analysisComplexes,
  auditLog,
  catalogs,
  complexes,
  distanceOverrides,
  users,
} from '@/db/schema';
import { HttpError, notFound } from '@/lib/http/errors';
import {
  analysisComplexesOn,
  complexAnalysisJson,
  latestDoneAnalysis,
  type LatestAnalysis,
} from './analysis-complexes';
import {
  BULK_REVIEW_LIMIT,
  complexesQuerySchema,
  complexIdSchema,
  reviewSchema,
  type BulkReview,
  type ComplexesQuery,
  type ComplexFilter,
  type ComplexList,
  type ComplexNeighbours,
  type ComplexSort,
  type ReviewProgress,
} from '@/lib/schemas/complexes';
import { rowsTableName } from './catalog-tables';
import { requireDoneRun, runProject } from './link-runs';

/** Sort keys and their columns; `dist` and `arm` are the latest done analysis's placement. */
const SORTS: Record<ComplexSort, string> = {
  id: 'complexes.id',
  size: 'complexes.size',
  l: 'complexes.l',
  b: 'complexes.b',
  v: 'complexes.v',
  maxSepArcsec: 'complexes.max_sep_arcsec',
  maxDvKms: 'complexes.max_dv_kms',
  reliability: 'complexes.reliability',
  review: 'complexes.review',
  dist: 'analysis_complexes.dist_kpc',
  arm: 'analysis_complexes.arm',
};

const KIND_COLUMN = { hi: 'n_hi', co: 'n_co', hii: 'n_hii', ob: 'n_ob', other: 'n_other' } as const;

export { complexesQuerySchema, complexIdSchema, reviewSchema, type ComplexesQuery };

/**
 * The SQL condition of a list's filters on one run, and whether it (or the sort) reads the
 * latest analysis's row, which must then be LEFT JOINed.
 */
function listWhere(runId: string, f: ComplexFilter, sort: ComplexSort = 'id') {
  const where: SQL[] = [eq(complexes.runId, runId)];
  if (f.minSize !== undefined) where.push(sql`${complexes.size} >= ${f.minSize}`);
  if (f.maxSize !== undefined) where.push(sql`${complexes.size} <= ${f.maxSize}`);
  for (const k of f.classes) where.push(sql`${sql.raw(KIND_COLUMN[k])} > 0`);
  if (f.review === 'unreviewed') where.push(sql`${complexes.review} IS NULL`);
  else if (f.review) where.push(eq(complexes.review, f.review));
  if (f.maxSepArcsec !== undefined) where.push(sql`${complexes.maxSepArcsec} <= ${f.maxSepArcsec}`);
  if (f.maxDvKms !== undefined) where.push(sql`${complexes.maxDvKms} <= ${f.maxDvKms}`);
  if (f.minReliability !== undefined)
    where.push(sql`${complexes.reliability} >= ${f.minReliability}`);
  if (f.minDistKpc !== undefined) where.push(sql`${analysisComplexes.distKpc} >= ${f.minDistKpc}`);
  if (f.maxDistKpc !== undefined) where.push(sql`${analysisComplexes.distKpc} <= ${f.maxDistKpc}`);
  if (f.arm !== undefined) where.push(eq(analysisComplexes.arm, f.arm));
  if (f.q) {
    const like = `%${f.q.replace(/[%_\\]/g, (m) => `\\${m}`)}%`;
    where.push(
      sql`${complexes.id} IN (SELECT complex_id FROM complex_members WHERE run_id = ${runId} AND name LIKE ${like})`,
    );
  }
  const needsAnalysis =
    sort === 'dist' ||
    sort === 'arm' ||
    f.minDistKpc !== undefined ||
    f.maxDistKpc !== undefined ||
    f.arm !== undefined;
  return { where: and(...where)!, filtered: where.length > 1, needsAnalysis };
}

type ComplexRow = typeof complexes.$inferSelect & { reviewerName?: string | null };
type AnalysisRow = typeof analysisComplexes.$inferSelect | null;

/** A complex as the API returns it, with its place in the latest done analysis (or null). */
export function complexJson(c: ComplexRow, latest: LatestAnalysis | null, placed: AnalysisRow) {
  const counts = { hi: c.nHi, co: c.nCo, hii: c.nHii, ob: c.nOb, other: c.nOther };
  return {
    id: String(c.id),
    size: c.size,
    linkCount: c.linkCount,
    counts,
    classes: Object.entries(counts)
      .filter(([, n]) => n > 0)
      .map(([k]) => k),
    l: c.l,
    b: c.b,
    v: c.v,
    maxSepArcsec: c.maxSepArcsec,
    maxDvKms: c.maxDvKms,
    reliability: c.reliability,
    overCap: !!c.overCap,
    name: c.name,
    review: c.review,
    reviewNote: c.reviewNote,
    reviewedBy: c.reviewedBy ? { id: c.reviewedBy, name: c.reviewerName ?? '' } : null,
    reviewedAt: c.reviewedAt?.toISOString() ?? null,
    analysis: complexAnalysisJson(latest, placed),
  };
}

/**
 * One page of a run's complexes, filtered and sorted in SQL on indexed columns; each carries its
 * row of the run's latest done analysis (found once, LEFT JOINed on its id). Runs under the
 * request statement limit (503 past it).
 */
export async function complexesPage(runId: string, q: ComplexesQuery) {
  const run = await requireDoneRun(runId);
  const latest = await latestDoneAnalysis(runId);
  const { where: whereSql, filtered, needsAnalysis } = listWhere(runId, q, q.sort);
  const dir = sql.raw(q.dir === 'desc' ? 'DESC' : 'ASC');
  const order = [sql`${sql.raw(SORTS[q.sort])} ${dir}`, sql`complexes.id ${dir}`];
  const summary = (run.summary ?? {}) as { complexes?: number };
  return withStatementTimeout('list of complexes', async (conn) => {
    // The page's ids first, from the sort column's (run, column, id) index where the filters
    // allow; only those complexes are then read whole with their reviewer and analysis row.
    const idsFrom = conn.select({ id: complexes.id }).from(complexes).$dynamic();
    const sortedIds = needsAnalysis
      ? idsFrom.leftJoin(analysisComplexes, analysisComplexesOn(latest?.id ?? null))
      : idsFrom;
    const ids = (
      await sortedIds
        .where(whereSql)
        .orderBy(...order)
        .limit(q.pageSize)
        .offset((q.page - 1) * q.pageSize)
    ).map((r) => r.id);
    const rows = ids.length
      ? await conn
          .select({ c: complexes, reviewerName: users.name, placed: analysisComplexes })
          .from(complexes)
          .leftJoin(users, eq(users.id, complexes.reviewedBy))
          .leftJoin(analysisComplexes, analysisComplexesOn(latest?.id ?? null))
          .where(and(eq(complexes.runId, runId), inArray(complexes.id, ids)))
          .orderBy(...order)
      : [];
    const total = filtered
      ? await countWhere(conn, whereSql, needsAnalysis, latest?.id ?? null)
      : Number(summary.complexes ?? 0);
    return {
      complexes: rows.map((r) =>
        complexJson({ ...r.c, reviewerName: r.reviewerName }, latest, r.placed),
      ),
      total,
      page: q.page,
      pageSize: q.pageSize,
    };
  });
}

/** How many complexes match a condition (with the analysis row joined when it reads it). */
async function countWhere(
  conn: LimitedDb,
  where: SQL,
  needsAnalysis: boolean,
  analysisId: string | null,
) {
  const from = conn
    .select({ n: sql<number>`COUNT(*)` })
    .from(complexes)
    .$dynamic();
  const joined = needsAnalysis
    ? from.leftJoin(analysisComplexes, analysisComplexesOn(analysisId))
    : from;
  return Number((await joined.where(where))[0].n);
}

/** Reviewed complexes out of all, for the whole run and for a list's filters. */
export async function reviewProgress(runId: string, f: ComplexFilter): Promise<ReviewProgress> {
  await requireDoneRun(runId);
  const latest = await latestDoneAnalysis(runId);
  return withStatementTimeout('review progress', async (conn) => {
    const count = async (filter: ComplexFilter) => {
      const w = listWhere(runId, filter);
      const from = conn
        .select({ total: sql<number>`COUNT(*)`, reviewed: sql<number>`COUNT(${complexes.review})` })
        .from(complexes)
        .$dynamic();
      const joined = w.needsAnalysis
        ? from.leftJoin(analysisComplexes, analysisComplexesOn(latest?.id ?? null))
        : from;
      const [r] = await joined.where(w.where);
      return { reviewed: Number(r.reviewed), total: Number(r.total) };
    };
    const arms = latest
      ? (
          await conn
            .selectDistinct({ arm: analysisComplexes.arm })
            .from(analysisComplexes)
            .where(
              and(eq(analysisComplexes.analysisId, latest.id), isNotNull(analysisComplexes.arm)),
            )
            .orderBy(analysisComplexes.arm)
        ).map((r) => r.arm as string)
      : [];
    return { run: await count({ classes: [] }), filter: await count(f), arms };
  });
}

/**
 * Where a complex sits in a filtered, sorted list: the complexes just before and after it, the
 * next one not yet reviewed (from the start again past the end), its place and the list's size.
 * Works by keyset on (sort value, id) against the complex's own sort value, so the complex need
 * not match the filters (it may just have left "not reviewed"). NULLs come first, as MariaDB
 * sorts them in ascending order.
 */
export async function complexNeighbours(
  runId: string,
  complexId: number,
  list: ComplexList,
): Promise<ComplexNeighbours> {
  await requireDoneRun(runId);
  const latest = await latestDoneAnalysis(runId);
  const on = analysisComplexesOn(latest?.id ?? null);
  const key = sql.raw(SORTS[list.sort]);
  return withStatementTimeout('neighbours of a complex', async (conn) => {
    const [self] = await conn
      .select({ id: complexes.id })
      .from(complexes)
      .where(and(eq(complexes.runId, runId), eq(complexes.id, complexId)));
    if (!self) throw notFound('Complex');
    const cur = sql`(SELECT ${key} FROM complexes LEFT JOIN analysis_complexes ON ${on} WHERE complexes.run_id = ${runId} AND complexes.id = ${complexId})`;
    const after = sql`((${key} <=> ${cur} AND complexes.id > ${complexId}) OR (${cur} IS NULL AND ${key} IS NOT NULL) OR ${key} > ${cur})`;
    const before = sql`((${key} <=> ${cur} AND complexes.id < ${complexId}) OR (${key} IS NULL AND ${cur} IS NOT NULL) OR ${key} < ${cur})`;
    const asc = [sql`${key} ASC`, sql`complexes.id ASC`];
    const desc = [sql`${key} DESC`, sql`complexes.id DESC`];
    const forward =
      list.dir === 'asc' ? { cond: after, order: asc } : { cond: before, order: desc };
    const backward =
      list.dir === 'asc' ? { cond: before, order: desc } : { cond: after, order: asc };
    const w = listWhere(runId, list, list.sort);
    const first = async (cond: SQL, order: SQL[]) => {
      const [r] = await conn
        .select({ id: complexes.id })
        .from(complexes)
        .leftJoin(analysisComplexes, on)
        .where(and(w.where, cond))
        .orderBy(...order)
        .limit(1);
      return r ? String(r.id) : null;
    };
    const unreviewed = isNull(complexes.review);
    const nextUnreviewed =
      (await first(and(forward.cond, unreviewed)!, forward.order)) ??
      (await first(and(unreviewed, ne(complexes.id, complexId))!, forward.order));
    const count = (cond: SQL) => countWhere(conn, and(w.where, cond)!, true, latest?.id ?? null);
    const inList = (await count(eq(complexes.id, complexId))) > 0;
    return {
      prev: await first(backward.cond, backward.order),
      next: await first(forward.cond, forward.order),
      nextUnreviewed,
      position: inList ? (await count(backward.cond)) + 1 : null,
      total: await count(sql`TRUE`),
    };
  });
}

/**
 * Gives every complex of a filter (or of a list of ids) one verdict and one note, in one
 * transaction, with one audit row per complex whose verdict or note changed. At most
 * BULK_REVIEW_LIMIT complexes may match; more is a 400 that says so before anything changes.
 */
export async function bulkReview(runId: string, userId: string, input: BulkReview) {
  const run = await requireDoneRun(runId);
  const latest = input.filter ? await latestDoneAnalysis(runId) : null;
  const w = input.filter
    ? listWhere(runId, input.filter)
    : {
        where: and(eq(complexes.runId, runId), inArray(complexes.id, input.complexIds!))!,
        needsAnalysis: false,
      };
  const note = input.note || null;
  return db.transaction(async (tx) => {
    const from = tx
      .select({ id: complexes.id, review: complexes.review, note: complexes.reviewNote })
      .from(complexes)
      .$dynamic();
    const joined = w.needsAnalysis
      ? from.leftJoin(analysisComplexes, analysisComplexesOn(latest?.id ?? null))
      : from;
    const matched = await joined
      .where(w.where)
      .orderBy(complexes.id)
      .limit(BULK_REVIEW_LIMIT + 1)
      .for('update');
    if (matched.length > BULK_REVIEW_LIMIT)
      throw new HttpError(
        400,
        'too_many_complexes',
        `A bulk review changes at most ${BULK_REVIEW_LIMIT} complexes; more than that match. Narrow the filters.`,
        { limit: BULK_REVIEW_LIMIT },
      );
    if (input.complexIds) {
      const found = new Set(matched.map((m) => m.id));
      const missing = [...new Set(input.complexIds)].filter((id) => !found.has(id));
      if (missing.length)
        throw new HttpError(
          404,
          'not_found',
          `No complex ${missing.slice(0, 5).join(', ')}${missing.length > 5 ? ' …' : ''} in this run.`,
          { missing },
        );
    }
    const changed = matched
      .filter((m) => m.review !== input.review || (m.note ?? null) !== note)
      .map((m) => m.id);
    if (changed.length) {
      await tx
        .update(complexes)
        .set({
          review: input.review,
          reviewNote: note,
          reviewedBy: userId,
          reviewedAt: sql`NOW(3)`,
        })
        .where(and(eq(complexes.runId, runId), inArray(complexes.id, changed)));
      await tx.insert(auditLog).values(
        changed.map((id) => ({
          projectId: run.projectId,
          userId,
          action: 'complex.review',
          subject: `${runId}:${id}`,
          detail: { review: input.review, note: input.note, bulk: true },
        })),
      );
    }
    return { matched: matched.length, changed: changed.length };
  });
}

/** The project of a complex's run, for its page (404 when the run or the complex is missing). */
export async function complexProject(runId: string, complexId: number): Promise<string> {
  const projectId = await runProject(runId);
  const [c] = await db
    .select({ id: complexes.id })
    .from(complexes)
    .where(and(eq(complexes.runId, runId), eq(complexes.id, complexId)));
  if (!c) throw notFound('Complex');
  return projectId;
}

async function loadComplex(runId: string, complexId: number) {
  const latest = await latestDoneAnalysis(runId);
  const [r] = await db
    .select({ c: complexes, reviewerName: users.name, placed: analysisComplexes })
    .from(complexes)
    .leftJoin(users, eq(users.id, complexes.reviewedBy))
    .leftJoin(analysisComplexes, analysisComplexesOn(latest?.id ?? null))
    .where(and(eq(complexes.runId, runId), eq(complexes.id, complexId)));
  if (!r) throw notFound('Complex');
  return complexJson({ ...r.c, reviewerName: r.reviewerName }, latest, r.placed);
}

/** A complex with its members (canonical and original columns), links and review history. */
export async function complexDetail(runId: string, complexId: number) {
  await requireDoneRun(runId);
  const complex = await loadComplex(runId, complexId);
  const [memberRows] = await pool().query<RowDataPacket[]>(
    'SELECT catalog_id AS catalogId, `row` FROM complex_members WHERE run_id = ? AND complex_id = ? ORDER BY catalog_id, `row`',
    [runId, complexId],
  );
  const catIds = [...new Set(memberRows.map((m) => m.catalogId as string))];
  const cats = catIds.length
    ? await db
        .select({
          id: catalogs.id,
          name: catalogs.name,
          kind: catalogs.kind,
          columns: catalogs.columns,
        })
        .from(catalogs)
        .where(inArray(catalogs.id, catIds))
    : [];
  const members = [];
  for (const cat of cats) {
    const rowsOf = memberRows.filter((m) => m.catalogId === cat.id).map((m) => Number(m.row));
    const [rows] = await pool().query<RowDataPacket[]>(
      `SELECT \`row\`, line, name, l, b, v, radius_arcsec AS radiusArcsec, pos_err_arcsec AS posErrArcsec, v_err_kms AS vErrKms,
              line_width_kms AS lineWidthKms, dist_kpc AS distKpc, dist_err_kpc AS distErrKpc, original
       FROM \`${rowsTableName(cat.id)}\` WHERE \`row\` IN (?) ORDER BY \`row\``,
      [rowsOf],
    );
    for (const r of rows) {
      const values = (typeof r.original === 'string' ? JSON.parse(r.original) : []) as string[];
      const original = Object.fromEntries(
        (cat.columns ?? []).map((name, i) => [name, values[i] ?? '']),
      );
      members.push({ catalogId: cat.id, catalogName: cat.name, kind: cat.kind, ...r, original });
    }
  }
  const [linkRows] = await pool().query<RowDataPacket[]>(
    `SELECT catalog_a AS catalogA, row_a AS rowA, catalog_b AS catalogB, row_b AS rowB, sep_arcsec AS sepArcsec, dv_kms AS dvKms,
            reliability, radius_arcsec AS radiusArcsec FROM links WHERE run_id = ? AND complex_id = ? ORDER BY id`,
    [runId, complexId],
  );
  const history = await db
    .select({
      action: auditLog.action,
      detail: auditLog.detail,
      at: auditLog.at,
      userId: auditLog.userId,
      name: users.name,
    })
    .from(auditLog)
    .leftJoin(users, eq(users.id, auditLog.userId))
    .where(
      and(eq(auditLog.action, 'complex.review'), eq(auditLog.subject, `${runId}:${complexId}`)),
    )
    .orderBy(sql`${auditLog.at} DESC`);
  const [override] = await db
    .select({
      distKpc: distanceOverrides.distKpc,
      note: distanceOverrides.note,
      setAt: distanceOverrides.setAt,
      name: users.name,
    })
    .from(distanceOverrides)
    .leftJoin(users, eq(users.id, distanceOverrides.setBy))
    .where(and(eq(distanceOverrides.runId, runId), eq(distanceOverrides.complexId, complexId)));
  return {
    complex: {
      ...complex,
      members,
      links: linkRows,
      distanceOverride: override
        ? {
            distKpc: override.distKpc,
            note: override.note ?? '',
            by: override.name ?? '',
            at: override.setAt.toISOString(),
          }
        : null,
      history: history.map((h) => ({
        action: h.action,
        review: (h.detail as { review?: string } | null)?.review ?? null,
        note: (h.detail as { note?: string } | null)?.note ?? '',
        by: h.userId ? { id: h.userId, name: h.name ?? '' } : null,
        at: h.at.toISOString(),
      })),
    },
  };
}

/** Records a review of a complex; who and when go to the audit log as well. */
export async function reviewComplex(
  runId: string,
  complexId: number,
  userId: string,
  input: z.infer<typeof reviewSchema>,
) {
  const run = await requireDoneRun(runId);
  const res = await db
    .update(complexes)
    .set({
      review: input.review,
      reviewNote: input.note || null,
      reviewedBy: userId,
      reviewedAt: sql`NOW(3)`,
    })
    .where(and(eq(complexes.runId, runId), eq(complexes.id, complexId)));
  if (res[0].affectedRows === 0) throw new HttpError(404, 'not_found', 'Complex was not found.');
  await db.insert(auditLog).values({
    projectId: run.projectId,
    userId,
    action: 'complex.review',
    subject: `${runId}:${complexId}`,
    detail: { review: input.review, note: input.note },
  });
  return { complex: await loadComplex(runId, complexId) };
}
