'use client';

import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { ComplexesTable } from '@/components/tables/complexes-table';
import { EmptyState, ErrorNote, Panel } from '@/components/ui/panel';
import { describeRadius, describeVelocity, fmtCount, fmtWhen } from './format';
import { useRuns } from './run-list';

/**
 * The project's complexes section: one finished run at a time (the newest by default, or the one
 * named in the address), with a selector for the others and its complexes table.
 */
export function ComplexesSection({
  projectId,
  runId,
}: {
  projectId: string;
  runId: string | null;
}) {
  const router = useRouter();
  const { data, error, isPending } = useRuns(projectId);
  if (error) return <ErrorNote>Could not load the link runs: {error.message}</ErrorNote>;
  if (isPending) return <p className="text-sm text-ink-soft">Loading link runs…</p>;
  const done = data.runs.filter((r) => r.status === 'done');
  if (done.length === 0) {
    const unfinished = data.runs.some((r) => r.status === 'queued' || r.status === 'running');
    return (
      <EmptyState title={unfinished ? 'A link run is still working' : 'No complexes yet'}>
        {unfinished ? (
          <>Its complexes appear here when it finishes; follow it on the </>
        ) : (
          <>Complexes come from link runs. Start one from two or more ready catalogs on the </>
        )}
        <Link href={`/projects/${projectId}/link-runs`} className="text-accent underline">
          Link runs
        </Link>{' '}
        page.
      </EmptyState>
    );
  }
  const run = done.find((r) => r.id === runId) ?? done[0];
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end gap-4">
        <label className="block w-full space-y-1 text-sm sm:w-auto">
          <span className="font-medium">Link run</span>
          <select
            className="block w-full rounded-md sm:w-96 border border-rule bg-white px-3 py-2"
            value={run.id}
            onChange={(e) =>
              router.replace(`/projects/${projectId}/complexes?run=${e.target.value}`)
            }
          >
            {done.map((r) => (
              <option key={r.id} value={r.id}>
                {r.name} — {describeRadius(r.params.radius)}, {describeVelocity(r.params.velocity)}{' '}
                ({fmtWhen(r.finishedAt)})
              </option>
            ))}
          </select>
        </label>
        <p className="pb-2 text-sm text-ink-soft">
          {fmtCount(run.summary?.complexes ?? 0)} complexes from {fmtCount(run.summary?.links ?? 0)}{' '}
          links ·{' '}
          <Link
            href={`/projects/${projectId}/link-runs/${run.id}`}
            className="text-accent underline"
          >
            run details
          </Link>
        </p>
      </div>
      {runId && runId !== run.id && (
        <ErrorNote>
          No finished run with that id in this project; showing the newest finished run instead.
        </ErrorNote>
      )}
      <Panel>
        <ComplexesTable
          key={run.id}
          runId={run.id}
          projectId={projectId}
          kinds={run.catalogs.map((c) => c.kind)}
        />
      </Panel>
    </div>
  );
}
