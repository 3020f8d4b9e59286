import { ProgressBar } from '@/components/ui/panel';
import { STATUS_WORDS, isFinalRun } from './format';
import type { Run } from './types';

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
