'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { api } from '@/lib/api-client';
import type { RunLifecycleJson } from '@/lib/schemas/link-runs';
import { ComplexesTable } from '@/components/tables/complexes-table';
import { Button } from '@/components/ui/button';
import { ErrorNote, PageHeader, Panel } from '@/components/ui/panel';
import { TracerBadge } from '@/components/ui/tracer-badge';
import {
  LINK_MODE_WORDS,
  MISSING_VELOCITY_WORDS,
  describeRadius,
  describeVelocity,
  fmtCount,
  fmtWhen,
  isFinalRun,
} from './format';
import { RunCompare } from './run-compare';
import { RunExports } from './run-exports';
import { RecordActions } from './record-actions';
import { runsKey } from './run-list';
import { RunStatusCell, retryUnlessGone, runPollMs } from './run-status';
import { RunSummaryView } from './run-summary';
import type { Run } from './types';

/** One run, fetched again every second until it is done, failed or cancelled, or is gone. */
export function useRun(runId: string) {
  return useQuery({
    queryKey: ['link-run', runId],
    queryFn: () => api<{ run: Run & RunLifecycleJson }>(`/api/link-runs/${runId}`),
    refetchInterval: runPollMs,
    retry: retryUnlessGone,
  });
}

function Fact({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div>
      <dt className="text-xs tracking-wide text-ink-soft">{label}</dt>
      <dd className="mt-0.5">{children}</dd>
    </div>
  );
}

function Parameters({ run }: { run: Run }) {
  const p = run.params;
  return (
    <dl className="grid gap-x-6 gap-y-3 text-sm sm:grid-cols-2 lg:grid-cols-4">
      <Fact label="Catalogs">
        <ul className="space-y-1">
          {run.catalogs.map((c) => (
            <li key={c.id} className="flex items-center gap-2">
              <TracerBadge kind={c.kind} /> {c.name}
            </li>
          ))}
        </ul>
      </Fact>
      <Fact label="Match radius">{describeRadius(p.radius)}</Fact>
      <Fact label="Velocity window">
        {describeVelocity(p.velocity)}
        {p.velocity.mode !== 'ignore' && (
          <span className="block text-xs text-ink-soft">
            sources without velocity {MISSING_VELOCITY_WORDS[p.missingVelocity ?? 'exclude']}
          </span>
        )}
      </Fact>
      <Fact label="Link mode">
        {LINK_MODE_WORDS[p.linkMode].label}
        <span className="block text-xs text-ink-soft">{LINK_MODE_WORDS[p.linkMode].explain}</span>
      </Fact>
      <Fact label="Chance-link repeats">{p.chanceTrials === 0 ? 'none' : p.chanceTrials}</Fact>
      <Fact label="Complex size cap">{fmtCount(p.complexCap ?? 500)}</Fact>
      <Fact label="Started by">
        {run.createdBy?.name ?? 'a former member'}, {fmtWhen(run.createdAt)}
      </Fact>
      <Fact label="Finished">{fmtWhen(run.finishedAt)}</Fact>
    </dl>
  );
}

/**
 * The page of one link run: status and progress (with Cancel for editors), its parameters, and
 * once done the summary, histograms, exports, comparison and complexes table. The page can be
 * left at any time; the run goes on in the background.
 */
export function RunDetail({
  projectId,
  runId,
  canEdit,
}: {
  projectId: string;
  runId: string;
  canEdit: boolean;
}) {
  const qc = useQueryClient();
  const router = useRouter();
  const { data, error, isPending } = useRun(runId);
  const [actionError, setActionError] = useState<string | null>(null);
  const cancel = useMutation({
    mutationFn: () => api(`/api/link-runs/${runId}/cancel`, { method: 'POST' }),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: ['link-run', runId] });
      void qc.invalidateQueries({ queryKey: runsKey(projectId) });
    },
    onError: (e) => setActionError(`The run was not cancelled: ${e.message}`),
  });
  if (error) return <ErrorNote>Could not load the link run: {error.message}</ErrorNote>;
  if (isPending) return <p className="text-sm text-ink-soft">Loading the link run…</p>;
  const run = data.run;
  if (run.projectId !== projectId)
    return <ErrorNote>This link run belongs to another project.</ErrorNote>;
  const base = `/projects/${projectId}/link-runs`;
  const active = !isFinalRun(run.status);
  return (
    <div className="space-y-6">
      <PageHeader
        title={run.name}
        lead="A link run is a fixed record of its parameters; re-running with edits makes a new run."
        actions={
          <div className="flex flex-wrap items-center gap-2">
            <Link href={base} className="text-sm text-ink-soft hover:text-ink">
              All link runs
            </Link>
            {canEdit && (
              <Link
                href={`${base}/new?from=${run.id}`}
                className="inline-flex items-center rounded-md border border-rule bg-white/60 px-3.5 py-2 text-sm font-medium hover:bg-white"
              >
                Re-run with edits
              </Link>
            )}
            {canEdit && !active && (
              <RecordActions
                what="link run"
                url={`/api/link-runs/${run.id}`}
                name={run.name}
                note={run.note}
                archived={run.archivedAt !== null}
                cascadeQuery="withAnalyses=1"
                onChanged={() => {
                  void qc.invalidateQueries({ queryKey: ['link-run', runId] });
                  void qc.invalidateQueries({ queryKey: runsKey(projectId) });
                }}
                onDeleted={() => {
                  qc.removeQueries({ queryKey: ['link-run', runId] });
                  void qc.invalidateQueries({ queryKey: runsKey(projectId) });
                  router.push(base);
                }}
              />
            )}
          </div>
        }
      />
      {(run.note || run.archivedAt) && (
        <div className="-mt-3 space-y-1 text-sm">
          {run.note && (
            <p data-testid="run-note" className="max-w-3xl whitespace-pre-line">
              {run.note}
            </p>
          )}
          {run.archivedAt && (
            <p className="font-medium text-ink-soft">
              Archived {fmtWhen(run.archivedAt)}: hidden from the run list and new analyses.
            </p>
          )}
        </div>
      )}
      <Panel title="Status">
        <div className="flex flex-wrap items-center gap-4">
          <RunStatusCell run={run} />
          {active && canEdit && (
            <Button
              variant="danger"
              className="px-2.5 py-1"
              disabled={cancel.isPending}
              onClick={() => {
                setActionError(null);
                if (confirm('Cancel this link run? Nothing it found so far is kept.'))
                  cancel.mutate();
              }}
            >
              Cancel run
            </Button>
          )}
          {active && (
            <span className="text-sm text-ink-soft">
              You can leave this page; the run goes on and its result will be here when you come
              back.
            </span>
          )}
        </div>
        <div className="mt-3 space-y-2">
          <ErrorNote>{actionError}</ErrorNote>
          {run.status === 'failed' && (
            <ErrorNote>
              The run failed: {run.error ?? 'no reason was recorded'}.{' '}
              {canEdit && 'Check the catalogs and parameters, then re-run with edits.'}
            </ErrorNote>
          )}
          {run.status === 'cancelled' && (
            <p className="text-sm text-ink-soft">
              This run was cancelled before it finished; it has no result.
            </p>
          )}
        </div>
      </Panel>
      <Panel title="Parameters">
        <Parameters run={run} />
      </Panel>
      {run.status === 'done' && run.summary && (
        <>
          <RunSummaryView run={run} summary={run.summary} projectId={projectId} />
          <RunExports runId={run.id} />
          <RunCompare run={run} projectId={projectId} />
          <Panel title="Complexes">
            <ComplexesTable
              runId={run.id}
              projectId={projectId}
              kinds={run.catalogs.map((c) => c.kind)}
            />
          </Panel>
        </>
      )}
    </div>
  );
}
