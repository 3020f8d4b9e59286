'use client';

import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { api } from '@/lib/api-client';
import { LinksTable } from '@/components/tables/complex-links-table';
import { ErrorNote, Panel } from '@/components/ui/panel';
import { describeRadius, describeVelocity, fmtCount } from './format';
import { useRuns } from './run-list';
import type { Comparison, Run } from './types';

function Count({ label, value, testId }: { label: string; value: number; testId: string }) {
  return (
    <div>
      <dt className="text-xs text-ink-soft">{label}</dt>
      <dd className="num mt-0.5 text-left text-lg" data-testid={testId}>
        {fmtCount(value)}
      </dd>
    </div>
  );
}

/** Compares this run's links with another finished run of the project: shared, gained, lost. */
export function RunCompare({ run, projectId }: { run: Run; projectId: string }) {
  const runs = useRuns(projectId);
  const [other, setOther] = useState('');
  const choices = (runs.data?.runs ?? []).filter((r) => r.id !== run.id && r.status === 'done');
  const comparison = useQuery({
    queryKey: ['link-run-compare', run.id, other],
    queryFn: () =>
      api<{ comparison: Comparison }>(`/api/link-runs/${run.id}/compare?with=${other}`),
    enabled: other !== '',
  });
  const otherRun = choices.find((r) => r.id === other);
  const names = new Map(
    [...run.catalogs, ...(otherRun?.catalogs ?? [])].map((c) => [c.id, c.name]),
  );
  const catalogName = (id: string) => names.get(id) ?? id;
  const c = comparison.data?.comparison;
  return (
    <Panel title="Compare with another run">
      {choices.length === 0 ? (
        <p className="text-sm text-ink-soft">
          No other finished run in this project yet. Re-run with edits to see which links a change
          of tolerances gains or loses.
        </p>
      ) : (
        <div className="space-y-4">
          <label className="flex flex-wrap items-center gap-2 text-sm">
            <span className="font-medium">Other run</span>
            <select
              className="min-w-72 rounded border border-rule bg-white px-2 py-1"
              value={other}
              onChange={(e) => setOther(e.target.value)}
            >
              <option value="">choose a run…</option>
              {choices.map((r) => (
                <option key={r.id} value={r.id}>
                  {r.name} — {describeRadius(r.params.radius)},{' '}
                  {describeVelocity(r.params.velocity)}
                </option>
              ))}
            </select>
          </label>
          <ErrorNote>
            {comparison.error && `Could not compare: ${comparison.error.message}`}
          </ErrorNote>
          {comparison.isFetching && !c && <p className="text-sm text-ink-soft">Comparing…</p>}
          {c && otherRun && (
            <>
              <dl className="grid grid-cols-2 gap-4 sm:grid-cols-5">
                <Count label={`links in this run`} value={c.a.links} testId="compare-a" />
                <Count label={`links in “${otherRun.name}”`} value={c.b.links} testId="compare-b" />
                <Count label="in both" value={c.common} testId="compare-common" />
                <Count
                  label={`gained: only in “${otherRun.name}”`}
                  value={c.gained}
                  testId="compare-gained"
                />
                <Count label="lost: only in this run" value={c.lost} testId="compare-lost" />
              </dl>
              {c.gainedSample.length > 0 && (
                <div className="space-y-1">
                  <h3 className="text-sm font-medium">
                    Gained — a sample of {fmtCount(c.gainedSample.length)} of {fmtCount(c.gained)}
                  </h3>
                  <LinksTable
                    links={c.gainedSample}
                    catalogName={catalogName}
                    label="Sample of gained links"
                    withRadius={false}
                  />
                </div>
              )}
              {c.lostSample.length > 0 && (
                <div className="space-y-1">
                  <h3 className="text-sm font-medium">
                    Lost — a sample of {fmtCount(c.lostSample.length)} of {fmtCount(c.lost)}
                  </h3>
                  <LinksTable
                    links={c.lostSample}
                    catalogName={catalogName}
                    label="Sample of lost links"
                    withRadius={false}
                  />
                </div>
              )}
            </>
          )}
        </div>
      )}
    </Panel>
  );
}
