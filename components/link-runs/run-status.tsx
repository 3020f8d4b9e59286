import { ApiError } from '@/lib/api-client';
import { ProgressBar } from '@/components/ui/panel';
import { RUN_POLL_MS, STATUS_WORDS, isFinalRun } from './format';
import type { Run } from './types';

const gone = (e: unknown) => e instanceof ApiError && (e.status === 404 || e.status === 403);

/** No second try for a record that is missing or not the caller's to see; one for anything else. */
export const retryUnlessGone = (failures: number, e: Error) => !gone(e) && failures < 1;

/**
 * The refetch interval of a run: every RUN_POLL_MS while it is queued or running, and never
 * again once it is final or the server said it is missing or forbidden.
 */
export function runPollMs(q: {
  state: { data?: { run: Pick<Run, 'status'> }; error: unknown };
}): number | false {
  if (gone(q.state.error)) return false;
  return q.state.data && isFinalRun(q.state.data.run.status) ? false : RUN_POLL_MS;
}

const TONE: Record<Run['status'], string> = {
  queued: 'text-ink-soft',
  running: 'text-ink-soft',
  done: 'text-ok',
  failed: 'font-medium text-danger',
  cancelled: 'text-ink-soft',
};

/** The run's status word, and a progress bar while it is queued or running. */
export function RunStatusCell({
  run,
}: {
  run: Pick<Run, 'status' | 'progress' | 'name' | 'error'>;
}) {
  return (
    <span className="flex items-center gap-2">
      <span data-testid="run-status" className={TONE[run.status]} title={run.error ?? undefined}>
        {STATUS_WORDS[run.status]}
      </span>
      {!isFinalRun(run.status) && (
        <ProgressBar value={run.progress} label={`Progress of ${run.name}`} />
      )}
    </span>
  );
}
