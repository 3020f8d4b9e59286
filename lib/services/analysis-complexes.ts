import { and, desc, eq, sql } from 'drizzle-orm';
import { db, type Tx } from '@/db/client';
import { analyses, analysisComplexes, complexes } from '@/db/schema';
import type { ComplexRow, DistanceChoice } from '@/lib/ordering';
import type { ComplexAnalysisJson } from '@/lib/schemas/analyses';

/** Rows per INSERT: 13 values each keeps a statement well under the placeholder limit. */
const INSERT_CHUNK = 1000;

type AnalysisComplexRow = typeof analysisComplexes.$inferInsert;

const finiteOrNull = (x: number | null | undefined) =>
  x !== null && x !== undefined && Number.isFinite(x) ? x : null;

/**
 * The stored rows of an analysis's complexes (distances in kpc: median, 68 % and 95 % interval
 * of the Monte Carlo draws; offset from the ridge positive ahead in the sense of rotation).
 * A complex id that is not a non-negative integer is a RangeError: it names no stored complex.
 */
export function analysisComplexRows(
  analysisId: string,
  runId: string,
  rows: readonly ComplexRow[],
): AnalysisComplexRow[] {
  return rows.map((r) => {
    const complexId = Number(r.id);
    if (!Number.isInteger(complexId) || complexId < 0 || String(complexId) !== r.id)
      throw new RangeError(`analysisComplexRows: complex id "${r.id}" is not a stored complex id`);
    return {
      analysisId,
      runId,
      complexId,
      distKpc: finiteOrNull(r.distKpc),
      distLoKpc: finiteOrNull(r.distLoKpc),
      distHiKpc: finiteOrNull(r.distHiKpc),
      distCi95LoKpc: finiteOrNull(r.distCi95?.[0]),
      distCi95HiKpc: finiteOrNull(r.distCi95?.[1]),
      pNear: finiteOrNull(r.pNear),
      distanceChoice: r.choice,
      arm: r.arm,
      perpOffsetKpc: finiteOrNull(r.perpOffsetKpc),
      used: r.used,
    };
  });
}

/**
 * Writes an analysis's complexes in multi-row inserts, inside the caller's transaction (the one
 * that marks the analysis done, so a crash leaves none of them visible). Rows of an earlier,
 * interrupted attempt at the same analysis are replaced.
 */
export async function writeAnalysisComplexes(
  tx: Tx,
  analysisId: string,
  runId: string,
  rows: readonly ComplexRow[],
) {
  const values = analysisComplexRows(analysisId, runId, rows);
  await tx.delete(analysisComplexes).where(eq(analysisComplexes.analysisId, analysisId));
  for (let i = 0; i < values.length; i += INSERT_CHUNK)
    await tx.insert(analysisComplexes).values(values.slice(i, i + INSERT_CHUNK));
}

export type LatestAnalysis = { id: string; finishedAt: string };

/** The run's most recently finished done analysis, or null when it has none. */
export async function latestDoneAnalysis(runId: string): Promise<LatestAnalysis | null> {
  const [a] = await db
    .select({ id: analyses.id, finishedAt: analyses.finishedAt, createdAt: analyses.createdAt })
    .from(analyses)
    .where(and(eq(analyses.runId, runId), eq(analyses.status, 'done')))
    .orderBy(desc(analyses.finishedAt), desc(analyses.createdAt), desc(analyses.id))
    .limit(1);
  return a ? { id: a.id, finishedAt: (a.finishedAt ?? a.createdAt).toISOString() } : null;
}

/**
 * The join condition from `complexes` to the rows of analysis `analysisId` (null: no analysis,
 * and the join matches nothing), for a LEFT JOIN.
 */
export function analysisComplexesOn(analysisId: string | null) {
  return analysisId === null
    ? sql`FALSE`
    : and(
        eq(analysisComplexes.analysisId, analysisId),
        eq(analysisComplexes.complexId, complexes.id),
      )!;
}

export function complexAnalysisJson(
  latest: LatestAnalysis | null,
  row: typeof analysisComplexes.$inferSelect | null,
): ComplexAnalysisJson | null {
  if (!latest || !row) return null;
  const lo = row.distCi95LoKpc;
  const hi = row.distCi95HiKpc;
  return {
    id: latest.id,
    finishedAt: latest.finishedAt,
    distKpc: row.distKpc,
    distLoKpc: row.distLoKpc,
    distHiKpc: row.distHiKpc,
    distCi95: lo !== null && hi !== null ? [lo, hi] : null,
    pNear: row.pNear,
    choice: row.distanceChoice as DistanceChoice,
    arm: row.arm,
    perpOffsetKpc: row.perpOffsetKpc,
    used: !!row.used,
  };
}
