import fs from 'node:fs';
import path from 'node:path';
import { and, asc, desc, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { TRACER_KINDS, catalogRejects, catalogs, jobs, users } from '@/db/schema';
import { newId } from '@/lib/auth/secrets';
import { conflict, HttpError, notFound } from '@/lib/http/errors';
import type { ArchivedFilter } from '@/lib/schemas/catalogs';
import { dropRowsTables } from './catalog-tables';
import { archivedCondition, auditLifecycle, catalogDependents } from './record-lifecycle';
import { checkUpload, receiveUpload, uploadDir } from './uploads';

export type CatalogSummary = {
  id: string;
  projectId: string;
  name: string;
  kind: (typeof TRACER_KINDS)[number];
  status: 'queued' | 'ingesting' | 'ready' | 'failed';
  progress: number;
  rowCount: number;
  rejectedCount: number;
  error: string | null;
  fileName: string;
  fileBytes: number;
  format: string | null;
  policy: 'skip-bad-rows' | 'reject-file';
  createdAt: string;
  readyAt: string | null;
  archivedAt: string | null;
  createdBy: { id: string; name: string } | null;
};

/**
 * Receives an upload, checks it as a whole (readable, has rows, position columns resolvable,
 * mapping fits the columns), records the catalog and its ingest job, and returns at once.
 * A file that fails these checks leaves nothing behind.
 */
export async function createCatalog(
  req: Request,
  projectId: string,
  userId: string,
): Promise<CatalogSummary> {
  const id = newId();
  const dir = uploadDir(id);
  const { fields, file } = await receiveUpload(req, dir);
  try {
    if (!file) throw new HttpError(400, 'no_file', 'Attach the file as the multipart part "file".');
    const input = await checkUpload(fields, file.path);
    const { preview, mapping } = input;
    await db.transaction(async (tx) => {
      const [job] = await tx
        .insert(jobs)
        .values({ kind: 'ingest', projectId, payload: { catalogId: id }, createdBy: userId });
      await tx.insert(catalogs).values({
        id,
        projectId,
        name: input.name,
        kind: input.kind,
        policy: input.policy,
        fileName: file.fileName,
        filePath: file.path,
        fileBytes: file.bytes,
        format: preview.format,
        mapping: mapping as Record<string, unknown>,
        columns: preview.header.columns.map((c) => c.name),
        decimalComma: input.decimalComma,
        assumptions: input.assumptions,
        jobId: Number(job.insertId),
        createdBy: userId,
      });
    });
    return getCatalog(id);
  } catch (e) {
    fs.rmSync(dir, { recursive: true, force: true });
    throw e;
  }
}

const summaryColumns = {
  c: catalogs,
  creatorName: users.name,
};

function toSummary(r: {
  c: typeof catalogs.$inferSelect;
  creatorName: string | null;
}): CatalogSummary {
  const c = r.c;
  return {
    id: c.id,
    projectId: c.projectId,
    name: c.name,
    kind: c.kind,
    status: c.status,
    progress: c.progress,
    rowCount: c.rowCount,
    rejectedCount: c.rejectedCount,
    error: c.error,
    fileName: c.fileName,
    fileBytes: c.fileBytes,
    format: c.format,
    policy: c.policy,
    createdAt: c.createdAt.toISOString(),
    readyAt: c.readyAt?.toISOString() ?? null,
    archivedAt: c.archivedAt?.toISOString() ?? null,
    createdBy: c.createdBy ? { id: c.createdBy, name: r.creatorName ?? '' } : null,
  };
}

export async function listCatalogs(
  projectId: string,
  archived: ArchivedFilter = 'exclude',
): Promise<CatalogSummary[]> {
  const rows = await db
    .select(summaryColumns)
    .from(catalogs)
    .leftJoin(users, eq(users.id, catalogs.createdBy))
    .where(and(eq(catalogs.projectId, projectId), archivedCondition(catalogs.archivedAt, archived)))
    .orderBy(desc(catalogs.createdAt));
  return rows.map(toSummary);
}

export async function getCatalog(id: string): Promise<CatalogSummary> {
  const [r] = await db
    .select(summaryColumns)
    .from(catalogs)
    .leftJoin(users, eq(users.id, catalogs.createdBy))
    .where(eq(catalogs.id, id));
  if (!r) throw notFound('Catalog');
  return toSummary(r);
}

/** The project a catalog belongs to (for the access check), or 404. */
export async function catalogProject(id: string): Promise<string> {
  const [r] = await db
    .select({ projectId: catalogs.projectId })
    .from(catalogs)
    .where(eq(catalogs.id, id));
  if (!r) throw notFound('Catalog');
  return r.projectId;
}

/** What readers of a catalog's rows need to know: one primary-key lookup, no report. */
export async function catalogState(id: string) {
  const [c] = await db
    .select({ status: catalogs.status, rowCount: catalogs.rowCount, columns: catalogs.columns })
    .from(catalogs)
    .where(eq(catalogs.id, id));
  if (!c) throw notFound('Catalog');
  return c;
}

export async function getCatalogDetail(id: string) {
  const summary = await getCatalog(id);
  const [c] = await db
    .select({
      mapping: catalogs.mapping,
      columns: catalogs.columns,
      decimalComma: catalogs.decimalComma,
      assumptions: catalogs.assumptions,
      dataRowCount: catalogs.dataRowCount,
    })
    .from(catalogs)
    .where(eq(catalogs.id, id));
  const rejected = await db
    .select({ line: catalogRejects.line, reason: catalogRejects.reason })
    .from(catalogRejects)
    .where(eq(catalogRejects.catalogId, id))
    .orderBy(asc(catalogRejects.line))
    .limit(1000);
  return {
    ...summary,
    mapping: c?.mapping ?? null,
    columns: c?.columns ?? [],
    decimalComma: c?.decimalComma ?? false,
    assumptions: c?.assumptions ?? [],
    dataRowCount: c?.dataRowCount ?? null,
    rejected,
    // What the delete dialog lists: deleting is refused while any of these read the catalog.
    usedBy: await catalogDependents(id),
  };
}

/**
 * Deletes an unused catalog with its rows and files. One that runs or analyses read is refused
 * (409 listing them): deleting it would leave their members, links and exports without rows;
 * archiving keeps them whole.
 */
export async function deleteCatalog(id: string, userId: string): Promise<void> {
  const c = await getCatalog(id);
  if (c.status === 'ingesting' || c.status === 'queued') {
    throw conflict('This catalog is still being ingested; wait until it is ready or failed.');
  }
  const dependents = await catalogDependents(id);
  if (dependents.runs.length || dependents.analyses.length) {
    throw new HttpError(
      409,
      'catalog_in_use',
      `${dependents.runs.length} link run(s) and ${dependents.analyses.length} analysis(es) use this catalog; delete them first, or archive the catalog to hide it and keep its rows.`,
      dependents,
    );
  }
  await db.delete(catalogs).where(eq(catalogs.id, id));
  await auditLifecycle({
    projectId: c.projectId,
    userId,
    action: 'catalog.delete',
    subject: id,
    detail: { name: c.name },
  });
  await dropRowsTables(id);
  fs.rmSync(uploadDir(id), { recursive: true, force: true });
  fs.rmSync(pointsPath(id), { force: true });
}

/** Archives (hides from lists and new runs) or restores a catalog; its rows stay. */
export async function setCatalogArchived(
  id: string,
  userId: string,
  archived: boolean,
): Promise<CatalogSummary> {
  const c = await getCatalog(id);
  if (archived !== (c.archivedAt !== null)) {
    await db
      .update(catalogs)
      .set({ archivedAt: archived ? new Date() : null })
      .where(eq(catalogs.id, id));
    await auditLifecycle({
      projectId: c.projectId,
      userId,
      action: archived ? 'catalog.archive' : 'catalog.restore',
      subject: id,
      detail: { name: c.name },
    });
  }
  return getCatalog(id);
}

/** Where the plot points of a ready catalog are kept (Float32 l, b, v triples). */
export function pointsPath(id: string) {
  return path.join(/* turbopackIgnore: true */ uploadDir(id), 'points.f32');
}
