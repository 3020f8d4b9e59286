import { executeLinkRun, failLinkRun } from '@/lib/services/link-run-exec';
import { MatchCancelledError } from '@/lib/match';
import { registerJobHandler } from './handlers';

const runIdOf = (payload: Record<string, unknown>) => String(payload.runId);

registerJobHandler('link-run', {
  run: ({ job, progress, signal }) => executeLinkRun(runIdOf(job.payload), progress, signal),
  cleanup: (job, reason) =>
    failLinkRun(
      runIdOf(job.payload),
      reason,
      /cancel/i.test(reason) || reason === new MatchCancelledError().message,
    ),
});
