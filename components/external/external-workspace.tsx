'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { fmt, fmtWhen } from '@/components/link-runs/format';
import { ANALYSIS_POLL_MS } from '@/components/ordering/analysis-view';
import { analysesKey } from '@/components/ordering/analyses-panel';
import { ANALYSIS_STATUS_WORDS, isFinalAnalysis } from '@/components/ordering/words';
import type { CatalogJson } from '@/components/tables/catalog-list';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { EmptyState, ErrorNote, Panel, ProgressBar } from '@/components/ui/panel';
import { TracerBadge } from '@/components/ui/tracer-badge';
import { api } from '@/lib/api-client';
import { externalAnalysisSchema, type AnalysisLifecycleJson } from '@/lib/schemas/analyses';
import { RecordActions } from '@/components/link-runs/record-actions';
import { ShowArchived } from '@/components/tables/catalog-list';
import type { ExternalTarget } from './target';
import { ExternalView } from './external-view';
import type { ExternalAnalysisListItem } from './types';

/** Fewest bootstrap resamples an interval is reported from (the endpoint's own minimum). */
const MIN_RESAMPLES = 2000;

type Draft = {
  catalogIds: string[] | null;
  arms: string;
  minKpc: string;
  maxKpc: string;
  widthKpc: string;
  resamples: string;
  seed: string;
};

const LABELS = {
  arms: 'Arms m',
  minKpc: 'Rings from R (kpc)',
  maxKpc: 'Rings to R (kpc)',
  widthKpc: 'Ring width (kpc)',
  resamples: 'Resamples',
  seed: 'Seed',
} as const;

/** The request body of the draft, checked with the endpoint's schema; problems name the field. */
function checkDraft(draft: Draft, catalogIds: string[]) {
  const problems: string[] = [];
  const num = (field: keyof typeof LABELS) => {
    const t = draft[field].trim();
    const v = Number(t);
    if (t === '' || !Number.isFinite(v)) problems.push(`${LABELS[field]}: “${t}” is not a number.`);
    return v;
  };
  const body = {
    kind: 'external-galaxy' as const,
    catalogIds,
    arms: num('arms'),
    rings: { minKpc: num('minKpc'), maxKpc: num('maxKpc'), widthKpc: num('widthKpc') },
    resamples: num('resamples'),
    seed: num('seed'),
  };
  if (catalogIds.length === 0) problems.push('Catalogs: choose at least one.');
  if (problems.length) return { body: null, problems };
  const parsed = externalAnalysisSchema.safeParse(body);
  if (!parsed.success) {
    const label = (path: PropertyKey[]) => {
      const key = path.map(String).join('.');
      const last = path[path.length - 1];
      return key.startsWith('rings') && typeof last === 'string' && last in LABELS
        ? LABELS[last as keyof typeof LABELS]
        : key in LABELS
          ? LABELS[key as keyof typeof LABELS]
          : key === 'rings'
            ? 'Rings'
            : key || 'Request';
    };
    return {
      body: null,
      problems: parsed.error.issues.map((i) => `${label(i.path)}: ${i.message}`),
    };
  }
  return { body, problems };
}

function RunForm({ projectId, catalogs }: { projectId: string; catalogs: CatalogJson[] }) {
  const router = useRouter();
  const qc = useQueryClient();
  const ready = catalogs.filter((c) => c.status === 'ready');
  const [draft, setDraft] = useState<Draft>({
    catalogIds: null,
    arms: '2',
    minKpc: '1',
    maxKpc: '12',
    widthKpc: '1',
    resamples: String(MIN_RESAMPLES),
    seed: '1',
  });
  // Until the user chooses, every ready catalog is in.
  const chosen = draft.catalogIds ?? ready.map((c) => c.id);
  const { body, problems } = checkDraft(draft, chosen);
  const start = useMutation({
    mutationFn: (json: NonNullable<typeof body>) =>
      api<{ analysis: { id: string } }>(`/api/projects/${projectId}/analyses`, {
        method: 'POST',
        json,
      }),
    onSuccess: ({ analysis }) => {
      void qc.invalidateQueries({ queryKey: analysesKey(projectId) });
      router.push(`/projects/${projectId}/arms?analysis=${analysis.id}#result`, { scroll: false });
    },
  });
  if (ready.length === 0)
    return (
      <EmptyState title="No ready catalog yet">
        The analysis deprojects the sources of gas and young-star catalogs in RA/Dec.{' '}
        <Link className="text-accent hover:underline" href={`/projects/${projectId}/catalogs/new`}>
          Upload a catalog
        </Link>{' '}
        of clouds and one of HII regions or young clusters first.
      </EmptyState>
    );
  const field = (key: keyof typeof LABELS, hint?: string) => (
    <TextField
      label={LABELS[key]}
      hint={hint}
      inputMode="decimal"
      value={draft[key]}
      onChange={(e) => setDraft({ ...draft, [key]: e.target.value })}
    />
  );
  return (
    <form
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        if (body) start.mutate(body);
      }}
    >
      <fieldset className="space-y-1 text-sm">
        <legend className="mb-1 font-medium text-ink">Catalogs</legend>
        {ready.map((c) => (
          <label key={c.id} className="flex items-center gap-2">
            <input
              type="checkbox"
              checked={chosen.includes(c.id)}
              onChange={(e) =>
                setDraft({
                  ...draft,
                  catalogIds: e.target.checked
                    ? [...chosen, c.id]
                    : chosen.filter((id) => id !== c.id),
                })
              }
            />
            <TracerBadge kind={c.kind} />
            <span>{c.name}</span>
            <span className="num text-xs text-ink-soft">{c.rowCount} rows</span>
          </label>
        ))}
        <p className="text-xs text-ink-soft">
          Gas: HI and CO; young stars: HII and OB. Other catalogs are drawn but not measured.
        </p>
      </fieldset>
      <div className="grid gap-3 sm:grid-cols-3">
        {field('arms', 'lags limited to ±180°/m')}
        {field('minKpc')}
        {field('maxKpc')}
        {field('widthKpc')}
        {field('resamples', `bootstrap, ≥ ${MIN_RESAMPLES}`)}
        {field('seed', 'same seed, same intervals')}
      </div>
      {problems.map((p) => (
        <ErrorNote key={p}>{p}</ErrorNote>
      ))}
      {start.error && <ErrorNote>The analysis was not started: {start.error.message}</ErrorNote>}
      <Button type="submit" disabled={!body || start.isPending}>
        Start external-galaxy analysis
      </Button>
    </form>
  );
}

type ListedExternal = ExternalAnalysisListItem &
  AnalysisLifecycleJson & { runName: string | null; catalogIds: string[] | null };

function AnalysisList({
  items,
  projectId,
  selected,
  canEdit,
  onChanged,
  onDeleted,
}: {
  items: ListedExternal[];
  projectId: string;
  selected: string | null;
  canEdit: boolean;
  onChanged: () => void;
  onDeleted: (id: string) => void;
}) {
  if (items.length === 0)
    return (
      <p className="text-sm text-ink-soft">
        No external-galaxy analysis yet. Each one you start is kept here to reopen.
      </p>
    );
  return (
    <div className="relative overflow-x-auto rounded-lg border border-rule bg-white/70">
      <table className="w-full text-sm" aria-label="External-galaxy analyses">
        <thead className="border-b border-rule text-left text-xs tracking-wide text-ink-soft">
          <tr>
            <th className="px-3 py-2">Analysis</th>
            <th className="px-3 py-2">Started</th>
            <th className="px-3 py-2">Status</th>
            <th className="px-3 py-2 text-right">m</th>
            <th className="px-3 py-2 text-right">Fitted Ω_p (km/s/kpc)</th>
            <th className="px-3 py-2 text-right">Fitted t (Myr)</th>
            <th className="px-3 py-2">
              <span className="sr-only">Open</span>
            </th>
          </tr>
        </thead>
        <tbody className="divide-y divide-rule/70">
          {items.map((a) => (
            <tr
              key={a.id}
              className={a.id === selected ? 'bg-accent-soft/40' : 'hover:bg-paper-deep/40'}
            >
              <td className="px-3 py-2">
                <span className="font-medium">{a.name}</span>
                {a.archivedAt && <span className="ml-1.5 text-xs text-ink-soft">archived</span>}
                <span className="block text-xs text-ink-soft">
                  {a.runName
                    ? `members of run ${a.runName}`
                    : `${a.catalogIds?.length ?? 0} catalogs`}
                </span>
                {a.note && (
                  <span className="block max-w-xs truncate text-xs" title={a.note}>
                    {a.note}
                  </span>
                )}
              </td>
              <td className="px-3 py-2 text-xs">{fmtWhen(a.createdAt)}</td>
              <td className="px-3 py-2">
                <span className="flex items-center gap-2">
                  {ANALYSIS_STATUS_WORDS[a.status]}
                  {!isFinalAnalysis(a.status) && (
                    <ProgressBar value={a.progress} label="Progress of the analysis" />
                  )}
                </span>
              </td>
              <td className="num px-3 py-2">{a.params.arms ?? '—'}</td>
              <td className="num px-3 py-2">{fmt(a.summary?.patternSpeedKmsKpc, 1)}</td>
              <td className="num px-3 py-2">{fmt(a.summary?.timescaleMyr, 1)}</td>
              <td className="px-3 py-2">
                {a.id === selected ? (
                  <span className="text-xs text-ink-soft">shown below</span>
                ) : (
                  <Link
                    href={`/projects/${projectId}/arms?analysis=${a.id}#result`}
                    scroll={false}
                    className="text-accent hover:underline"
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
                      onChanged={onChanged}
                      onDeleted={() => onDeleted(a.id)}
                    />
                  </span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/**
 * The Arms & ordering page of a project whose target is an external galaxy: the analysis form
 * (catalogs, m, rings, resamples, seed), the project's external-galaxy analyses, and the chosen
 * one. The galaxy itself comes from the project's target.
 */
export function ExternalWorkspace({
  projectId,
  target,
  canEdit,
  analysisId,
}: {
  projectId: string;
  target: ExternalTarget;
  canEdit: boolean;
  analysisId: string | null;
}) {
  const catalogs = useQuery({
    queryKey: ['catalogs', projectId],
    queryFn: () => api<{ catalogs: CatalogJson[] }>(`/api/projects/${projectId}/catalogs`),
  });
  const router = useRouter();
  const qc = useQueryClient();
  const [showArchived, setShowArchived] = useState(false);
  const analyses = useQuery({
    queryKey: showArchived ? [...analysesKey(projectId), 'with-archived'] : analysesKey(projectId),
    queryFn: () =>
      api<{ analyses: ListedExternal[] }>(
        `/api/projects/${projectId}/analyses${showArchived ? '?archived=include' : ''}`,
      ),
    refetchInterval: (q) =>
      q.state.data?.analyses.some((a) => !isFinalAnalysis(a.status)) ? ANALYSIS_POLL_MS : false,
  });
  const items = (analyses.data?.analyses ?? []).filter((a) => a.kind === 'external-galaxy');
  return (
    <div className="space-y-6">
      <div className="grid gap-6 2xl:grid-cols-2">
        {canEdit && (
          <Panel title="Run an external-galaxy analysis">
            {catalogs.error ? (
              <ErrorNote>Could not load the catalogs: {catalogs.error.message}</ErrorNote>
            ) : catalogs.isPending ? (
              <p className="text-sm text-ink-soft">Loading catalogs…</p>
            ) : (
              <RunForm projectId={projectId} catalogs={catalogs.data.catalogs} />
            )}
          </Panel>
        )}
        <Panel title="Analyses">
          {analyses.error ? (
            <ErrorNote>Could not load the analyses: {analyses.error.message}</ErrorNote>
          ) : analyses.isPending ? (
            <p className="text-sm text-ink-soft">Loading analyses…</p>
          ) : (
            <>
              <ShowArchived checked={showArchived} onChange={setShowArchived} />
              <AnalysisList
                items={items}
                projectId={projectId}
                selected={analysisId}
                canEdit={canEdit}
                onChanged={() => void qc.invalidateQueries({ queryKey: analysesKey(projectId) })}
                onDeleted={(id) => {
                  void qc.invalidateQueries({ queryKey: analysesKey(projectId) });
                  if (id === analysisId)
                    router.replace(`/projects/${projectId}/arms`, { scroll: false });
                }}
              />
            </>
          )}
        </Panel>
      </div>
      {analysisId && (
        <ExternalView key={analysisId} analysisId={analysisId} targetGalaxy={target.galaxy} />
      )}
    </div>
  );
}
