import fs from 'node:fs';
import { eq, sql } from 'drizzle-orm';
import type { ResultSetHeader } from 'mysql2';
import { db } from '@/db/client';
import { catalogs, linkRuns, projects } from '@/db/schema';
import { dropRowsTables } from './catalog-tables';
import { uploadDir } from './uploads';

export const PROJECT_DELETE_JOB = 'project-delete';

/** Rows deleted per statement, so no one statement holds locks on a big run for long. */
const DELETE_CHUNK = 20_000;

/** Per-run tables with no foreign key to the run (the matcher writes them in bulk). */
const RUN_TABLES = ['links', 'complexes', 'complex_members'] as const;

const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));

/**
 * The project's other jobs end before anything is removed, or what they write (a catalog's
 * rows table, a run's links) would outlive the purge: queued ones are cancelled, running ones
 * asked to stop, and those whose worker stopped beating are cancelled outright.
 */
async function stopProjectJobs(projectId: string, progress: () => Promise<void>) {
  const staleSeconds = Number(process.env.WORKER_STALE_SECONDS ?? 30);
  for (;;) {
    await db.execute(sql`UPDATE jobs SET status = 'cancelled', finished_at = NOW(3),
        error = 'The project was deleted.'
      WHERE project_id = ${projectId} AND (status = 'queued'
        OR (status = 'running' AND heartbeat_at < NOW(3) - INTERVAL ${staleSeconds} SECOND))`);
    await db.execute(
      sql`UPDATE jobs SET cancel_requested = TRUE WHERE project_id = ${projectId} AND status = 'running'`,
    );
    const [[r]] = (await db.execute(
      sql`SELECT COUNT(*) AS n FROM jobs WHERE project_id = ${projectId} AND status = 'running'`,
    )) as unknown as [[{ n: number }]];
    if (Number(r.n) === 0) return;
    await progress();
    await pause(500);
  }
}

/**
 * Removes everything of a project whose members were already removed (`deleteProject`): each
 * run's links, complexes and members in chunks, each catalog's rows tables and upload folder,
 * and last the project row, whose foreign keys take the catalogs, runs, analyses, jobs, audit
 * entries and the rest with it. Every step can run again, so a job that a dead worker left
 * part-way resumes from the start and finishes.
 */
export async function purgeProject(
  projectId: string,
  progress: (fraction: number) => Promise<void>,
) {
  await stopProjectJobs(projectId, () => progress(0));
  const runs = await db
    .select({ id: linkRuns.id })
    .from(linkRuns)
    .where(eq(linkRuns.projectId, projectId));
  const cats = await db
    .select({ id: catalogs.id })
    .from(catalogs)
    .where(eq(catalogs.projectId, projectId));
  const steps = runs.length + cats.length + 1;
  let done = 0;
  for (const run of runs) {
    for (const table of RUN_TABLES) {
      for (;;) {
        const [res] = (await db.execute(
          sql`DELETE FROM ${sql.identifier(table)} WHERE run_id = ${run.id} LIMIT ${DELETE_CHUNK}`,
        )) as unknown as [ResultSetHeader];
        if (res.affectedRows < DELETE_CHUNK) break;
        await progress(done / steps);
      }
    }
    await progress(++done / steps);
  }
  for (const cat of cats) {
    await dropRowsTables(cat.id);
    fs.rmSync(uploadDir(cat.id), { recursive: true, force: true });
    await progress(++done / steps);
  }
  await db.delete(projects).where(eq(projects.id, projectId));
}
