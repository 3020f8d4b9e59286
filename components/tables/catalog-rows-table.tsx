'use client';

import { keepPreviousData, useQuery } from '@tanstack/react-query';
import {
  createColumnHelper,
  getCoreRowModel,
  useReactTable,
  type PaginationState,
  type SortingState,
} from '@tanstack/react-table';
import { useState } from 'react';
import { api } from '@/lib/api-client';
import { Button } from '@/components/ui/button';
import { SortableTable } from './sortable-table';
import { TablePager } from './table-pager';
import { ErrorNote } from '@/components/ui/panel';

/** One canonical row as `GET /api/catalogs/{id}/rows` returns it; absent values are null. */
export interface CatalogRow {
  row: number;
  line: number;
  name: string | null;
  l: number;
  b: number;
  v: number | null;
  radiusArcsec: number | null;
  posErrArcsec: number | null;
  vErrKms: number | null;
  lineWidthKms: number | null;
  distKpc: number | null;
  distErrKpc: number | null;
}

type RowsPage = { rows: CatalogRow[]; total: number; page: number; pageSize: number };

/** Columns the server sorts on (each has an index). */
const SORTABLE = new Set(['row', 'name', 'l', 'b', 'v', 'radiusArcsec', 'lineWidthKms', 'distKpc']);

const fixed = (decimals: number) => (x: number | null) =>
  x === null || x === undefined ? '—' : x.toFixed(decimals).replace(/^-/, '−');

const col = createColumnHelper<CatalogRow>();
const num = (
  key:
    | 'l'
    | 'b'
    | 'v'
    | 'radiusArcsec'
    | 'posErrArcsec'
    | 'vErrKms'
    | 'lineWidthKms'
    | 'distKpc'
    | 'distErrKpc',
  header: React.ReactNode,
  title: string,
  decimals: number,
) =>
  col.accessor(key, {
    header: () => header,
    cell: (c) => fixed(decimals)(c.getValue()),
    enableSorting: SORTABLE.has(key),
    meta: { numeric: true, title },
  });

const COLUMNS = [
  col.accessor('row', {
    header: '#',
    enableSorting: true,
    meta: { numeric: true, title: 'data row of the file' },
  }),
  col.accessor('line', {
    header: 'line',
    enableSorting: false,
    meta: { numeric: true, title: 'line of the file' },
  }),
  col.accessor('name', {
    header: 'name',
    cell: (c) => c.getValue() ?? '—',
    enableSorting: true,
    meta: { title: 'source name' },
  }),
  num('l', 'l (°)', 'Galactic longitude', 4),
  num('b', 'b (°)', 'Galactic latitude', 4),
  num(
    'v',
    <>
      v<sub>LSR</sub> (km/s)
    </>,
    'velocity in the LSR frame, radio convention',
    2,
  ),
  num('radiusArcsec', 'radius (″)', 'angular radius', 1),
  num('posErrArcsec', 'σ pos (″)', 'position error', 2),
  num('vErrKms', 'σ v (km/s)', 'velocity error', 2),
  num('lineWidthKms', 'line width σ (km/s)', 'line width as a Gaussian σ', 2),
  num('distKpc', 'distance (kpc)', 'independent distance', 2),
  num('distErrKpc', 'σ dist (kpc)', 'distance error', 2),
];

type Filters = {
  q: string;
  lMin: string;
  lMax: string;
  bMin: string;
  bMax: string;
  vMin: string;
  vMax: string;
};
const NO_FILTERS: Filters = { q: '', lMin: '', lMax: '', bMin: '', bMax: '', vMin: '', vMax: '' };

/** The range filters as query parameters, or what is wrong with them. */
function filterParams(f: Filters): { params: Record<string, string> } | { problem: string } {
  const params: Record<string, string> = {};
  if (f.q.trim()) params.q = f.q.trim();
  for (const axis of ['l', 'b', 'v'] as const) {
    const lo = f[`${axis}Min`].trim();
    const hi = f[`${axis}Max`].trim();
    for (const [key, text] of [
      [`${axis}Min`, lo],
      [`${axis}Max`, hi],
    ] as const) {
      if (text === '') continue;
      if (!Number.isFinite(Number(text)))
        return {
          problem: `${axis} ${key.endsWith('Min') ? 'from' : 'to'}: “${text}” is not a number.`,
        };
      params[key] = String(Number(text));
    }
    // Longitude wraps: from 340 to 20 is the range through 0°. Latitude and velocity do not.
    if (axis !== 'l' && lo !== '' && hi !== '' && Number(lo) > Number(hi)) {
      return { problem: `${axis}: the lower bound ${lo} is above the upper bound ${hi}.` };
    }
  }
  return { params };
}

function RangeInputs({
  axis,
  unit,
  draft,
  set,
}: {
  axis: 'l' | 'b' | 'v';
  unit: string;
  draft: Filters;
  set: (f: Filters) => void;
}) {
  const input = 'num w-20 rounded border border-rule bg-white px-2 py-1 text-sm';
  return (
    <fieldset className="flex items-center gap-1 text-sm">
      <legend className="sr-only">{axis} range</legend>
      <span className="w-4 font-medium">{axis}</span>
      <input
        aria-label={`${axis} from`}
        inputMode="decimal"
        className={input}
        value={draft[`${axis}Min`]}
        onChange={(e) => set({ ...draft, [`${axis}Min`]: e.target.value })}
      />
      <span className="text-ink-soft">to</span>
      <input
        aria-label={`${axis} to`}
        inputMode="decimal"
        className={input}
        value={draft[`${axis}Max`]}
        onChange={(e) => set({ ...draft, [`${axis}Max`]: e.target.value })}
      />
      <span
        className="text-xs text-ink-soft"
        title={axis === 'l' ? 'A start above the end runs through 0°, e.g. 340 to 20.' : undefined}
      >
        {unit}
      </span>
    </fieldset>
  );
}

/**
 * The canonical rows of a catalog, paged, sorted and filtered by the server: click a header to
 * sort (ascending, then descending), narrow l, b and v to ranges, search names by substring.
 */
export function CatalogRowsTable({ catalogId }: { catalogId: string }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: 'row', desc: false }]);
  const [pagination, setPagination] = useState<PaginationState>({ pageIndex: 0, pageSize: 50 });
  const [draft, setDraft] = useState<Filters>(NO_FILTERS);
  const [applied, setApplied] = useState<Record<string, string>>({});
  const [problem, setProblem] = useState<string | null>(null);

  const sort = sorting[0] ?? { id: 'row', desc: false };
  const search = new URLSearchParams({
    page: String(pagination.pageIndex + 1),
    pageSize: String(pagination.pageSize),
    sort: sort.id,
    dir: sort.desc ? 'desc' : 'asc',
    ...applied,
  });
  const { data, error, isFetching } = useQuery({
    queryKey: ['catalog-rows', catalogId, search.toString()],
    queryFn: () => api<RowsPage>(`/api/catalogs/${catalogId}/rows?${search}`),
    placeholderData: keepPreviousData,
  });
  const total = data?.total ?? 0;
  const pageCount = Math.max(1, Math.ceil(total / pagination.pageSize));

  // The app does not run the React Compiler; the table instance is used only in this render.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: data?.rows ?? [],
    columns: COLUMNS,
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
    getRowId: (r) => String(r.row),
  });

  return (
    <div className="space-y-3">
      <form
        className="flex flex-wrap items-end gap-x-5 gap-y-2"
        aria-label="Filter rows"
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
        <label className="text-sm">
          <span className="sr-only">Search names</span>
          <input
            type="search"
            placeholder="Name contains…"
            aria-label="Search names"
            className="w-48 rounded border border-rule bg-white px-2 py-1 text-sm"
            value={draft.q}
            onChange={(e) => setDraft({ ...draft, q: e.target.value })}
          />
        </label>
        <RangeInputs axis="l" unit="°" draft={draft} set={setDraft} />
        <RangeInputs axis="b" unit="°" draft={draft} set={setDraft} />
        <RangeInputs axis="v" unit="km/s" draft={draft} set={setDraft} />
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
      </form>
      <ErrorNote>{problem ?? (error && `Could not load rows: ${error.message}`)}</ErrorNote>

      <div
        className={`overflow-x-auto rounded-md border border-rule bg-white ${isFetching ? 'opacity-70' : ''}`}
      >
        <SortableTable table={table} label="Catalog rows" busy={isFetching} />
        {data && data.rows.length === 0 && (
          <p className="px-3 py-6 text-center text-sm text-ink-soft">
            No rows match. Widen the ranges or clear the filters.
          </p>
        )}
      </div>

      <TablePager
        table={table}
        total={total}
        pagination={pagination}
        setPagination={setPagination}
        sizeLabel="Rows per page"
        rangeTestId="rows-range"
      />
    </div>
  );
}
