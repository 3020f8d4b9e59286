import { eq, inArray, isNotNull, isNull, or, sql, type SQL } from 'drizzle-orm';
import type { MySqlColumn } from 'drizzle-orm/mysql-core';
import type { ResultSetHeader } from 'mysql2';
import { db } from '@/db/client';
import { analyses, auditLog, jobs, linkRuns } from '@/db/schema';
import type { ArchivedFilter, CatalogDependents, Dependent } from '@/lib/schemas/catalogs';

/** The SQL condition of an `archived` list filter on a table's `archived_at` column. */
export function archivedCondition(col: MySqlColumn, filter: ArchivedFilter): SQL | undefined {
  if (filter === 'include') return undefined;
  return filter === 'only' ? isNotNull(col) : isNull(col);
}

/** One audit row per rename, note, archive or delete of a catalog, run or analysis. */
export async function auditLifecycle(entry: {
  projectId: string;
  userId: string;
  action: string;
  subject: string;
  detail: Record<string, unknown>;
}) {
  await db.insert(auditLog).values(entry);
}

/** The name a list shows for an analysis: the user's, or what it was run on. */
export function analysisLabel(a: {
  name: string | null;
  kind: string;
  runName: string | null;
}): string {
  if (a.name) return a.name;
  const what = a.kind === 'external-galaxy' ? 'External-galaxy analysis' : 'Ordering analysis';
  return a.runName ? `${what} of ${a.runName}` : `${what} of catalogs`;
}

/** The analyses that read a run, with the names a refused delete lists. */
export async function runAnalyses(runId: string): Promise<(Dependent & { status: string })[]> {
  const rows = await db
    .select({
      id: analyses.id,
      name: analyses.name,
      kind: analyses.kind,
      status: analyses.status,
      runName: linkRuns.name,
    })
    .from(analyses)
    .leftJoin(linkRuns, eq(linkRuns.id, analyses.runId))
    .where(eq(analyses.runId, runId));
  return rows.map((a) => ({ id: a.id, name: analysisLabel(a), status: a.status }));
}

/** Runs that link a catalog, and analyses that read it directly or through one of those runs. */
export async function catalogDependents(catalogId: string): Promise<CatalogDependents> {
  const usesCatalog = (col: typeof linkRuns.catalogIds | typeof analyses.catalogIds) =>
    sql`JSON_CONTAINS(${col}, JSON_QUOTE(${catalogId}))`;
  const runs = await db
    .select({ id: linkRuns.id, name: linkRuns.name })
    .from(linkRuns)
    .where(usesCatalog(linkRuns.catalogIds));
  const runIds = runs.map((r) => r.id);
  const rows = await db
    .select({ id: analyses.id, name: analyses.name, kind: analyses.kind, runName: linkRuns.name })
    .from(analyses)
    .leftJoin(linkRuns, eq(linkRuns.id, analyses.runId))
    .where(
      runIds.length
        ? or(usesCatalog(analyses.catalogIds), inArray(analyses.runId, runIds))
        : usesCatalog(analyses.catalogIds),
    );
  return { runs, analyses: rows.map((a) => ({ id: a.id, name: analysisLabel(a) })) };
}

/** Rows deleted per statement, so no one statement holds locks on a big run for long. */
const DELETE_CHUNK = 20_000;

/** Per-run tables with no foreign key to the run (the matcher writes them in bulk). */
const RUN_TABLES = ['links', 'complexes', 'complex_members'] as const;

/**
 * Removes a run and everything of it. The run row goes first, in one transaction with its
 * analyses (whose placements, like the run's distance overrides, follow by foreign key) and
 * jobs, so no page ever shows a run with part of its links; the bulk tables follow in chunks.
 */
export async function purgeRun(runId: string, analysisIds: string[]) {
  const [run] = await db
    .select({ jobId: linkRuns.jobId })
    .from(linkRuns)
    .where(eq(linkRuns.id, runId));
  const analysisJobs = analysisIds.length
    ? await db
        .select({ jobId: analyses.jobId })
        .from(analyses)
        .where(inArray(analyses.id, analysisIds))
    : [];
  const jobIds = [run?.jobId, ...analysisJobs.map((a) => a.jobId)].filter(
    (j): j is number => typeof j === 'number',
  );
  await db.transaction(async (tx) => {
    if (analysisIds.length) await tx.delete(analyses).where(inArray(analyses.id, analysisIds));
    await tx.delete(linkRuns).where(eq(linkRuns.id, runId));
    if (jobIds.length) await tx.delete(jobs).where(inArray(jobs.id, jobIds));
  });
  for (const table of RUN_TABLES) {
    for (;;) {
      const [res] = (await db.execute(
        sql`DELETE FROM ${sql.identifier(table)} WHERE run_id = ${runId} LIMIT ${DELETE_CHUNK}`,
      )) as unknown as [ResultSetHeader];
      if (res.affectedRows < DELETE_CHUNK) break;
    }
  }
}
