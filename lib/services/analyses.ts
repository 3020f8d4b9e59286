import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import type { RowDataPacket } from 'mysql2';
import { db, pool, type Tx } from '@/db/client';
import {
  analyses,
  auditLog,
  catalogs,
  complexes,
  distanceOverrides,
  jobs,
  linkRuns,
  users,
} from '@/db/schema';
import { ARM_MODEL_PRESETS } from '@/lib/astro/arms';
import { ROTATION_CURVE_PRESETS } from '@/lib/astro/rotation-curves';
import { newId } from '@/lib/auth/secrets';
import { HttpError, notFound } from '@/lib/http/errors';
import type { DistanceOverride } from '@/lib/schemas/distance-override';
import {
  runOrderingAnalysis,
  type OrderingComplex,
  type OrderingMember,
  type OrderingResult,
} from '@/lib/ordering';
import { writeAnalysisComplexes } from './analysis-complexes';
import { rowsTableName } from './catalog-tables';
import { requireDoneRun } from './link-runs';
import { orderingSettings } from '@/lib/analysis-settings';
import { analysisSchema, type AnalysisParams, type AnalysisPatch } from '@/lib/schemas/analyses';
import type { ArchivedFilter } from '@/lib/schemas/catalogs';
import { analysisLabel, archivedCondition, auditLifecycle } from './record-lifecycle';
import type { ExternalAnalysisJson } from './external-analyses';

export { analysisSchema, type AnalysisParams } from '@/lib/schemas/analyses';

export function armPresets() {
  return {
    presets: Object.entries(ARM_MODEL_PRESETS).map(([key, p]) => ({
      key,
      label: p.label,
      source: p.source,
      R0Kpc: p.R0Kpc,
      arms: p.arms,
    })),
    curves: ROTATION_CURVE_PRESETS,
  };
}

export async function startAnalysis(projectId: string, userId: string, params: AnalysisParams) {
  const run = await requireDoneRun(params.runId);
  if (run.projectId !== projectId)
    throw new HttpError(400, 'unknown_run', 'runId: no such link run in this project.');
  orderingSettings(params);
  const id = newId();
  await db.transaction(async (tx) => {
    const [job] = await tx
      .insert(jobs)
      .values({ kind: 'analysis', projectId, payload: { analysisId: id }, createdBy: userId });
    await tx.insert(analyses).values({
      id,
      projectId,
      runId: params.runId,
      params,
      jobId: Number(job.insertId),
      createdBy: userId,
    });
  });
  return { id, status: 'queued' as const };
}

/** Reads a run's complexes with their members' canonical columns, and any distance overrides. */
async function loadComplexes(runId: string, catalogIds: string[]): Promise<OrderingComplex[]> {
  const byId = new Map<number, OrderingComplex>();
  const [ids] = await pool().query<RowDataPacket[]>(
    'SELECT id FROM complexes WHERE run_id = ? ORDER BY id',
    [runId],
  );
  for (const r of ids)
    byId.set(Number(r.id), { id: String(r.id), members: [], distanceOverride: null });
  const kinds = await db
    .select({ id: catalogs.id, kind: catalogs.kind })
    .from(catalogs)
    .where(inArray(catalogs.id, catalogIds));
  for (const catalogId of catalogIds) {
    const kind = kinds.find((k) => k.id === catalogId)?.kind ?? 'other';
    const [rows] = await pool().query<RowDataPacket[]>({
      sql: `SELECT m.complex_id, s.l, s.b, s.v, s.v_err_kms, s.dist_kpc, s.dist_err_kpc
            FROM complex_members m JOIN \`${rowsTableName(catalogId)}\` s ON s.\`row\` = m.\`row\`
            WHERE m.run_id = ? AND m.catalog_id = ?`,
      values: [runId, catalogId],
      rowsAsArray: true,
    });
    const nan = (x: unknown) => (x === null ? NaN : Number(x));
    for (const r of rows as unknown as unknown[][]) {
      const member: OrderingMember = {
        kind,
        lDeg: Number(r[1]),
        bDeg: Number(r[2]),
        vLsrKms: nan(r[3]),
        vErrKms: nan(r[4]),
        distKpc: nan(r[5]),
        distErrKpc: nan(r[6]),
      };
      byId.get(Number(r[0]))?.members.push(member);
    }
  }
  const overrides = await db
    .select()
    .from(distanceOverrides)
    .where(eq(distanceOverrides.runId, runId));
  for (const o of overrides) {
    const c = byId.get(o.complexId);
    if (c) c.distanceOverride = { distKpc: o.distKpc, note: o.note ?? undefined };
  }
  return [...byId.values()];
}

/**
 * The link radius of a run (arcsec): the fixed radius, or for a scaled radius its floor and the
 * widest link the run made.
 */
async function linkRadiusArcsec(
  runId: string,
  params: Record<string, unknown>,
): Promise<[number, number] | null> {
  const radius = params.radius as
    { mode?: string; arcsec?: number; minArcsec?: number } | undefined;
  if (radius?.mode === 'fixed' && typeof radius.arcsec === 'number')
    return [radius.arcsec, radius.arcsec];
  const [rows] = await pool().query<RowDataPacket[]>(
    'SELECT MAX(sep_arcsec) AS widest FROM links WHERE run_id = ?',
    [runId],
  );
  const widest = Number(rows[0]?.widest);
  if (!(widest > 0)) return null;
  return [Math.min(radius?.minArcsec ?? widest, widest), widest];
}

/** Runs an analysis job; the analysis turns `done` last, with its whole result in one write. */
export async function executeAnalysis(analysisId: string, progress: (f: number) => Promise<void>) {
  const [a] = await db.select().from(analyses).where(eq(analyses.id, analysisId));
  if (!a) throw new Error(`analysis ${analysisId} no longer exists`);
  // Milky-Way analyses always read a link run; only external-galaxy ones may have none.
  if (!a.runId) throw new Error(`analysis ${analysisId} has no link run`);
  await db
    .update(analyses)
    .set({ status: 'running', error: null })
    .where(eq(analyses.id, analysisId));
  const run = await requireDoneRun(a.runId);
  const params = analysisSchema.parse(a.params);
  const input = await loadComplexes(a.runId, run.catalogIds);
  const radius = await linkRadiusArcsec(a.runId, run.params);
  await progress(0.1);
  let last = 0;
  const result = runOrderingAnalysis(input, orderingSettings(params, radius), (f) => {
    if (Date.now() - last > 500) {
      last = Date.now();
      void progress(0.1 + 0.85 * f).catch(() => undefined);
    }
  });
  await db.transaction(async (tx) => {
    await writeAnalysisComplexes(tx, analysisId, run.id, result.complexes);
    await markAnalysisDone(tx, analysisId, result);
  });
}

/** The last write of an analysis job: status done with its whole result, in one statement. */
export async function markAnalysisDone(tx: Tx | typeof db, analysisId: string, result: object) {
  await tx
    .update(analyses)
    .set({
      status: 'done',
      progress: 1,
      result: result as Record<string, unknown>,
      finishedAt: sql`NOW(3)`,
    })
    .where(eq(analyses.id, analysisId));
}

export async function failAnalysis(analysisId: string, reason: string) {
  await db
    .update(analyses)
    .set({ status: 'failed', error: reason.slice(0, 2000), result: null, finishedAt: sql`NOW(3)` })
    .where(eq(analyses.id, analysisId));
}

type AnalysisRow = typeof analyses.$inferSelect;

function analysisJson(
  a: AnalysisRow,
  extra: { runName: string | null; creatorName: string | null; progress?: number },
) {
  const result = a.status === 'done' ? (a.result as Record<string, unknown> | null) : null;
  return {
    id: a.id,
    kind: a.kind,
    name: analysisLabel({ name: a.name, kind: a.kind, runName: extra.runName }),
    customName: a.name,
    note: a.note,
    archivedAt: a.archivedAt?.toISOString() ?? null,
    runId: a.runId,
    catalogIds: a.catalogIds ?? null,
    runName: extra.runName,
    status: a.status,
    progress: a.status === 'done' ? 1 : (extra.progress ?? a.progress),
    params: a.params,
    error: a.error,
    createdAt: a.createdAt.toISOString(),
    finishedAt: a.finishedAt?.toISOString() ?? null,
    createdBy: a.createdBy ? { id: a.createdBy, name: extra.creatorName ?? '' } : null,
    result,
    classes: result?.classes ?? null,
  };
}

export async function listAnalyses(projectId: string, archived: ArchivedFilter = 'exclude') {
  const rows = await db
    .select({ a: analyses, runName: linkRuns.name, creatorName: users.name })
    .from(analyses)
    .leftJoin(linkRuns, eq(linkRuns.id, analyses.runId))
    .leftJoin(users, eq(users.id, analyses.createdBy))
    .where(and(eq(analyses.projectId, projectId), archivedCondition(analyses.archivedAt, archived)))
    .orderBy(desc(analyses.createdAt));
  return rows.map(({ a, runName, creatorName }) => {
    const full = analysisJson(a, { runName, creatorName });
    return {
      id: full.id,
      kind: full.kind,
      name: full.name,
      customName: full.customName,
      note: full.note,
      archivedAt: full.archivedAt,
      runId: full.runId,
      catalogIds: full.catalogIds,
      runName: full.runName,
      status: full.status,
      progress: full.progress,
      params: full.params,
      error: full.error,
      createdAt: full.createdAt,
      finishedAt: full.finishedAt,
      createdBy: full.createdBy,
      summary: a.status === 'done' && a.result ? analysisSummary(a) : null,
    };
  });
}

/** The list's one-line summary: the headline numbers of either kind of analysis. */
function analysisSummary(a: AnalysisRow) {
  if (a.kind === 'external-galaxy') {
    const r = a.result as Partial<ExternalAnalysisJson>;
    return {
      patternSpeedKmsKpc: r.fit?.patternSpeedKmsKpc ?? null,
      timescaleMyr: r.fit?.timescaleMyr ?? null,
      nullTestPValue: r.nullTest?.pValue ?? null,
    };
  }
  const r = a.result as Partial<OrderingResult>;
  return {
    youngMinusGasKpc: r.youngMinusGas?.medianOffsetKpc ?? null,
    youngMinusGasCi95: r.youngMinusGas?.ci95 ?? null,
    patternSpeedKmsKpc: r.patternFit?.patternSpeedKmsKpc ?? null,
    timescaleMyr: r.patternFit?.timescaleMyr ?? null,
  };
}

export async function getAnalysis(analysisId: string) {
  const [x] = await db
    .select({
      a: analyses,
      runName: linkRuns.name,
      creatorName: users.name,
      jobProgress: jobs.progress,
    })
    .from(analyses)
    .leftJoin(linkRuns, eq(linkRuns.id, analyses.runId))
    .leftJoin(users, eq(users.id, analyses.createdBy))
    .leftJoin(jobs, eq(jobs.id, analyses.jobId))
    .where(eq(analyses.id, analysisId));
  if (!x) throw notFound('Analysis');
  return analysisJson(x.a, {
    runName: x.runName,
    creatorName: x.creatorName,
    progress: x.jobProgress ?? undefined,
  });
}

export async function analysisProject(analysisId: string) {
  const [a] = await db
    .select({ projectId: analyses.projectId })
    .from(analyses)
    .where(eq(analyses.id, analysisId));
  if (!a) throw notFound('Analysis');
  return a.projectId;
}

/** Renames, describes, archives or restores an analysis; one audit row lists what changed. */
export async function updateAnalysis(analysisId: string, userId: string, patch: AnalysisPatch) {
  const [a] = await db.select().from(analyses).where(eq(analyses.id, analysisId));
  if (!a) throw notFound('Analysis');
  const set: Partial<typeof analyses.$inferInsert> = {};
  const changes: Record<string, unknown> = {};
  if (patch.name !== undefined && (patch.name || null) !== a.name)
    set.name = changes.name = patch.name || null;
  if (patch.note !== undefined && (patch.note || null) !== a.note)
    set.note = changes.note = patch.note || null;
  if (patch.archived !== undefined && patch.archived !== (a.archivedAt !== null)) {
    set.archivedAt = patch.archived ? new Date() : null;
    changes.archived = patch.archived;
  }
  if (Object.keys(set).length) {
    await db.update(analyses).set(set).where(eq(analyses.id, analysisId));
    await auditLifecycle({
      projectId: a.projectId,
      userId,
      action: 'analysis.update',
      subject: analysisId,
      detail: { name: a.name, changes },
    });
  }
  return getAnalysis(analysisId);
}

/** Deletes a finished analysis with its placements of complexes (by foreign key) and its job. */
export async function deleteAnalysis(analysisId: string, userId: string) {
  const a = await getAnalysis(analysisId);
  if (a.status === 'queued' || a.status === 'running')
    throw new HttpError(409, 'analysis_active', `The analysis is ${a.status}; wait for it to end.`);
  const [row] = await db
    .select({ projectId: analyses.projectId, jobId: analyses.jobId })
    .from(analyses)
    .where(eq(analyses.id, analysisId));
  await db.transaction(async (tx) => {
    await tx.delete(analyses).where(eq(analyses.id, analysisId));
    if (row.jobId) await tx.delete(jobs).where(eq(jobs.id, row.jobId));
  });
  await auditLifecycle({
    projectId: row.projectId,
    userId,
    action: 'analysis.delete',
    subject: analysisId,
    detail: { name: a.name, runId: a.runId },
  });
}

/** Sets (or clears, with null) an editor's distance for a complex; recorded in the audit log. */
export async function setDistanceOverride(
  runId: string,
  complexId: number,
  userId: string,
  input: DistanceOverride,
) {
  const run = await requireDoneRun(runId);
  const [c] = await db
    .select({ id: complexes.id })
    .from(complexes)
    .where(and(eq(complexes.runId, runId), eq(complexes.id, complexId)));
  if (!c) throw notFound('Complex');
  if (input.distKpc === null) {
    await db
      .delete(distanceOverrides)
      .where(and(eq(distanceOverrides.runId, runId), eq(distanceOverrides.complexId, complexId)));
  } else {
    await db
      .insert(distanceOverrides)
      .values({ runId, complexId, distKpc: input.distKpc, note: input.note || null, setBy: userId })
      .onDuplicateKeyUpdate({
        set: {
          distKpc: input.distKpc,
          note: input.note || null,
          setBy: userId,
          setAt: sql`NOW(3)`,
        },
      });
  }
  await db.insert(auditLog).values({
    projectId: run.projectId,
    userId,
    action: 'complex.distance',
    subject: `${runId}:${complexId}`,
    detail: { distKpc: input.distKpc, note: input.note },
  });
  return { distance: input.distKpc === null ? null : { distKpc: input.distKpc, note: input.note } };
}
