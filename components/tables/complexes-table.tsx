'use client';

import { keepPreviousData, useQuery } from '@tanstack/react-query';
import {
  createColumnHelper,
  getCoreRowModel,
  useReactTable,
  type PaginationState,
  type SortingState,
} from '@tanstack/react-table';
import Link from 'next/link';
import { useState } from 'react';
import { api } from '@/lib/api-client';
import { TRACER_KINDS, tracerStyle } from '@/lib/tracers';
import {
  REVIEW_TONE,
  REVIEW_WORDS,
  fmt,
  fmtCount,
  fmtRange,
  fmtWhen,
} from '@/components/link-runs/format';
import type { Complex, ComplexPage } from '@/components/link-runs/types';
import { CHOICE_WORDS } from '@/components/ordering/words';
import { Button } from '@/components/ui/button';
import { SortableTable } from './sortable-table';
import { TablePager } from './table-pager';
import { ErrorNote } from '@/components/ui/panel';
import { TracerGlyph } from '@/components/ui/tracer-badge';

/** Columns whose cells are numbers (right-aligned, monospaced). */
/** Right-aligned, tabular figures (see SortableTable). */
const NUMERIC = { numeric: true };

const col = createColumnHelper<Complex>();

/** Column definitions; `href` builds the link to a complex's page. */
function columns(href: (id: string) => string) {
  return [
    col.accessor('id', {
      meta: NUMERIC,
      header: '#',
      cell: (c) => (
        <Link
          href={href(c.getValue())}
          className="text-accent hover:underline"
          aria-label={`Complex ${c.getValue()}`}
        >
          {c.getValue()}
        </Link>
      ),
    }),
    col.accessor('name', {
      header: 'name',
      enableSorting: false,
      cell: (c) => (
        <Link href={href(c.row.original.id)} className="hover:underline">
          {c.getValue() ?? <span className="text-ink-soft">unnamed</span>}
        </Link>
      ),
    }),
    col.accessor('size', {
      meta: NUMERIC,
      header: 'size',
      cell: (c) => (
        <span
          className={c.row.original.overCap ? 'font-semibold text-danger' : ''}
          title={c.row.original.overCap ? 'over the size cap' : undefined}
        >
          {fmtCount(c.getValue())}
        </span>
      ),
    }),
    col.display({
      id: 'classes',
      header: 'classes',
      cell: (c) => (
        <span className="flex gap-2">
          {TRACER_KINDS.filter((k) => c.row.original.counts[k] > 0).map((k) => (
            <span
              key={k}
              className="inline-flex items-center gap-0.5"
              title={`${c.row.original.counts[k]} ${tracerStyle(k).description}`}
            >
              <TracerGlyph kind={k} />
              <span className="text-xs">{tracerStyle(k).label}</span>
              <span className="num text-xs text-ink-soft">{c.row.original.counts[k]}</span>
            </span>
          ))}
        </span>
      ),
    }),
    col.accessor('l', { meta: NUMERIC, header: 'l (°)', cell: (c) => fmt(c.getValue(), 4) }),
    col.accessor('b', { meta: NUMERIC, header: 'b (°)', cell: (c) => fmt(c.getValue(), 4) }),
    col.accessor('v', {
      meta: NUMERIC,
      header: () => (
        <>
          v<sub>LSR</sub> (km/s)
        </>
      ),
      cell: (c) => fmt(c.getValue(), 2),
    }),
    col.accessor('maxSepArcsec', {
      meta: NUMERIC,
      header: 'max sep (″)',
      cell: (c) => fmt(c.getValue(), 1),
    }),
    col.accessor('maxDvKms', {
      meta: NUMERIC,
      header: 'max Δv (km/s)',
      cell: (c) => fmt(c.getValue(), 2),
    }),
    col.accessor('reliability', {
      meta: NUMERIC,
      header: 'reliability',
      cell: (c) => fmt(c.getValue(), 3),
    }),
    col.accessor((c) => c.analysis?.distKpc ?? null, {
      id: 'dist',
      meta: {
        ...NUMERIC,
        title:
          'From the latest ordering analysis of this run: median of the distance draws and its 68 % interval',
      },
      header: 'distance (kpc)',
      cell: (c) => {
        const a = c.row.original.analysis;
        if (!a || a.distKpc === null) return <span className="text-ink-soft">—</span>;
        return (
          <span title={CHOICE_WORDS[a.choice]} data-testid="complex-dist">
            {fmt(a.distKpc, 2)}{' '}
            <span className="text-xs text-ink-soft">{fmtRange(a.distLoKpc, a.distHiKpc, 2)}</span>
          </span>
        );
      },
    }),
    col.accessor((c) => c.analysis?.arm ?? null, {
      id: 'arm',
      header: 'arm',
      enableSorting: false,
      cell: (c) => c.getValue() ?? <span className="text-ink-soft">—</span>,
    }),
    col.accessor('review', {
      header: 'review',
      cell: (c) => {
        const r = c.getValue() ?? 'unreviewed';
        return (
          <span className={REVIEW_TONE[r]} title={c.row.original.reviewNote ?? undefined}>
            {REVIEW_WORDS[r]}
          </span>
        );
      },
    }),
  ];
}

type Filters = {
  minSize: string;
  maxSize: string;
  maxSepArcsec: string;
  maxDvKms: string;
  minReliability: string;
  review: string;
  q: string;
  classes: string[];
};
const NO_FILTERS: Filters = {
  minSize: '',
  maxSize: '',
  maxSepArcsec: '',
  maxDvKms: '',
  minReliability: '',
  review: '',
  q: '',
  classes: [],
};
const NUMBER_FILTERS = [
  ['minSize', 'Size from'],
  ['maxSize', 'Size to'],
  ['maxSepArcsec', 'Max separation'],
  ['maxDvKms', 'Max Δv'],
  ['minReliability', 'Min reliability'],
] as const;

/** The filters as query parameters, or a sentence naming the field and value that is wrong. */
function filterParams(f: Filters): { params: Record<string, string> } | { problem: string } {
  const params: Record<string, string> = {};
  for (const [key, label] of NUMBER_FILTERS) {
    const text = f[key].trim();
    if (text === '') continue;
    const x = Number(text);
    if (!Number.isFinite(x)) return { problem: `${label}: “${text}” is not a number.` };
    if (x < 0) return { problem: `${label}: ${text} is below 0.` };
    params[key] = String(x);
  }
  if (params.minSize && params.maxSize && Number(params.minSize) > Number(params.maxSize)) {
    return {
      problem: `Size: the lower bound ${params.minSize} is above the upper bound ${params.maxSize}.`,
    };
  }
  if (params.minReliability && Number(params.minReliability) > 1) {
    return {
      problem: `Min reliability: ${params.minReliability} is above 1; reliability runs from 0 to 1.`,
    };
  }
  if (f.classes.length) params.classes = f.classes.join(',');
  if (f.review) params.review = f.review;
  if (f.q.trim()) params.q = f.q.trim();
  return { params };
}

/** Which analysis the distance and arm columns come from, or how to get one. */
function AnalysisNote({ projectId, page }: { projectId: string; page: ComplexPage }) {
  const a = page.complexes.find((c) => c.analysis)?.analysis;
  if (page.complexes.length === 0) return null;
  if (!a)
    return (
      <p className="text-xs text-ink-soft">
        Distances and arms appear once an ordering analysis of this run has finished; run one on{' '}
        <Link href={`/projects/${projectId}/arms`} className="text-accent underline">
          Arms &amp; ordering
        </Link>
        .
      </p>
    );
  return (
    <p className="text-xs text-ink-soft" data-testid="complexes-analysis">
      Distance and arm from the{' '}
      <Link
        href={`/projects/${projectId}/arms?analysis=${a.id}#result`}
        className="text-accent underline"
      >
        ordering analysis of {fmtWhen(a.finishedAt)}
      </Link>{' '}
      (the latest of this run).
    </p>
  );
}

const input = 'num w-20 rounded border border-rule bg-white px-2 py-1 text-sm';

/**
 * A run's complexes, paged, sorted and filtered by the server: click a header to sort (ascending,
 * then descending); filter by size, classes present, separation, Δv, reliability, review state
 * and member name. Distance and arm come from the run's latest done ordering analysis. Each row
 * links to the complex's page.
 */
export function ComplexesTable({
  runId,
  projectId,
  kinds,
}: {
  runId: string;
  projectId: string;
  /** Tracer classes of the run's catalogs, offered as "classes present" filters. */
  kinds: string[];
}) {
  const [sorting, setSorting] = useState<SortingState>([{ id: 'id', desc: false }]);
  const [pagination, setPagination] = useState<PaginationState>({ pageIndex: 0, pageSize: 50 });
  const [draft, setDraft] = useState<Filters>(NO_FILTERS);
  const [applied, setApplied] = useState<Record<string, string>>({});
  const [problem, setProblem] = useState<string | null>(null);

  const sort = sorting[0] ?? { id: 'id', desc: false };
  const search = new URLSearchParams({
    page: String(pagination.pageIndex + 1),
    pageSize: String(pagination.pageSize),
    sort: sort.id,
    dir: sort.desc ? 'desc' : 'asc',
    ...applied,
  });
  const { data, error, isFetching } = useQuery({
    queryKey: ['complexes', runId, search.toString()],
    queryFn: () => api<ComplexPage>(`/api/link-runs/${runId}/complexes?${search}`),
    placeholderData: keepPreviousData,
  });
  const total = data?.total ?? 0;
  const pageCount = Math.max(1, Math.ceil(total / pagination.pageSize));
  const base = `/projects/${projectId}/link-runs/${runId}/complexes`;

  // The app does not run the React Compiler; the table instance is used only in this render.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: data?.complexes ?? [],
    columns: columns((id) => `${base}/${id}`),
    getCoreRowModel: getCoreRowModel(),
    manualPagination: true,
    manualSorting: true,
    enableMultiSort: false,
    enableSortingRemoval: false,
    sortDescFirst: false,
    pageCount,
    rowCount: total,
    state: { sorting, pagination },
    onSortingChange: (updater) => {
      setSorting(updater);
      setPagination((p) => ({ ...p, pageIndex: 0 }));
    },
    onPaginationChange: setPagination,
    getRowId: (r) => r.id,
  });

  const offered = TRACER_KINDS.filter((k) => kinds.includes(k));

  return (
    <div className="space-y-3">
      <form
        className="space-y-2 rounded-md border border-rule bg-paper-deep/30 p-3"
        aria-label="Filter complexes"
        onSubmit={(e) => {
          e.preventDefault();
          const checked = filterParams(draft);
          if ('problem' in checked) {
            setProblem(checked.problem);
            return;
          }
          setProblem(null);
          setApplied(checked.params);
          setPagination((p) => ({ ...p, pageIndex: 0 }));
        }}
      >
        <div className="flex flex-wrap items-center gap-x-5 gap-y-2 text-sm">
          <label className="flex items-center gap-1">
            <span className="font-medium">Size</span>
            <input
              aria-label="Size from"
              inputMode="numeric"
              className={input}
              value={draft.minSize}
              onChange={(e) => setDraft({ ...draft, minSize: e.target.value })}
            />
            <span className="text-ink-soft">to</span>
            <input
              aria-label="Size to"
              inputMode="numeric"
              className={input}
              value={draft.maxSize}
              onChange={(e) => setDraft({ ...draft, maxSize: e.target.value })}
            />
          </label>
          <label className="flex items-center gap-1">
            <span className="font-medium">max sep ≤</span>
            <input
              aria-label="Max separation"
              inputMode="decimal"
              className={input}
              value={draft.maxSepArcsec}
              onChange={(e) => setDraft({ ...draft, maxSepArcsec: e.target.value })}
            />
            <span className="text-xs text-ink-soft">″</span>
          </label>
          <label className="flex items-center gap-1">
            <span className="font-medium">max Δv ≤</span>
            <input
              aria-label="Max Δv"
              inputMode="decimal"
              className={input}
              value={draft.maxDvKms}
              onChange={(e) => setDraft({ ...draft, maxDvKms: e.target.value })}
            />
            <span className="text-xs text-ink-soft">km/s</span>
          </label>
          <label className="flex items-center gap-1">
            <span className="font-medium">reliability ≥</span>
            <input
              aria-label="Min reliability"
              inputMode="decimal"
              className={input}
              value={draft.minReliability}
              onChange={(e) => setDraft({ ...draft, minReliability: e.target.value })}
            />
          </label>
        </div>
        <div className="flex flex-wrap items-center gap-x-5 gap-y-2 text-sm">
          {offered.length > 1 && (
            <fieldset className="flex items-center gap-3">
              <legend className="float-left mr-1 font-medium">Classes present</legend>
              {offered.map((k) => (
                <label key={k} className="flex items-center gap-1">
                  <input
                    type="checkbox"
                    className="accent-accent"
                    checked={draft.classes.includes(k)}
                    onChange={() =>
                      setDraft({
                        ...draft,
                        classes: draft.classes.includes(k)
                          ? draft.classes.filter((x) => x !== k)
                          : [...draft.classes, k],
                      })
                    }
                  />
                  <TracerGlyph kind={k} />
                  {tracerStyle(k).label}
                </label>
              ))}
            </fieldset>
          )}
          <label className="flex items-center gap-1">
            <span className="font-medium">Review</span>
            <select
              aria-label="Review state"
              className="rounded border border-rule bg-white px-2 py-1"
              value={draft.review}
              onChange={(e) => setDraft({ ...draft, review: e.target.value })}
            >
              <option value="">any</option>
              <option value="unreviewed">not reviewed</option>
              <option value="accepted">accepted</option>
              <option value="doubtful">doubtful</option>
              <option value="rejected">rejected</option>
            </select>
          </label>
          <input
            type="search"
            placeholder="Member name contains…"
            aria-label="Search member names"
            className="w-56 rounded border border-rule bg-white px-2 py-1"
            value={draft.q}
            onChange={(e) => setDraft({ ...draft, q: e.target.value })}
          />
          <Button type="submit" variant="quiet" className="px-2.5 py-1">
            Apply filters
          </Button>
          <Button
            type="button"
            variant="quiet"
            className="px-2.5 py-1"
            disabled={Object.keys(applied).length === 0 && draft === NO_FILTERS}
            onClick={() => {
              setDraft(NO_FILTERS);
              setApplied({});
              setProblem(null);
              setPagination((p) => ({ ...p, pageIndex: 0 }));
            }}
          >
            Clear
          </Button>
        </div>
      </form>
      <ErrorNote>{problem ?? (error && `Could not load complexes: ${error.message}`)}</ErrorNote>
      {data && <AnalysisNote projectId={projectId} page={data} />}

      <div
        className={`overflow-x-auto rounded-md border border-rule bg-white ${isFetching ? 'opacity-70' : ''}`}
      >
        <SortableTable table={table} label="Complexes" busy={isFetching} />
        {data && data.complexes.length === 0 && (
          <p className="px-3 py-6 text-center text-sm text-ink-soft">
            {Object.keys(applied).length
              ? 'No complex matches. Widen the filters or clear them.'
              : 'This run found no complexes.'}
          </p>
        )}
      </div>

      <TablePager
        table={table}
        total={total}
        pagination={pagination}
        setPagination={setPagination}
        sizeLabel="Complexes per page"
        rangeTestId="complexes-range"
      />
    </div>
  );
}
