import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import { db } from '@/db/client';
import { withStatementTimeout } from '@/db/statement-timeout';
import { catalogs, jobs, linkRuns, projects, users } from '@/db/schema';
import { newId } from '@/lib/auth/secrets';
import { HttpError, notFound } from '@/lib/http/errors';
import type { ArchivedFilter } from '@/lib/schemas/catalogs';
import type { RunPatch } from '@/lib/schemas/link-runs';
import { projectTargetSchema } from '@/lib/schemas/analyses';
import type { LinkRunParams } from '@/lib/schemas/link-run-request';
import { requestCancel } from './jobs';
import { archivedCondition, auditLifecycle, purgeRun, runAnalyses } from './record-lifecycle';

export { linkRunSchema, type LinkRunParams } from '@/lib/schemas/link-run-request';

export type RunCatalog = { id: string; name: string; kind: string; rowCount: number };

/** The chosen catalogs, in the order given; each must be a ready catalog of this project. */
export async function runCatalogs(projectId: string, ids: string[]): Promise<RunCatalog[]> {
  if (new Set(ids).size !== ids.length)
    throw new HttpError(400, 'duplicate_catalog', 'A catalog is chosen twice.');
  const rows = await db
    .select({
      id: catalogs.id,
      name: catalogs.name,
      kind: catalogs.kind,
      status: catalogs.status,
      rowCount: catalogs.rowCount,
      projectId: catalogs.projectId,
      archivedAt: catalogs.archivedAt,
    })
    .from(catalogs)
    .where(inArray(catalogs.id, ids));
  return ids.map((id, i) => {
    const c = rows.find((r) => r.id === id);
    if (!c || c.projectId !== projectId)
      throw new HttpError(
        400,
        'unknown_catalog',
        `catalogIds[${i}]: no such catalog in this project.`,
      );
    if (c.status !== 'ready')
      throw new HttpError(
        409,
        'catalog_not_ready',
        `catalogIds[${i}]: catalog "${c.name}" is ${c.status}, not ready.`,
      );
    if (c.archivedAt)
      throw new HttpError(
        409,
        'catalog_archived',
        `catalogIds[${i}]: catalog "${c.name}" is archived; restore it to use it in new work.`,
      );
    return { id: c.id, name: c.name, kind: c.kind, rowCount: c.rowCount };
  });
}

/** Records the run (immutable parameters) and its job; the worker does the rest. */
export async function startLinkRun(projectId: string, userId: string, params: LinkRunParams) {
  const chosen = await runCatalogs(projectId, params.catalogIds);
  const id = newId();
  const name = params.name || `${chosen.map((c) => c.name).join(' × ')}`.slice(0, 200);
  await db.transaction(async (tx) => {
    const [job] = await tx
      .insert(jobs)
      .values({ kind: 'link-run', projectId, payload: { runId: id }, createdBy: userId });
    await tx.insert(linkRuns).values({
      id,
      projectId,
      name,
      params: { ...params, name },
      catalogIds: params.catalogIds,
      jobId: Number(job.insertId),
      createdBy: userId,
    });
  });
  return { id, status: 'queued' as const };
}

export type RunJson = {
  id: string;
  projectId: string;
  name: string;
  note: string | null;
  archivedAt: string | null;
  status: 'queued' | 'running' | 'done' | 'failed' | 'cancelled';
  progress: number;
  params: Record<string, unknown>;
  catalogs: { id: string; name: string; kind: string }[];
  summary: Record<string, unknown> | null;
  error: string | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  createdBy: { id: string; name: string } | null;
};

type CatalogNames = Map<string, { id: string; name: string; kind: string }>;

/** The project's context for its runs: catalog names and, for an external galaxy, its distance. */
type RunContext = { cats: CatalogNames; galaxyDistanceMpc: number | null };

async function runContext(projectId: string): Promise<RunContext> {
  const [p] = await db
    .select({ settings: projects.settings })
    .from(projects)
    .where(eq(projects.id, projectId));
  const target = projectTargetSchema.safeParse(p?.settings?.target);
  const galaxyDistanceMpc =
    target.success && target.data.kind === 'external-galaxy'
      ? target.data.galaxy.distanceMpc
      : null;
  return { cats: await catalogNames(projectId), galaxyDistanceMpc };
}

const ARCSEC_PER_RAD = 206_264.806;

/**
 * The link radius in pc at an external galaxy's distance (small angles): the fixed radius, or
 * for a scaled radius its floor and the widest link, read from the separation histogram.
 */
function radiusPc(
  params: Record<string, unknown>,
  summary: Record<string, unknown>,
  distanceMpc: number,
) {
  const radius = params.radius as { mode?: string; arcsec?: number; minArcsec?: number };
  const edges = (summary.histograms as { separationArcsec?: { edges?: number[] } } | undefined)
    ?.separationArcsec?.edges;
  const [lo, hi] =
    radius?.mode === 'fixed'
      ? [radius.arcsec ?? 0, radius.arcsec ?? 0]
      : [radius?.minArcsec ?? 0, edges?.[edges.length - 1] ?? radius?.minArcsec ?? 0];
  const pcPerArcsec = (distanceMpc * 1e6) / ARCSEC_PER_RAD;
  return { distanceMpc, minPc: lo * pcPerArcsec, maxPc: Math.max(lo, hi) * pcPerArcsec };
}

/** The names and classes of a project's catalogs, read once per request (not once per run). */
async function catalogNames(projectId: string): Promise<CatalogNames> {
  const cats = await db
    .select({ id: catalogs.id, name: catalogs.name, kind: catalogs.kind })
    .from(catalogs)
    .where(eq(catalogs.projectId, projectId));
  return new Map(cats.map((c) => [c.id, c]));
}

type RunRow = {
  r: typeof linkRuns.$inferSelect;
  creatorName: string | null;
  jobProgress: number | null;
};

function toRunJson({ r, creatorName, jobProgress }: RunRow, ctx: RunContext): RunJson {
  const { cats } = ctx;
  // A running job reports progress on its own row; the run's copy is final only once done.
  const progress =
    r.status === 'done' ? 1 : r.status === 'running' ? (jobProgress ?? r.progress) : r.progress;
  return {
    id: r.id,
    projectId: r.projectId,
    name: r.name,
    note: r.note,
    archivedAt: r.archivedAt?.toISOString() ?? null,
    status: r.status,
    progress,
    params: r.params,
    catalogs: r.catalogIds.map(
      (id) => cats.get(id) ?? { id, name: '(deleted catalog)', kind: 'other' },
    ),
    summary: r.status === 'done' && r.summary ? runSummary(r, ctx) : null,
    error: r.error,
    createdAt: r.createdAt.toISOString(),
    startedAt: r.startedAt?.toISOString() ?? null,
    finishedAt: r.finishedAt?.toISOString() ?? null,
    createdBy: r.createdBy ? { id: r.createdBy, name: creatorName ?? '' } : null,
  };
}

/** The stored summary, with the radius in pc when the project's target is an external galaxy. */
function runSummary(r: typeof linkRuns.$inferSelect, ctx: RunContext): Record<string, unknown> {
  const summary = r.summary ?? {};
  if (ctx.galaxyDistanceMpc === null) return summary;
  return { ...summary, radiusPc: radiusPc(r.params, summary, ctx.galaxyDistanceMpc) };
}

const runColumns = { r: linkRuns, creatorName: users.name, jobProgress: jobs.progress };

export async function listRuns(
  projectId: string,
  archived: ArchivedFilter = 'exclude',
): Promise<RunJson[]> {
  const rows = await db
    .select(runColumns)
    .from(linkRuns)
    .leftJoin(users, eq(users.id, linkRuns.createdBy))
    .leftJoin(jobs, eq(jobs.id, linkRuns.jobId))
    .where(and(eq(linkRuns.projectId, projectId), archivedCondition(linkRuns.archivedAt, archived)))
    .orderBy(desc(linkRuns.createdAt));
  const ctx = await runContext(projectId);
  return rows.map((x) => toRunJson(x, ctx));
}

export async function getRun(runId: string): Promise<RunJson> {
  const [x] = await db
    .select(runColumns)
    .from(linkRuns)
    .leftJoin(users, eq(users.id, linkRuns.createdBy))
    .leftJoin(jobs, eq(jobs.id, linkRuns.jobId))
    .where(eq(linkRuns.id, runId));
  if (!x) throw notFound('Link run');
  return toRunJson(x, await runContext(x.r.projectId));
}

/** The project of a run, for the access check (404 when there is no such run). */
export async function runProject(runId: string): Promise<string> {
  const [r] = await db
    .select({ projectId: linkRuns.projectId })
    .from(linkRuns)
    .where(eq(linkRuns.id, runId));
  if (!r) throw notFound('Link run');
  return r.projectId;
}

export async function requireDoneRun(runId: string) {
  const [r] = await db.select().from(linkRuns).where(eq(linkRuns.id, runId));
  if (!r) throw notFound('Link run');
  if (r.status !== 'done')
    throw new HttpError(
      409,
      'run_not_done',
      `The link run is ${r.status}; its results exist once it is done.`,
    );
  return r;
}

export async function cancelRun(runId: string) {
  const [r] = await db.select().from(linkRuns).where(eq(linkRuns.id, runId));
  if (!r) throw notFound('Link run');
  if (r.status !== 'queued' && r.status !== 'running')
    throw new HttpError(409, 'not_running', `The link run is already ${r.status}.`);
  if (r.jobId) {
    await requestCancel(r.jobId);
    // A queued job is cancelled at once; a running one stops at its next progress report.
    const res = await db
      .update(jobs)
      .set({ status: 'cancelled', finishedAt: sql`NOW(3)` })
      .where(and(eq(jobs.id, r.jobId), eq(jobs.status, 'queued')));
    if (res[0].affectedRows) {
      await db
        .update(linkRuns)
        .set({
          status: 'cancelled',
          error: 'Cancelled before it started.',
          finishedAt: sql`NOW(3)`,
        })
        .where(eq(linkRuns.id, runId));
    }
  }
}

/** Renames, describes, archives or restores a run; one audit row lists what changed. */
export async function updateRun(runId: string, userId: string, patch: RunPatch): Promise<RunJson> {
  const before = await getRun(runId);
  const set: Partial<typeof linkRuns.$inferInsert> = {};
  const changes: Record<string, unknown> = {};
  if (patch.name !== undefined && patch.name !== before.name) set.name = changes.name = patch.name;
  if (patch.note !== undefined && (patch.note || null) !== before.note)
    set.note = changes.note = patch.note || null;
  if (patch.archived !== undefined && patch.archived !== (before.archivedAt !== null)) {
    set.archivedAt = patch.archived ? new Date() : null;
    changes.archived = patch.archived;
  }
  if (Object.keys(set).length === 0) return before;
  await db.update(linkRuns).set(set).where(eq(linkRuns.id, runId));
  await auditLifecycle({
    projectId: before.projectId,
    userId,
    action: 'link-run.update',
    subject: runId,
    detail: { name: before.name, changes },
  });
  return getRun(runId);
}

/**
 * Deletes a finished run with its links, complexes, members, reviews and distances. Analyses
 * that read it make this a 409 listing them, unless `withAnalyses` deletes them too; a run or
 * analysis still working is a 409 as well (cancel it first).
 */
export async function deleteRun(runId: string, userId: string, withAnalyses: boolean) {
  const run = await getRun(runId);
  if (run.status === 'queued' || run.status === 'running')
    throw new HttpError(409, 'run_active', `The link run is ${run.status}; cancel it first.`);
  const dependents = await runAnalyses(runId);
  const working = dependents.filter((a) => a.status === 'queued' || a.status === 'running');
  if (working.length)
    throw new HttpError(
      409,
      'analysis_active',
      `${working.length} analysis(es) of this run are still working; wait for them to finish.`,
      { analyses: working.map(({ id, name }) => ({ id, name })) },
    );
  if (dependents.length && !withAnalyses)
    throw new HttpError(
      409,
      'run_in_use',
      `${dependents.length} analysis(es) read this link run; delete them first, or delete with ?withAnalyses=1 to remove them too.`,
      { analyses: dependents.map(({ id, name }) => ({ id, name })) },
    );
  await purgeRun(
    runId,
    dependents.map((a) => a.id),
  );
  await auditLifecycle({
    projectId: run.projectId,
    userId,
    action: 'link-run.delete',
    subject: runId,
    detail: { name: run.name, analyses: dependents.map(({ id, name }) => ({ id, name })) },
  });
}

/** The same source pair in links `x` and `y`: the columns of the `links_key` index after run_id. */
const sameLink = sql.raw(
  'y.catalog_a = x.catalog_a AND y.row_a = x.row_a AND y.catalog_b = x.catalog_b AND y.row_b = x.row_b',
);

/**
 * How many links of run `runA` run `runB` also has. Each link of A is looked up in B through
 * the `links_key` index (run, source pair), so the work grows with A's links, not A × B. Order
 * and index are forced: MariaDB's statistics cannot tell the index from the primary key's run_id
 * prefix, and that choice scans all of B for every link of A.
 */
export function commonLinksSql(runA: string, runB: string) {
  return sql`SELECT COUNT(*) AS n FROM links x STRAIGHT_JOIN links y FORCE INDEX (links_key)
    ON y.run_id = ${runB} AND ${sameLink}
    WHERE x.run_id = ${runA}`;
}

/** The first 20 links (by id) of run `from` that run `other` lacks, looked up the same way. */
function missingLinksSql(from: string, other: string) {
  return sql`SELECT x.catalog_a AS catalogA, x.row_a AS rowA, x.catalog_b AS catalogB, x.row_b AS rowB,
      x.sep_arcsec AS sepArcsec, x.dv_kms AS dvKms
    FROM links x WHERE x.run_id = ${from}
      AND NOT EXISTS (SELECT 1 FROM links y FORCE INDEX (links_key)
        WHERE y.run_id = ${other} AND ${sameLink})
    ORDER BY x.id LIMIT 20`;
}

/**
 * Links common to two runs, and those gained (in `b` only) and lost (in `a` only). Its queries
 * run under the request statement limit: past it the comparison answers 503.
 */
export async function compareRuns(runA: string, runB: string) {
  const [a, b] = [await requireDoneRun(runA), await requireDoneRun(runB)];
  if (a.projectId !== b.projectId) throw notFound('Link run');
  const { common, gainedSample, lostSample } = await withStatementTimeout(
    'comparison',
    async (q) => {
      const [[r]] = (await q.execute(commonLinksSql(runA, runB))) as unknown as [[{ n: number }]];
      const sample = async (from: string, other: string) =>
        (
          (await q.execute(missingLinksSql(from, other))) as unknown as [Record<string, unknown>[]]
        )[0];
      return {
        common: Number(r.n),
        gainedSample: await sample(runB, runA),
        lostSample: await sample(runA, runB),
      };
    },
  );
  const sa = (a.summary ?? {}) as { links?: number; complexes?: number };
  const sb = (b.summary ?? {}) as { links?: number; complexes?: number };
  return {
    comparison: {
      a: { id: a.id, links: sa.links ?? 0, complexes: sa.complexes ?? 0 },
      b: { id: b.id, links: sb.links ?? 0, complexes: sb.complexes ?? 0 },
      common,
      gained: (sb.links ?? 0) - common,
      lost: (sa.links ?? 0) - common,
      gainedSample,
      lostSample,
    },
  };
}
