'use client';

import { useQuery } from '@tanstack/react-query';
import Link from 'next/link';
import { useState } from 'react';
import { api } from '@/lib/api-client';
import type { RunLifecycleJson } from '@/lib/schemas/link-runs';
import { ShowArchived } from '@/components/tables/catalog-list';
import { EmptyState, ErrorNote } from '@/components/ui/panel';
import { TracerGlyph } from '@/components/ui/tracer-badge';
import {
  LINK_MODE_WORDS,
  RUN_POLL_MS,
  describeRadius,
  describeVelocity,
  fmtCount,
  fmtWhen,
  isFinalRun,
} from './format';
import { RunStatusCell } from './run-status';
import type { Run } from './types';

/** Query key of a project's run list, shared by the list, the form and the run page. */
export const runsKey = (projectId: string) => ['link-runs', projectId];

/**
 * The project's link runs, newest first (archived ones too when asked); fetched again every
 * second while any is unfinished.
 */
export function useRuns(projectId: string, withArchived = false) {
  return useQuery({
    queryKey: withArchived ? [...runsKey(projectId), 'with-archived'] : runsKey(projectId),
    queryFn: () =>
      api<{ runs: (Run & RunLifecycleJson)[] }>(
        `/api/projects/${projectId}/link-runs${withArchived ? '?archived=include' : ''}`,
      ),
    refetchInterval: (q) =>
      q.state.data?.runs.some((r) => !isFinalRun(r.status)) ? RUN_POLL_MS : false,
  });
}

/** Every link run of a project with its status, tolerances and result counts. */
export function RunList({ projectId, canEdit }: { projectId: string; canEdit: boolean }) {
  const [showArchived, setShowArchived] = useState(false);
  const { data, error, isPending } = useRuns(projectId, showArchived);
  if (error) return <ErrorNote>Could not load the link runs: {error.message}</ErrorNote>;
  if (isPending) return <p className="text-sm text-ink-soft">Loading link runs…</p>;
  if (data.runs.length === 0 && !showArchived) {
    return (
      <EmptyState title="No link runs yet">
        {canEdit ? (
          <>
            Choose <strong>New link run</strong> to link the tracers of two or more ready catalogs
            by sky position and line-of-sight velocity. You will see an estimate of the work before
            it starts.
          </>
        ) : (
          <>An editor or owner of this project starts link runs; they will appear here.</>
        )}
      </EmptyState>
    );
  }
  const base = `/projects/${projectId}/link-runs`;
  return (
    <div>
      <ShowArchived checked={showArchived} onChange={setShowArchived} />
      <div className="overflow-x-auto rounded-lg border border-rule bg-white/70">
        <table className="w-full text-sm" aria-label="Link runs">
          <thead className="border-b border-rule text-left text-xs tracking-wide text-ink-soft">
            <tr>
              <th className="px-3 py-2">Name</th>
              <th className="px-3 py-2">Catalogs</th>
              <th className="px-3 py-2">Status</th>
              <th className="px-3 py-2">Tolerances</th>
              <th className="px-3 py-2 text-right">Links</th>
              <th className="px-3 py-2 text-right">Complexes</th>
              <th className="px-3 py-2">Started by</th>
            </tr>
          </thead>
          <tbody className="divide-y divide-rule/70">
            {data.runs.map((r) => (
              <tr key={r.id} className="hover:bg-paper-deep/40">
                <td className="px-3 py-2">
                  <Link
                    href={`${base}/${r.id}`}
                    className="font-medium text-accent hover:underline"
                  >
                    {r.name}
                  </Link>
                  {r.archivedAt && <span className="ml-1.5 text-xs text-ink-soft">archived</span>}
                  {r.note && (
                    <span className="block max-w-xs truncate text-xs text-ink-soft" title={r.note}>
                      {r.note}
                    </span>
                  )}
                </td>
                <td className="px-3 py-2">
                  <ul className="space-y-0.5">
                    {r.catalogs.map((c) => (
                      <li key={c.id} className="flex items-center gap-1.5">
                        <TracerGlyph kind={c.kind} />
                        {c.name}
                      </li>
                    ))}
                  </ul>
                </td>
                <td className="px-3 py-2">
                  <RunStatusCell run={r} />
                </td>
                <td className="px-3 py-2 text-xs text-ink-soft">
                  {describeRadius(r.params.radius)}; {describeVelocity(r.params.velocity)};{' '}
                  {LINK_MODE_WORDS[r.params.linkMode].label.toLowerCase()}
                  {r.params.chanceTrials > 0 && `; ${r.params.chanceTrials} chance repeats`}
                </td>
                <td className="num px-3 py-2">{r.summary ? fmtCount(r.summary.links) : '—'}</td>
                <td className="num px-3 py-2">{r.summary ? fmtCount(r.summary.complexes) : '—'}</td>
                <td className="px-3 py-2 text-xs text-ink-soft">
                  {r.createdBy?.name ?? 'a former member'}
                  <br />
                  {fmtWhen(r.createdAt)}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
