import { and, eq, inArray, sql, type SQL } from 'drizzle-orm';
import { z } from 'zod';
import type { RowDataPacket } from 'mysql2';
import { db, pool } from '@/db/client';
import { withStatementTimeout } from '@/db/statement-timeout';
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
import { rowsTableName } from './catalog-tables';
import { requireDoneRun } from './link-runs';

/** Sort keys and their columns; `dist` is the latest done analysis's median distance. */
const SORTS = {
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
} as const;

const KIND_COLUMN = { hi: 'n_hi', co: 'n_co', hii: 'n_hii', ob: 'n_ob', other: 'n_other' } as const;
const num = z.coerce.number().finite().optional();

export const complexesQuerySchema = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(500).default(50),
  sort: z.enum(Object.keys(SORTS) as [keyof typeof SORTS]).default('id'),
  dir: z.enum(['asc', 'desc']).default('asc'),
  minSize: num,
  maxSize: num,
  classes: z
    .string()
    .optional()
    .transform((s) => (s ? s.split(',').filter(Boolean) : []))
    .pipe(z.array(z.enum(['hi', 'co', 'hii', 'ob', 'other']))),
  review: z.enum(['accepted', 'doubtful', 'rejected', 'unreviewed']).optional(),
  maxSepArcsec: num,
  maxDvKms: num,
  minReliability: num,
  q: z.string().trim().max(128).optional(),
});

export type ComplexesQuery = z.infer<typeof complexesQuerySchema>;

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
  const where: SQL[] = [eq(complexes.runId, runId)];
  if (q.minSize !== undefined) where.push(sql`${complexes.size} >= ${q.minSize}`);
  if (q.maxSize !== undefined) where.push(sql`${complexes.size} <= ${q.maxSize}`);
  for (const k of q.classes) where.push(sql`${sql.raw(KIND_COLUMN[k])} > 0`);
  if (q.review === 'unreviewed') where.push(sql`${complexes.review} IS NULL`);
  else if (q.review) where.push(eq(complexes.review, q.review));
  if (q.maxSepArcsec !== undefined) where.push(sql`${complexes.maxSepArcsec} <= ${q.maxSepArcsec}`);
  if (q.maxDvKms !== undefined) where.push(sql`${complexes.maxDvKms} <= ${q.maxDvKms}`);
  if (q.minReliability !== undefined)
    where.push(sql`${complexes.reliability} >= ${q.minReliability}`);
  if (q.q) {
    const like = `%${q.q.replace(/[%_\\]/g, (m) => `\\${m}`)}%`;
    where.push(
      sql`${complexes.id} IN (SELECT complex_id FROM complex_members WHERE run_id = ${runId} AND name LIKE ${like})`,
    );
  }
  const whereSql = and(...where)!;
  const dir = sql.raw(q.dir === 'desc' ? 'DESC' : 'ASC');
  const order = [sql`${sql.raw(SORTS[q.sort])} ${dir}`, sql`complexes.id ${dir}`];
  const summary = (run.summary ?? {}) as { complexes?: number };
  return withStatementTimeout('list of complexes', async (conn) => {
    // The page's ids first, from the sort column's (run, column, id) index where the filters
    // allow; only those complexes are then read whole with their reviewer and analysis row.
    const idsFrom = conn.select({ id: complexes.id }).from(complexes).$dynamic();
    const sortedIds =
      q.sort === 'dist'
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
    const total =
      where.length === 1
        ? Number(summary.complexes ?? 0)
        : Number(
            (
              await conn
                .select({ n: sql<number>`COUNT(*)` })
                .from(complexes)
                .where(whereSql)
            )[0].n,
          );
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

export const complexIdSchema = z.coerce.number().int().min(0);

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

export const reviewSchema = z.object({
  review: z.enum(['accepted', 'doubtful', 'rejected']).nullable(),
  note: z.string().max(4000).default(''),
});

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
