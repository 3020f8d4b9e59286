import os from 'node:os';
import {
  claimJob,
  failJob,
  finishJob,
  recoverStaleJobs,
  reportProgress,
  getJob,
} from '@/lib/services/jobs';
import { jobHandler, type JobContext } from './handlers';
import './register';

const POLL_MS = Number(process.env.WORKER_POLL_MS ?? 500);
const STALE_SECONDS = Number(process.env.WORKER_STALE_SECONDS ?? 30);
// A beat well inside the stale limit, so a live job is never taken for a dead one.
const HEARTBEAT_MS = Math.min(5000, (STALE_SECONDS * 1000) / 3);

export class JobCancelled extends Error {
  constructor() {
    super('Cancelled at the request of a project member.');
  }
}

async function runOne(workerId: string): Promise<boolean> {
  const job = await claimJob(workerId);
  if (!job) return false;
  const handler = jobHandler(job.kind);
  if (!handler) {
    await failJob(job.id, `No handler for jobs of kind "${job.kind}".`);
    return true;
  }
  const abort = new AbortController();
  let lastReport = 0;
  const ctx: JobContext = {
    job,
    signal: abort.signal,
    async progress(fraction) {
      const now = Date.now();
      if (now - lastReport < 300 && fraction < 1) return;
      lastReport = now;
      const { cancel } = await reportProgress(job.id, fraction);
      if (cancel) {
        abort.abort();
        throw new JobCancelled();
      }
    },
  };
  // Heartbeat even while a handler computes without reporting.
  const beat = setInterval(() => {
    getJob(job.id)
      .then(async (j) => {
        if (!j || j.status !== 'running') return;
        const { cancel } = await reportProgress(job.id, j.progress);
        if (cancel) abort.abort();
      })
      .catch(() => undefined);
  }, HEARTBEAT_MS);
  try {
    await handler.run(ctx);
    await finishJob(job.id);
  } catch (e) {
    const cancelled = e instanceof JobCancelled || abort.signal.aborted;
    const reason = e instanceof Error ? e.message : String(e);
    await handler
      .cleanup(job, reason)
      .catch((err) => console.error('[worker] cleanup failed:', err));
    await failJob(job.id, reason, cancelled ? 'cancelled' : 'failed');
    console.error(
      `[worker] job ${job.id} (${job.kind}) ${cancelled ? 'cancelled' : 'failed'}: ${reason}`,
    );
  } finally {
    clearInterval(beat);
  }
  return true;
}

/** The worker loop: recover jobs of dead workers, then claim and run jobs until stopped. */
export async function runWorker(opts: { once?: boolean } = {}) {
  const workerId = `${os.hostname()}:${process.pid}`;
  let stopping = false;
  process.on('SIGTERM', () => (stopping = true));
  process.on('SIGINT', () => (stopping = true));
  console.log(`[worker] ${workerId} polling for jobs`);
  let lastRecovery = 0;
  while (!stopping) {
    if (Date.now() - lastRecovery > Math.min(10_000, STALE_SECONDS * 500)) {
      lastRecovery = Date.now();
      const recovered = await recoverStaleJobs(STALE_SECONDS).catch(() => []);
      for (const r of recovered) {
        console.log(`[worker] job ${r.job.id} of a stopped worker ${r.action}`);
        if (r.action === 'failed')
          await jobHandler(r.job.kind)
            ?.cleanup(r.job, r.reason)
            .catch(() => undefined);
      }
    }
    const worked = await runOne(workerId).catch((e) => {
      console.error('[worker] loop error:', e instanceof Error ? e.message : e);
      return false;
    });
    if (opts.once && !worked) return;
    if (!worked) await new Promise((r) => setTimeout(r, POLL_MS));
  }
}
