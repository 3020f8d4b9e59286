import type { Job } from '@/lib/services/jobs';

/** What a job handler gets: its job, a progress reporter that also says when to stop. */
export type JobContext = {
  job: Job;
  progress: (fraction: number) => Promise<void>;
  signal: AbortSignal;
};

export type JobHandler = {
  run: (ctx: JobContext) => Promise<void>;
  /** Called when the job fails or is given up, to leave nothing half-written. */
  cleanup: (job: Job, reason: string) => Promise<void>;
};

const registry = new Map<string, JobHandler>();

export function registerJobHandler(kind: string, handler: JobHandler) {
  registry.set(kind, handler);
}

export function jobHandler(kind: string): JobHandler | undefined {
  return registry.get(kind);
}
