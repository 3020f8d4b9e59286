import { and, asc, eq, sql } from 'drizzle-orm';
import { z } from 'zod';
import { db } from '@/db/client';
import { auditLog, invitations, jobs, projectMembers, projects } from '@/db/schema';
import { newId } from '@/lib/auth/secrets';
import type { ProjectRole } from '@/lib/auth/roles';
import { notFound } from '@/lib/http/errors';
import { projectTargetSchema } from '@/lib/schemas/analyses';
import { plainText } from '@/lib/schemas/text';
import { PROJECT_DELETE_JOB } from './project-purge';

export const projectNameSchema = plainText({ max: 200 }).min(1, 'Give the project a name.');
export const createProjectSchema = z.object({
  name: projectNameSchema,
  description: plainText({ max: 2000, multiline: true }).optional(),
});
/** The most JSON characters a project's settings may hold. */
export const SETTINGS_LIMIT_CHARS = 64 * 1024;
export const updateProjectSchema = z
  .object({
    name: projectNameSchema.optional(),
    description: plainText({ max: 2000, multiline: true }).nullable().optional(),
    /** Free-form settings of the pages; `target` (Milky Way or an external galaxy) is checked. */
    settings: z
      .looseObject({ target: projectTargetSchema.optional() })
      // Settings travel with every project list; a page's settings are a few KB.
      .refine((s) => JSON.stringify(s).length <= SETTINGS_LIMIT_CHARS, {
        message: `Settings may hold at most ${SETTINGS_LIMIT_CHARS / 1024} KB of JSON.`,
      })
      .optional(),
  })
  .strict();

export type ProjectSummary = {
  id: string;
  name: string;
  description: string | null;
  role: ProjectRole;
  createdAt: string;
  updatedAt: string;
  settings: Record<string, unknown>;
};

const toSummary = (p: typeof projects.$inferSelect, role: ProjectRole): ProjectSummary => ({
  id: p.id,
  name: p.name,
  description: p.description,
  role,
  settings: p.settings ?? {},
  createdAt: p.createdAt.toISOString(),
  updatedAt: p.updatedAt.toISOString(),
});

export async function listProjectsFor(userId: string): Promise<ProjectSummary[]> {
  const rows = await db
    .select({ p: projects, role: projectMembers.role })
    .from(projectMembers)
    .innerJoin(projects, eq(projects.id, projectMembers.projectId))
    .where(eq(projectMembers.userId, userId))
    .orderBy(asc(projects.name));
  return rows.map((r) => toSummary(r.p, r.role));
}

export async function createProject(
  userId: string,
  input: z.infer<typeof createProjectSchema>,
): Promise<ProjectSummary> {
  const id = newId();
  await db.transaction(async (tx) => {
    await tx.insert(projects).values({
      id,
      name: input.name,
      description: input.description ?? null,
      createdBy: userId,
      settings: {},
    });
    await tx.insert(projectMembers).values({ projectId: id, userId, role: 'owner' });
    await tx
      .insert(auditLog)
      .values({ projectId: id, userId, action: 'project.create', subject: id });
  });
  return getProject(id, 'owner');
}

export async function getProject(id: string, role: ProjectRole): Promise<ProjectSummary> {
  const [p] = await db.select().from(projects).where(eq(projects.id, id));
  if (!p) throw notFound('Project');
  return toSummary(p, role);
}

/** The caller's role in a project, or null when not a member (or no such project). */
export async function roleInProject(
  projectId: string,
  userId: string,
): Promise<ProjectRole | null> {
  const [m] = await db
    .select({ role: projectMembers.role })
    .from(projectMembers)
    .where(and(eq(projectMembers.projectId, projectId), eq(projectMembers.userId, userId)));
  return m?.role ?? null;
}

export async function updateProject(
  id: string,
  userId: string,
  input: z.infer<typeof updateProjectSchema>,
  role: ProjectRole,
): Promise<ProjectSummary> {
  const set: Partial<typeof projects.$inferInsert> = {};
  if (input.name !== undefined) set.name = input.name;
  if (input.description !== undefined) set.description = input.description;
  if (input.settings !== undefined) {
    const current = await getProject(id, role);
    set.settings = { ...current.settings, ...input.settings };
  }
  if (Object.keys(set).length) {
    await db.update(projects).set(set).where(eq(projects.id, id));
    await db.insert(auditLog).values({
      projectId: id,
      userId,
      action: 'project.update',
      subject: id,
      detail: { fields: Object.keys(set) },
    });
  }
  return getProject(id, role);
}

/**
 * Deletes a project: it disappears for everyone at once (members and invitations go, so every
 * request about it answers 404 and no list shows it), its queued jobs are cancelled and its
 * running ones asked to stop, and a `project-delete` job removes its data (purgeProject). That
 * job carries no project id, so the project's foreign keys do not take it along.
 */
export async function deleteProject(id: string, userId: string): Promise<void> {
  await db.transaction(async (tx) => {
    await tx.delete(projectMembers).where(eq(projectMembers.projectId, id));
    await tx.delete(invitations).where(eq(invitations.projectId, id));
    await tx
      .update(jobs)
      .set({ status: 'cancelled', error: 'The project was deleted.', finishedAt: sql`NOW(3)` })
      .where(and(eq(jobs.projectId, id), eq(jobs.status, 'queued')));
    await tx
      .update(jobs)
      .set({ cancelRequested: true })
      .where(and(eq(jobs.projectId, id), eq(jobs.status, 'running')));
    await tx
      .insert(jobs)
      .values({ kind: PROJECT_DELETE_JOB, payload: { projectId: id }, createdBy: userId });
  });
}
