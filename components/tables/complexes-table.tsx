'use client';

import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import {
  createColumnHelper,
  getCoreRowModel,
  useReactTable,
  type PaginationState,
  type SortingState,
  type Updater,
} from '@tanstack/react-table';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { api } from '@/lib/api-client';
import type { ComplexNeighbours, ReviewProgress } from '@/lib/schemas/complexes';
import { TRACER_KINDS, tracerStyle } from '@/lib/tracers';
import { BulkReviewBar, type Selection } from '@/components/link-runs/bulk-review';
import {
  REVIEW_TONE,
  REVIEW_WORDS,
  fmt,
  fmtCount,
  fmtRange,
  fmtWhen,
} from '@/components/link-runs/format';
import { useListParams } from '@/components/link-runs/list-params';
import { ReviewKeyLegend, VERDICT_KEYS, usePageKeys } from '@/components/link-runs/review-keys';
import type { Complex, ComplexPage } from '@/components/link-runs/types';
import { CHOICE_WORDS } from '@/components/ordering/words';
import { Button } from '@/components/ui/button';
import { SortableTable } from './sortable-table';
import { TablePager } from './table-pager';
import { ErrorNote } from '@/components/ui/panel';
import { TracerGlyph } from '@/components/ui/tracer-badge';

/** Right-aligned, tabular figures (see SortableTable). */
const NUMERIC = { numeric: true };

const col = createColumnHelper<Complex>();

/** Row checkboxes of the bulk review, for editors. */
type SelectColumn = {
  isSelected: (id: string) => boolean;
  toggle: (id: string) => void;
  pageSelected: boolean;
  togglePage: () => void;
};

/** Column definitions; `href` builds the link to a complex's page (with the list it came from). */
function columns(href: (id: string) => string, select: SelectColumn | null) {
  const selectColumn = select
    ? [
        col.display({
          id: 'select',
          header: () => (
            <input
              type="checkbox"
              className="accent-accent"
              aria-label="Select the complexes of this page"
              checked={select.pageSelected}
              onChange={select.togglePage}
            />
          ),
          cell: (c) => (
            <input
              type="checkbox"
              className="accent-accent"
              aria-label={`Select complex ${c.row.original.id}`}
              checked={select.isSelected(c.row.original.id)}
              onChange={() => select.toggle(c.row.original.id)}
            />
          ),
        }),
      ]
    : [];
  return [
    ...selectColumn,
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
      cell: (c) => c.getValue() ?? <span className="text-ink-soft">—</span>,
    }),
    col.accessor('review', {
      header: 'review',
      cell: (c) => {
        const r = c.getValue() ?? 'unreviewed';
        return (
          <span
            className={REVIEW_TONE[r]}
            title={c.row.original.reviewNote ?? undefined}
            data-testid="row-review"
          >
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
  minDistKpc: string;
  maxDistKpc: string;
  arm: string;
  review: string;
  q: string;
  classes: string[];
};
const NUMBER_FILTERS = [
  ['minSize', 'Size from'],
  ['maxSize', 'Size to'],
  ['maxSepArcsec', 'Max separation'],
  ['maxDvKms', 'Max Δv'],
  ['minReliability', 'Min reliability'],
  ['minDistKpc', 'Distance from'],
  ['maxDistKpc', 'Distance to'],
] as const;

/** The form's fields from the filters in the address. */
function draftOf(applied: Record<string, string>): Filters {
  const text = (k: keyof Omit<Filters, 'classes'>) => applied[k] ?? '';
  return {
    minSize: text('minSize'),
    maxSize: text('maxSize'),
    maxSepArcsec: text('maxSepArcsec'),
    maxDvKms: text('maxDvKms'),
    minReliability: text('minReliability'),
    minDistKpc: text('minDistKpc'),
    maxDistKpc: text('maxDistKpc'),
    arm: text('arm'),
    review: text('review'),
    q: text('q'),
    classes: applied.classes ? applied.classes.split(',') : [],
  };
}

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
  for (const [lo, hi, label] of [
    ['minSize', 'maxSize', 'Size'],
    ['minDistKpc', 'maxDistKpc', 'Distance'],
  ] as const) {
    if (params[lo] && params[hi] && Number(params[lo]) > Number(params[hi]))
      return {
        problem: `${label}: the lower bound ${params[lo]} is above the upper bound ${params[hi]}.`,
      };
  }
  if (params.minReliability && Number(params.minReliability) > 1) {
    return {
      problem: `Min reliability: ${params.minReliability} is above 1; reliability runs from 0 to 1.`,
    };
  }
  if (f.classes.length) params.classes = f.classes.join(',');
  if (f.review) params.review = f.review;
  if (f.arm) params.arm = f.arm;
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
 * The filter form. Its fields start from the filters in the address (it is remounted when they
 * change, so back/forward show the filters of the view they return to).
 */
function FilterForm({
  applied,
  offered,
  arms,
  onApply,
}: {
  applied: Record<string, string>;
  offered: string[];
  arms: string[];
  onApply: (params: Record<string, string>) => void;
}) {
  const [draft, setDraft] = useState<Filters>(() => draftOf(applied));
  const [problem, setProblem] = useState<string | null>(null);
  const numberField = (
    key: (typeof NUMBER_FILTERS)[number][0],
    label: string,
    mode = 'decimal',
  ) => (
    <input
      aria-label={label}
      inputMode={mode as 'decimal' | 'numeric'}
      className={input}
      value={draft[key]}
      onChange={(e) => setDraft({ ...draft, [key]: e.target.value })}
    />
  );
  const armChoices = draft.arm && !arms.includes(draft.arm) ? [...arms, draft.arm] : arms;
  return (
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
        onApply(checked.params);
      }}
    >
      <div className="flex flex-wrap items-center gap-x-5 gap-y-2 text-sm">
        <label className="flex items-center gap-1">
          <span className="font-medium">Size</span>
          {numberField('minSize', 'Size from', 'numeric')}
          <span className="text-ink-soft">to</span>
          {numberField('maxSize', 'Size to', 'numeric')}
        </label>
        <label className="flex items-center gap-1">
          <span className="font-medium">max sep ≤</span>
          {numberField('maxSepArcsec', 'Max separation')}
          <span className="text-xs text-ink-soft">″</span>
        </label>
        <label className="flex items-center gap-1">
          <span className="font-medium">max Δv ≤</span>
          {numberField('maxDvKms', 'Max Δv')}
          <span className="text-xs text-ink-soft">km/s</span>
        </label>
        <label className="flex items-center gap-1">
          <span className="font-medium">reliability ≥</span>
          {numberField('minReliability', 'Min reliability')}
        </label>
        <label className="flex items-center gap-1">
          <span className="font-medium">distance</span>
          {numberField('minDistKpc', 'Distance from')}
          <span className="text-ink-soft">to</span>
          {numberField('maxDistKpc', 'Distance to')}
          <span className="text-xs text-ink-soft">kpc</span>
        </label>
        {armChoices.length > 0 && (
          <label className="flex items-center gap-1">
            <span className="font-medium">Arm</span>
            <select
              aria-label="Arm"
              className="rounded border border-rule bg-white px-2 py-1"
              value={draft.arm}
              onChange={(e) => setDraft({ ...draft, arm: e.target.value })}
            >
              <option value="">any</option>
              {armChoices.map((a) => (
                <option key={a} value={a}>
                  {a}
                </option>
              ))}
            </select>
          </label>
        )}
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
          disabled={Object.keys(applied).length === 0}
          onClick={() => onApply({})}
        >
          Clear
        </Button>
      </div>
      <ErrorNote>{problem}</ErrorNote>
    </form>
  );
}

/** "n of N reviewed", for the run and for the filters. */
function ProgressLine({ progress, filtered }: { progress: ReviewProgress; filtered: boolean }) {
  const part = (p: { reviewed: number; total: number }) =>
    `${fmtCount(p.reviewed)} of ${fmtCount(p.total)} reviewed`;
  return (
    <p className="text-sm" data-testid="review-progress">
      <span className="font-medium">{part(progress.run)}</span> in this run
      {filtered && (
        <span className="text-ink-soft"> · {part(progress.filter)} matching the filters</span>
      )}
    </p>
  );
}

/**
 * A run's complexes, paged, sorted and filtered by the server, with the view (filters, sort,
 * page) in the address. Click a header to sort (ascending, then descending); filter by size,
 * classes present, separation, Δv, reliability, distance and arm of the latest analysis, review
 * state and member name. Editors review from the keyboard (a cursor row moved with j/k) or in
 * bulk on a selection. Each row links to the complex's page, which moves through the same list.
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
  const router = useRouter();
  const qc = useQueryClient();
  const lp = useListParams();
  const sorting: SortingState = [{ id: lp.sort, desc: lp.desc }];
  const pagination: PaginationState = { pageIndex: lp.page - 1, pageSize: lp.pageSize };
  const filterSearch = new URLSearchParams(lp.filters).toString();
  const filtered = filterSearch !== '';
  const search = new URLSearchParams({
    page: String(lp.page),
    pageSize: String(lp.pageSize),
    sort: lp.sort,
    dir: lp.desc ? 'desc' : 'asc',
    ...lp.filters,
  });
  const view = search.toString();
  const { data, error, isFetching } = useQuery({
    queryKey: ['complexes', runId, view],
    queryFn: () => api<ComplexPage>(`/api/link-runs/${runId}/complexes?${search}`),
    placeholderData: keepPreviousData,
  });
  const progress = useQuery({
    queryKey: ['complexes', runId, 'progress', filterSearch],
    queryFn: () =>
      api<ReviewProgress & { canReview: boolean }>(
        `/api/link-runs/${runId}/complexes/review?${filterSearch}`,
      ),
    placeholderData: keepPreviousData,
  });
  const canEdit = progress.data?.canReview ?? false;
  const total = data?.total ?? 0;
  const rows = data?.complexes ?? [];
  const pageCount = Math.max(1, Math.ceil(total / lp.pageSize));
  const base = `/projects/${projectId}/link-runs/${runId}/complexes`;
  const listQs = lp.list.toString();
  const href = (id: string) => `${base}/${id}${listQs ? `?${listQs}` : ''}`;

  // Selection and cursor belong to one list (filters) and one view (page); they start afresh
  // when those change.
  const [selection, setSelection] = useState<Selection & { list: string }>({
    list: filterSearch,
    ids: new Set(),
    all: false,
  });
  const sel: Selection =
    selection.list === filterSearch ? selection : { ids: new Set(), all: false };
  const setSel = (s: Selection) => setSelection({ ...s, list: filterSearch });
  const [cursorState, setCursorState] = useState<{ view: string; index: number }>({
    view,
    index: -1,
  });
  const cursor = cursorState.view === view ? Math.min(cursorState.index, rows.length - 1) : -1;
  const setCursor = (index: number, inView = view) => setCursorState({ view: inView, index });
  const [message, setMessage] = useState<string | null>(null);

  const pageSelected = rows.length > 0 && (sel.all || rows.every((r) => sel.ids.has(r.id)));
  const select: SelectColumn | null = canEdit
    ? {
        isSelected: (id) => sel.all || sel.ids.has(id),
        toggle: (id) => {
          const ids = new Set(sel.all ? rows.map((r) => r.id) : sel.ids);
          if (ids.has(id)) ids.delete(id);
          else ids.add(id);
          setSel({ ids, all: false });
        },
        pageSelected,
        togglePage: () => {
          const ids = new Set(sel.all ? [] : sel.ids);
          for (const r of rows) {
            if (pageSelected) ids.delete(r.id);
            else ids.add(r.id);
          }
          setSel({ ids, all: false });
        },
      }
    : null;

  const verdict = useMutation({
    mutationFn: ({ c, review }: { c: Complex; review: string }) =>
      api(`/api/link-runs/${runId}/complexes/${c.id}`, {
        method: 'PATCH',
        json: { review, note: c.reviewNote ?? '' },
      }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: ['complexes', runId] }),
  });

  const pageSearch = (page: number) => {
    const s = new URLSearchParams(search);
    s.set('page', String(page));
    return s.toString();
  };
  const goToPage = (page: number, index: number) => {
    setCursor(index, pageSearch(page));
    lp.update({ page: page === 1 ? null : String(page) });
  };
  /** The next complex not yet reviewed after the cursor: on this page, else on its own page. */
  async function nextUnreviewed() {
    const from = rows[cursor] ?? null;
    const onPage = rows.findIndex((r, i) => i > cursor && r.review === null);
    if (onPage >= 0) return setCursor(onPage);
    const startId = from?.id ?? rows[0]?.id;
    if (startId === undefined) return;
    if (!from && rows[0].review === null) return setCursor(0);
    const qs = lp.list.toString();
    const n = await api<ComplexNeighbours>(
      `/api/link-runs/${runId}/complexes/${startId}/neighbours${qs ? `?${qs}` : ''}`,
    );
    if (n.nextUnreviewed === null) setMessage('Every complex of this list is reviewed.');
    else router.push(href(n.nextUnreviewed));
  }
  usePageKeys((key) => {
    const c = rows[cursor];
    if (key === 'j') {
      if (cursor < rows.length - 1) setCursor(cursor + 1);
      else if (lp.page < pageCount) goToPage(lp.page + 1, 0);
      return true;
    }
    if (key === 'k') {
      if (cursor > 0) setCursor(cursor - 1);
      else if (cursor === -1 && rows.length) setCursor(0);
      else if (lp.page > 1) goToPage(lp.page - 1, lp.pageSize - 1);
      return true;
    }
    if (key === 'n') {
      void nextUnreviewed().catch((e: Error) => setMessage(e.message));
      return true;
    }
    if (key === 'Enter' && c) {
      router.push(href(c.id));
      return true;
    }
    if (key in VERDICT_KEYS && c && canEdit) {
      verdict.mutate({ c, review: VERDICT_KEYS[key] });
      return true;
    }
    if (key === 'x' && c && select) {
      select.toggle(c.id);
      return true;
    }
    return false;
  });

  // The app does not run the React Compiler; the table instance is used only in this render.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: rows,
    columns: columns(href, select),
    getCoreRowModel: getCoreRowModel(),
    manualPagination: true,
    manualSorting: true,
    enableMultiSort: false,
    enableSortingRemoval: false,
    sortDescFirst: false,
    pageCount,
    rowCount: total,
    state: { sorting, pagination },
    onSortingChange: (updater: Updater<SortingState>) => {
      const next = (typeof updater === 'function' ? updater(sorting) : updater)[0];
      if (!next) return;
      lp.update({ sort: next.id, dir: next.desc ? 'desc' : 'asc', page: null });
    },
    onPaginationChange: (updater: Updater<PaginationState>) =>
      setPagination(typeof updater === 'function' ? updater(pagination) : updater),
    getRowId: (r) => r.id,
  });
  function setPagination(p: PaginationState) {
    lp.update({
      page: p.pageIndex === 0 ? null : String(p.pageIndex + 1),
      pageSize: p.pageSize === 50 ? null : String(p.pageSize),
    });
  }

  const offered = TRACER_KINDS.filter((k) => kinds.includes(k));
  const selectedCount = sel.all ? total : sel.ids.size;

  return (
    <div className="space-y-3">
      <FilterForm
        key={filterSearch}
        applied={lp.filters}
        offered={offered}
        arms={progress.data?.arms ?? []}
        onApply={(params) => lp.setFilters(params)}
      />
      <ErrorNote>{error && `Could not load complexes: ${error.message}`}</ErrorNote>
      <div className="flex flex-wrap items-center justify-between gap-3">
        {progress.data && <ProgressLine progress={progress.data} filtered={filtered} />}
        <ReviewKeyLegend
          canEdit={canEdit}
          extra={canEdit ? 'Enter opens the row, x selects it' : 'Enter opens the row'}
        />
      </div>
      {data && <AnalysisNote projectId={projectId} page={data} />}
      {canEdit && pageSelected && !sel.all && total > rows.length && (
        <p className="text-sm">
          The {fmtCount(rows.length)} complexes of this page are selected.{' '}
          <button
            type="button"
            className="text-accent underline"
            onClick={() => setSel({ ids: new Set(), all: true })}
          >
            Select all {fmtCount(total)} matching the filters
          </button>
        </p>
      )}
      {canEdit && selectedCount > 0 && (
        <div className="space-y-1">
          <BulkReviewBar
            runId={runId}
            selection={sel}
            total={total}
            filters={lp.filters}
            onDone={(m) => {
              setMessage(m);
              setSel({ ids: new Set(), all: false });
            }}
          />
          <button
            type="button"
            className="text-xs text-accent underline"
            onClick={() => setSel({ ids: new Set(), all: false })}
          >
            Clear the selection
          </button>
        </div>
      )}
      {message && (
        <p role="status" className="text-sm text-ok">
          {message}
        </p>
      )}
      <ErrorNote>{verdict.error && `The review was not saved: ${verdict.error.message}`}</ErrorNote>

      <div
        className={`overflow-x-auto rounded-md border border-rule bg-white ${isFetching ? 'opacity-70' : ''}`}
      >
        <SortableTable
          table={table}
          label="Complexes"
          busy={isFetching}
          cursorRowId={rows[cursor]?.id}
        />
        {data && data.complexes.length === 0 && (
          <p className="px-3 py-6 text-center text-sm text-ink-soft">
            {filtered
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
