'use client';

import { keepPreviousData, useQuery } from '@tanstack/react-query';
import Link from 'next/link';
import { useRouter, useSearchParams } from 'next/navigation';
import { api } from '@/lib/api-client';
import { listSearch, type ComplexNeighbours, type ReviewProgress } from '@/lib/schemas/complexes';
import { ComplexLv } from '@/components/plots/complex-lv';
import { ComplexSky } from '@/components/plots/complex-sky';
import { LinksTable } from '@/components/tables/complex-links-table';
import { ComplexMembersTable } from '@/components/tables/complex-members-table';
import { ErrorNote, PageHeader, Panel } from '@/components/ui/panel';
import { TracerBadge } from '@/components/ui/tracer-badge';
import { TRACER_KINDS } from '@/lib/tracers';
import { AnalysisPlacementPanel } from './analysis-placement-panel';
import { fmt, fmtCount } from './format';
import { DistancePanel } from './distance-panel';
import { ReviewKeyLegend, usePageKeys } from './review-keys';
import { ReviewPanel } from './review-panel';
import { useRun } from './run-detail';
import { retryUnlessGone } from './run-status';
import type { ComplexDetail as ComplexDetailJson, ComplexPage } from './types';

/** Complexes drawn behind the highlighted one in the longitude–velocity plane. */
const BACKGROUND_SIZE = 500;

function Fact({
  label,
  children,
  testId,
}: {
  label: React.ReactNode;
  children: React.ReactNode;
  testId?: string;
}) {
  return (
    <div>
      <dt className="text-xs text-ink-soft">{label}</dt>
      <dd className="num mt-0.5 text-left" data-testid={testId}>
        {children}
      </dd>
    </div>
  );
}

/**
 * One complex: its facts, members (canonical and original columns), links, a sky plot with the
 * match circles, its place in the longitude–velocity plane, its review with history, and where
 * the run's latest ordering analysis placed it. The address carries the list it was opened from
 * (filters and sort), so previous/next (j/k) and next not reviewed (n) move through that list.
 */
export function ComplexDetail({
  projectId,
  runId,
  complexId,
  canEdit,
}: {
  projectId: string;
  runId: string;
  complexId: string;
  canEdit: boolean;
}) {
  const router = useRouter();
  const list = listSearch(useSearchParams()).toString();
  const run = useRun(runId);
  const detail = useQuery({
    queryKey: ['complex', runId, complexId],
    queryFn: () =>
      api<{ complex: ComplexDetailJson }>(`/api/link-runs/${runId}/complexes/${complexId}`),
    retry: retryUnlessGone,
  });
  const neighbours = useQuery({
    queryKey: ['complexes', runId, 'neighbours', complexId, list],
    queryFn: () =>
      api<ComplexNeighbours>(
        `/api/link-runs/${runId}/complexes/${complexId}/neighbours${list ? `?${list}` : ''}`,
      ),
    placeholderData: keepPreviousData,
    retry: retryUnlessGone,
  });
  const progress = useQuery({
    queryKey: ['complexes', runId, 'progress', list],
    queryFn: () =>
      api<ReviewProgress>(`/api/link-runs/${runId}/complexes/review${list ? `?${list}` : ''}`),
    placeholderData: keepPreviousData,
    retry: retryUnlessGone,
  });
  const runBase = `/projects/${projectId}/link-runs/${runId}`;
  const hrefOf = (id: string) => `${runBase}/complexes/${id}${list ? `?${list}` : ''}`;
  // Neighbours of this complex only: while the next one loads, the keys wait for its own.
  const near = neighbours.data && !neighbours.isPlaceholderData ? neighbours.data : null;
  usePageKeys((key) => {
    const to = { j: near?.next, k: near?.prev, n: near?.nextUnreviewed }[key];
    if (to === undefined) return false;
    if (to !== null) router.push(hrefOf(to));
    return true;
  });
  const background = useQuery({
    queryKey: ['complexes', runId, 'lv-background'],
    queryFn: () =>
      api<ComplexPage>(
        `/api/link-runs/${runId}/complexes?sort=size&dir=desc&pageSize=${BACKGROUND_SIZE}`,
      ),
    placeholderData: keepPreviousData,
    staleTime: 60_000,
  });
  if (detail.isError)
    return <ErrorNote>Could not load the complex: {detail.error.message}</ErrorNote>;
  if (run.isError) return <ErrorNote>Could not load the link run: {run.error.message}</ErrorNote>;
  if (detail.isPending || run.isPending)
    return <p className="text-sm text-ink-soft">Loading the complex…</p>;
  const c = detail.data.complex;
  const r = run.data.run;
  const prev = near?.prev ?? null;
  const next = near?.next ?? null;
  const names = new Map(c.members.map((m) => [m.catalogId, m.catalogName]));
  for (const cat of r.catalogs) if (!names.has(cat.id)) names.set(cat.id, cat.name);
  const catalogName = (id: string) => names.get(id) ?? id;
  const stem = `complex-${c.id}`;
  const bg = background.data?.complexes.filter((x) => x.id !== c.id) ?? [];
  const bgTotal = background.data?.total ?? 0;
  const bgNote = background.error
    ? 'The other complexes could not be loaded for the background.'
    : `Grey: centroids of ${bgTotal > BACKGROUND_SIZE ? `the ${BACKGROUND_SIZE} largest of ${fmtCount(bgTotal)}` : 'the other'} complexes of this run.`;
  const pager = 'rounded-md border border-rule bg-white/60 px-2.5 py-1 text-sm hover:bg-white';
  return (
    <div className="space-y-6">
      <PageHeader
        title={`Complex ${c.id}${c.name ? ` — ${c.name}` : ''}`}
        lead={`From the link run “${r.name}”.`}
        actions={
          <nav aria-label="Complexes" className="flex items-center gap-2">
            <Link
              href={`${runBase}${list ? `?${list}` : ''}`}
              className="text-sm text-ink-soft hover:text-ink"
            >
              Back to the run
            </Link>
            {prev !== null && (
              <Link href={hrefOf(prev)} className={pager}>
                ← Complex {prev}
              </Link>
            )}
            {next !== null && (
              <Link href={hrefOf(next)} className={pager}>
                Complex {next} →
              </Link>
            )}
          </nav>
        }
      />
      <div className="space-y-1">
        <p className="text-sm" data-testid="list-place">
          {near && near.position !== null
            ? `Complex ${fmtCount(near.position)} of ${fmtCount(near.total)} in this list`
            : near
              ? `Not in this list (of ${fmtCount(near.total)}) any more`
              : ''}
          {progress.data && (
            <span className="text-ink-soft" data-testid="review-progress">
              {' '}
              · {fmtCount(progress.data.run.reviewed)} of {fmtCount(progress.data.run.total)}{' '}
              reviewed in this run
              {list &&
                ` · ${fmtCount(progress.data.filter.reviewed)} of ${fmtCount(progress.data.filter.total)} in this list`}
            </span>
          )}
          {near && near.nextUnreviewed === null && (
            <span className="text-ok"> · nothing left to review in this list</span>
          )}
        </p>
        <ReviewKeyLegend canEdit={canEdit} />
      </div>
      {c.overCap && (
        <p
          role="status"
          className="rounded-md border border-tracer-other/50 bg-tracer-other/10 px-3 py-2 text-sm"
        >
          This complex is larger than the run’s size cap. Long chains of links often mean the
          tolerances are too wide for a crowded sight line.
        </p>
      )}
      <Panel>
        <dl className="grid grid-cols-2 gap-4 text-sm sm:grid-cols-4 lg:grid-cols-8">
          <Fact label="members" testId="complex-size">
            {fmtCount(c.size)}
          </Fact>
          <Fact label="links">{fmtCount(c.linkCount)}</Fact>
          <Fact label="l (°)">{fmt(c.l, 4)}</Fact>
          <Fact label="b (°)">{fmt(c.b, 4)}</Fact>
          <Fact
            label={
              <>
                v<sub>LSR</sub> (km/s)
              </>
            }
          >
            {fmt(c.v, 2)}
          </Fact>
          <Fact label="max sep (″)">{fmt(c.maxSepArcsec, 1)}</Fact>
          <Fact label="max Δv (km/s)">{fmt(c.maxDvKms, 2)}</Fact>
          <Fact label="reliability">{fmt(c.reliability, 3)}</Fact>
        </dl>
        <div className="mt-3 flex flex-wrap gap-2">
          {TRACER_KINDS.filter((k) => c.counts[k] > 0).map((k) => (
            <span key={k} className="inline-flex items-center gap-1">
              <TracerBadge kind={k} />
              <span className="num text-xs">× {c.counts[k]}</span>
            </span>
          ))}
        </div>
      </Panel>
      <div className="grid grid-cols-1 gap-6 2xl:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="2xl:sticky 2xl:top-6 2xl:order-last 2xl:self-start">
          <ReviewPanel key={c.id} runId={runId} complex={c} history={c.history} canEdit={canEdit} />
          <div className="mt-6">
            <AnalysisPlacementPanel projectId={projectId} analysis={c.analysis} />
          </div>
          <div className="mt-6">
            <DistancePanel
              key={`d${c.id}`}
              runId={runId}
              complexId={c.id}
              current={c.distanceOverride}
              canEdit={canEdit}
            />
          </div>
        </div>
        <div className="space-y-6">
          <Panel title="Members">
            <ComplexMembersTable members={c.members} />
          </Panel>
          <Panel title="Links">
            <LinksTable links={c.links} catalogName={catalogName} label="Links of the complex" />
          </Panel>
          <Panel title="Plots">
            <div className="flex flex-wrap gap-6">
              <ComplexSky
                members={c.members}
                links={c.links}
                l0={c.l}
                b0={c.b}
                fileStem={`${stem}-sky`}
              />
              <ComplexLv
                members={c.members}
                background={bg}
                backgroundNote={bgNote}
                fileStem={`${stem}-lv`}
              />
            </div>
          </Panel>
        </div>
      </div>
    </div>
  );
}
