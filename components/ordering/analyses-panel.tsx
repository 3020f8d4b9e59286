'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { fmt, fmtWhen } from '@/components/link-runs/format';
import { RecordActions } from '@/components/link-runs/record-actions';
import { useRuns } from '@/components/link-runs/run-list';
import { ShowArchived } from '@/components/tables/catalog-list';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { EmptyState, ErrorNote, Panel, ProgressBar } from '@/components/ui/panel';
import { api } from '@/lib/api-client';
import { analysisSchema, type AnalysisLifecycleJson } from '@/lib/schemas/analyses';
import { ANALYSIS_POLL_MS } from './analysis-view';
import type { CheckedSettings } from './settings-model';
import type { AnalysisListItem, AnalysisRequest } from './types';
import { ANALYSIS_STATUS_WORDS, isFinalAnalysis, pc, pcCi, sharedDecimals } from './words';

/** Fewest bootstrap resamples an analysis may ask for (docs/methods.md, "Intervals"). */
export const MIN_RESAMPLES = 2000;

/** The request body checked by the endpoint's own schema: the body, or the schema's messages. */
function checkedBody(body: AnalysisRequest): { ok: true } | { ok: false; problems: string[] } {
  const parsed = analysisSchema.safeParse(body);
  if (parsed.success) return { ok: true };
  return {
    ok: false,
    problems: parsed.error.issues.map((i) => `${i.path.join('.') || 'request'}: ${i.message}`),
  };
}

/** Query key of a project's analysis list. */
export const analysesKey = (projectId: string) => ['analyses', projectId];

type ListedAnalysis = AnalysisListItem & AnalysisLifecycleJson;

/**
 * The project's analyses, newest first (archived ones too when asked); fetched again every
 * second while any is unfinished.
 */
export function useAnalyses(projectId: string, withArchived = false) {
  return useQuery({
    queryKey: withArchived ? [...analysesKey(projectId), 'with-archived'] : analysesKey(projectId),
    queryFn: () =>
      api<{ analyses: ListedAnalysis[] }>(
        `/api/projects/${projectId}/analyses${withArchived ? '?archived=include' : ''}`,
      ),
    refetchInterval: (q) =>
      q.state.data?.analyses.some((a) => !isFinalAnalysis(a.status)) ? ANALYSIS_POLL_MS : false,
  });
}

function RunForm({ projectId, checked }: { projectId: string; checked: CheckedSettings }) {
  const router = useRouter();
  const qc = useQueryClient();
  const runs = useRuns(projectId);
  const done = (runs.data?.runs ?? []).filter((r) => r.status === 'done');
  const [runId, setRunId] = useState('');
  const [resamples, setResamples] = useState('2000');
  const [seed, setSeed] = useState('1');
  const chosen = done.some((r) => r.id === runId) ? runId : (done[0]?.id ?? '');
  const nResamples = Number(resamples);
  const nSeed = Number(seed);
  const problems: string[] = [];
  if (!Number.isInteger(nResamples) || nResamples < MIN_RESAMPLES)
    problems.push(`Resamples: “${resamples}” must be a whole number of at least ${MIN_RESAMPLES}.`);
  if (!Number.isInteger(nSeed) || nSeed < 0)
    problems.push(`Seed: “${seed}” must be a whole number ≥ 0.`);
  const body: AnalysisRequest | null =
    checked.ok && problems.length === 0
      ? { runId: chosen, resamples: nResamples, seed: nSeed, ...checked.value }
      : null;
  const schema = body ? checkedBody(body) : null;
  if (schema && !schema.ok) problems.push(...schema.problems);
  const start = useMutation({
    mutationFn: (body: AnalysisRequest) =>
      api<{ analysis: { id: string } }>(`/api/projects/${projectId}/analyses`, {
        method: 'POST',
        json: body,
      }),
    onSuccess: ({ analysis }) => {
      void qc.invalidateQueries({ queryKey: analysesKey(projectId) });
      router.push(`/projects/${projectId}/arms?analysis=${analysis.id}#result`, { scroll: false });
    },
  });
  if (runs.error) return <ErrorNote>Could not load the link runs: {runs.error.message}</ErrorNote>;
  if (runs.isPending) return <p className="text-sm text-ink-soft">Loading link runs…</p>;
  if (done.length === 0)
    return (
      <EmptyState title="No finished link run yet">
        An ordering analysis works on the complexes of a finished link run.{' '}
        <Link className="text-accent hover:underline" href={`/projects/${projectId}/link-runs`}>
          Start a link run
        </Link>{' '}
        of gas and young-star catalogs first.
      </EmptyState>
    );
  return (
    <form
      className="space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        if (!body || problems.length) return;
        start.mutate(body);
      }}
    >
      <div className="grid gap-3 sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)_minmax(0,1fr)]">
        <SelectField label="Link run" value={chosen} onChange={(e) => setRunId(e.target.value)}>
          {done.map((r) => (
            <option key={r.id} value={r.id}>
              {r.name} — {r.summary ? `${r.summary.complexes} complexes` : 'done'}
            </option>
          ))}
        </SelectField>
        <TextField
          label="Resamples"
          hint={`bootstrap, ≥ ${MIN_RESAMPLES}`}
          inputMode="numeric"
          value={resamples}
          onChange={(e) => setResamples(e.target.value)}
        />
        <TextField
          label="Seed"
          hint="same seed, same intervals"
          inputMode="numeric"
          value={seed}
          onChange={(e) => setSeed(e.target.value)}
        />
      </div>
      {problems.map((p) => (
        <ErrorNote key={p}>{p}</ErrorNote>
      ))}
      {!checked.ok && <ErrorNote>Fix the settings above before starting an analysis.</ErrorNote>}
      {start.error && <ErrorNote>The analysis was not started: {start.error.message}</ErrorNote>}
      <Button type="submit" disabled={!checked.ok || problems.length > 0 || start.isPending}>
        Start ordering analysis
      </Button>
    </form>
  );
}

function YoungMinusGasCell({ summary }: { summary: AnalysisListItem['summary'] }) {
  const m = summary?.youngMinusGasKpc ?? null;
  const c = summary?.youngMinusGasCi95 ?? null;
  const d = sharedDecimals([m, ...(c ?? [])].map((x) => (x === null ? null : x * 1000)));
  return (
    <>
      {pc(m, d)} <span className="text-xs text-ink-soft">[{pcCi(c, d)}]</span>
    </>
  );
}

/** The settings that tell two analyses of one run apart, in a line. */
export function describeAnalysisParams(p: AnalysisListItem['params']): string {
  const arms = 'preset' in p.arms ? `${p.arms.preset} arms` : `${p.arms.custom.length} custom arms`;
  return [
    `${p.curve.name} curve`,
    arms,
    `near/far ${p.nearFar}`,
    `${p.mcDraws} distance draws`,
    `${p.resamples} resamples`,
  ].join(' · ');
}

function AnalysisList({
  projectId,
  selected,
  canEdit,
}: {
  projectId: string;
  selected: string | null;
  canEdit: boolean;
}) {
  const router = useRouter();
  const qc = useQueryClient();
  const [showArchived, setShowArchived] = useState(false);
  const { data, error, isPending } = useAnalyses(projectId, showArchived);
  if (error) return <ErrorNote>Could not load the analyses: {error.message}</ErrorNote>;
  if (isPending) return <p className="text-sm text-ink-soft">Loading analyses…</p>;
  const refresh = () => void qc.invalidateQueries({ queryKey: analysesKey(projectId) });
  const toggle = <ShowArchived checked={showArchived} onChange={setShowArchived} />;
  if (data.analyses.length === 0)
    return (
      <div>
        {toggle}
        <p className="text-sm text-ink-soft">
          No ordering analysis yet{showArchived ? '' : ' (archived ones are hidden)'}. Each one you
          start is kept here to reopen.
        </p>
      </div>
    );
  return (
    <div>
      {toggle}
      <div className="relative overflow-x-auto rounded-lg border border-rule bg-white/70">
        <table className="w-full text-sm" aria-label="Ordering analyses">
          <thead className="border-b border-rule text-left text-xs tracking-wide text-ink-soft">
            <tr>
              <th className="px-3 py-2">Analysis</th>
              <th className="px-3 py-2">Status</th>
              <th className="px-3 py-2 text-right">Young − gas (pc, ahead +) [95 %]</th>
              <th className="px-3 py-2 text-right">Fitted Ω_p (km/s/kpc)</th>
              <th className="px-3 py-2 text-right">Fitted t (Myr)</th>
              <th className="px-3 py-2">Assumed Ω_p</th>
              <th className="px-3 py-2">Started</th>
              <th className="px-3 py-2">
                <span className="sr-only">Open</span>
              </th>
            </tr>
          </thead>
          <tbody className="divide-y divide-rule/70">
            {data.analyses.map((a) => (
              <tr
                key={a.id}
                className={a.id === selected ? 'bg-accent-soft/40' : 'hover:bg-paper-deep/40'}
              >
                <td className="px-3 py-2">
                  <span className="font-medium">{a.name}</span>
                  {a.archivedAt && <span className="ml-1.5 text-xs text-ink-soft">archived</span>}
                  {a.customName && (
                    <span className="block text-xs text-ink-soft">run {a.runName}</span>
                  )}
                  <span className="block text-xs text-ink-soft">
                    {describeAnalysisParams(a.params)}
                  </span>
                  {a.note && (
                    <span className="block max-w-xs truncate text-xs" title={a.note}>
                      {a.note}
                    </span>
                  )}
                </td>
                <td className="px-3 py-2">
                  <span className="flex items-center gap-2">
                    <span
                      className={
                        a.status === 'failed'
                          ? 'font-medium text-danger'
                          : a.status === 'done'
                            ? 'text-ok'
                            : 'text-ink-soft'
                      }
                    >
                      {ANALYSIS_STATUS_WORDS[a.status]}
                    </span>
                    {!isFinalAnalysis(a.status) && (
                      <ProgressBar
                        value={a.progress}
                        label={`Progress of the analysis of ${a.runName}`}
                      />
                    )}
                  </span>
                </td>
                <td className="num px-3 py-2">
                  <YoungMinusGasCell summary={a.summary} />
                </td>
                <td className="num px-3 py-2">{fmt(a.summary?.patternSpeedKmsKpc, 1)}</td>
                <td className="num px-3 py-2">{fmt(a.summary?.timescaleMyr, 1)}</td>
                <td className="px-3 py-2 text-xs">
                  {a.params.patternSpeed == null
                    ? 'none'
                    : `assumed ${fmt(a.params.patternSpeed, 1)} km/s/kpc`}
                </td>
                <td className="px-3 py-2 text-xs text-ink-soft">{fmtWhen(a.createdAt)}</td>
                <td className="px-3 py-2">
                  {a.id === selected ? (
                    <span className="text-xs text-ink-soft">shown below</span>
                  ) : (
                    <Link
                      href={`/projects/${projectId}/arms?analysis=${a.id}#result`}
                      scroll={false}
                      className="text-accent hover:underline"
                      aria-label={`Open the analysis of ${a.runName} started ${fmtWhen(a.createdAt)}`}
                    >
                      Open
                    </Link>
                  )}
                  {canEdit && isFinalAnalysis(a.status) && (
                    <span className="mt-1 flex flex-wrap gap-1">
                      <RecordActions
                        what="analysis"
                        url={`/api/analyses/${a.id}`}
                        name={a.customName ?? ''}
                        note={a.note}
                        archived={a.archivedAt !== null}
                        nameOptional
                        onChanged={refresh}
                        onDeleted={() => {
                          refresh();
                          if (a.id === selected)
                            router.replace(`/projects/${projectId}/arms`, { scroll: false });
                        }}
                      />
                    </span>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}

/** Starting an analysis of a finished link run with the current settings, and the past analyses. */
export function AnalysesPanel({
  projectId,
  checked,
  canEdit,
  selected,
}: {
  projectId: string;
  checked: CheckedSettings;
  canEdit: boolean;
  selected: string | null;
}) {
  return (
    <div className="grid gap-6 2xl:grid-cols-2">
      {canEdit && (
        <Panel title="Run an ordering analysis">
          <RunForm projectId={projectId} checked={checked} />
        </Panel>
      )}
      <Panel title="Analyses">
        <AnalysisList projectId={projectId} selected={selected} canEdit={canEdit} />
      </Panel>
    </div>
  );
}
