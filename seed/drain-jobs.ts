import { inArray } from 'drizzle-orm';
import { db } from '@/db/client';
import { jobs } from '@/db/schema';
import { runWorker } from '@/lib/jobs/worker';

/**
 * Runs the queued jobs here, then waits until no job is queued or running: a worker of a running
 * app may have claimed some of them.
 */
export async function drainJobs() {
  await runWorker({ once: true });
  const deadline = Date.now() + 15 * 60_000;
  for (;;) {
    const [open] = await db
      .select({ id: jobs.id })
      .from(jobs)
      .where(inArray(jobs.status, ['queued', 'running']))
      .limit(1);
    if (!open) return;
    if (Date.now() > deadline) throw new Error(`job ${open.id} did not finish within 15 minutes`);
    await new Promise((resolve) => setTimeout(resolve, 500));
  }
}
