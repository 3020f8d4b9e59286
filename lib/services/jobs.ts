import { and, eq, lt, sql } from 'drizzle-orm';
import { db, pool } from '@/db/client';
import { jobs } from '@/db/schema';
import type { RowDataPacket } from 'mysql2';

export type JobKind = 'ingest' | 'link-run' | 'analysis';
export type Job = typeof jobs.$inferSelect;

/** Records a job for the worker; returns its id. */
export async function enqueueJob(
  kind: JobKind,
  payload: Record<string, unknown>,
  opts: { projectId?: string; userId?: string } = {},
) {
  const [res] = await db
    .insert(jobs)
    .values({ kind, payload, projectId: opts.projectId ?? null, createdBy: opts.userId ?? null });
  return Number(res.insertId);
}

/**
 * Claims the oldest queued job. `FOR UPDATE SKIP LOCKED` lets any number of workers poll the
 * same table without taking the same job twice.
 */
export async function claimJob(workerId: string): Promise<Job | null> {
  const conn = await pool().getConnection();
  try {
    await conn.beginTransaction();
    const [rows] = await conn.query<RowDataPacket[]>(
      "SELECT id FROM jobs WHERE status = 'queued' ORDER BY created_at, id LIMIT 1 FOR UPDATE SKIP LOCKED",
    );
    if (!rows.length) {
      await conn.commit();
      return null;
    }
    const id = Number(rows[0].id);
    await conn.query(
      "UPDATE jobs SET status = 'running', locked_by = ?, started_at = NOW(3), heartbeat_at = NOW(3), attempts = attempts + 1 WHERE id = ?",
      [workerId, id],
    );
    await conn.commit();
    const [job] = await db.select().from(jobs).where(eq(jobs.id, id));
    return job ?? null;
  } catch (e) {
    await conn.rollback();
    throw e;
  } finally {
    conn.release();
  }
}

/** Progress 0..1 doubles as the heartbeat; answers whether a cancel was requested. */
export async function reportProgress(
  jobId: number,
  progress: number,
): Promise<{ cancel: boolean }> {
  await db
    .update(jobs)
    .set({ progress: Math.max(0, Math.min(1, progress)), heartbeatAt: sql`NOW(3)` })
    .where(eq(jobs.id, jobId));
  const [j] = await db
    .select({ cancel: jobs.cancelRequested })
    .from(jobs)
    .where(eq(jobs.id, jobId));
  return { cancel: !!j?.cancel };
}

export async function finishJob(jobId: number) {
  await db
    .update(jobs)
    .set({ status: 'done', progress: 1, finishedAt: sql`NOW(3)` })
    .where(eq(jobs.id, jobId));
}

export async function failJob(
  jobId: number,
  error: string,
  status: 'failed' | 'cancelled' = 'failed',
) {
  await db
    .update(jobs)
    .set({ status, error: error.slice(0, 4000), finishedAt: sql`NOW(3)` })
    .where(eq(jobs.id, jobId));
}

export async function requestCancel(jobId: number) {
  await db.update(jobs).set({ cancelRequested: true }).where(eq(jobs.id, jobId));
}

export async function getJob(jobId: number) {
  const [j] = await db.select().from(jobs).where(eq(jobs.id, jobId));
  return j ?? null;
}

/**
 * Jobs left `running` by a worker that died (no heartbeat for `staleSeconds`): re-queued once
 * more, or failed with a clear reason after `maxAttempts`. Returns the ids it touched.
 */
export async function recoverStaleJobs(staleSeconds: number, maxAttempts = 2) {
  const stale = await db
    .select({ id: jobs.id, attempts: jobs.attempts, kind: jobs.kind, payload: jobs.payload })
    .from(jobs)
    .where(
      and(
        eq(jobs.status, 'running'),
        lt(jobs.heartbeatAt, sql`NOW(3) - INTERVAL ${staleSeconds} SECOND`),
      ),
    );
  const out: { job: Job; action: 'requeued' | 'failed'; reason: string }[] = [];
  for (const j of stale) {
    const [job] = await db.select().from(jobs).where(eq(jobs.id, j.id));
    if (!job) continue;
    if (j.attempts >= maxAttempts) {
      const reason = `The worker stopped during this job ${j.attempts} times; it was not retried again.`;
      await failJob(j.id, reason);
      out.push({ job, action: 'failed', reason });
    } else {
      await db
        .update(jobs)
        .set({ status: 'queued', lockedBy: null, progress: 0 })
        .where(and(eq(jobs.id, j.id), eq(jobs.status, 'running')));
      out.push({ job, action: 'requeued', reason: 'worker stopped' });
    }
  }
  return out;
}
