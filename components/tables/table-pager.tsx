'use client';

import type { PaginationState, Table } from '@tanstack/react-table';
import { Button } from '@/components/ui/button';
import { Skeleton } from '@/components/ui/skeleton';

export const PAGE_SIZES = [25, 50, 100, 250, 500];

const count = (n: number) => n.toLocaleString('en-US');

/**
 * The paging bar under a server-paged table: "first–last of total", a page-size choice and
 * First / Previous / Next / Last. The page count comes from the table (manualPagination).
 * While the first page is `loading` the range is a placeholder, never "0–0 of 0".
 */
export function TablePager<T>({
  table,
  total,
  pagination,
  setPagination,
  sizeLabel,
  rangeTestId,
  loading = false,
}: {
  table: Table<T>;
  total: number;
  pagination: PaginationState;
  setPagination: (p: PaginationState) => void;
  sizeLabel: string;
  rangeTestId: string;
  loading?: boolean;
}) {
  const first = total === 0 ? 0 : pagination.pageIndex * pagination.pageSize + 1;
  const last = Math.min(total, (pagination.pageIndex + 1) * pagination.pageSize);
  const step = (label: string, go: () => void, enabled: boolean) => (
    <Button variant="quiet" className="px-2 py-1" onClick={go} disabled={!enabled}>
      {label}
    </Button>
  );
  return (
    <div className="flex flex-wrap items-center gap-3 text-sm">
      {loading ? (
        <Skeleton className="h-4 w-28" label="Loading the page count" />
      ) : (
        <span className="num text-ink-soft" data-testid={rangeTestId}>
          {count(first)}–{count(last)} of {count(total)}
        </span>
      )}
      <label className="flex items-center gap-1.5">
        <span className="text-ink-soft">{sizeLabel}</span>
        <select
          className="rounded border border-rule bg-white px-2 py-1"
          value={pagination.pageSize}
          onChange={(e) => setPagination({ pageIndex: 0, pageSize: Number(e.target.value) })}
        >
          {PAGE_SIZES.map((n) => (
            <option key={n} value={n}>
              {n}
            </option>
          ))}
        </select>
      </label>
      <span className="ml-auto flex flex-wrap items-center gap-1.5">
        {step('First', () => table.firstPage(), table.getCanPreviousPage())}
        {step('Previous', () => table.previousPage(), table.getCanPreviousPage())}
        {loading ? (
          <Skeleton className="h-4 w-20" label="Loading the page count" />
        ) : (
          <span className="num px-1" data-testid="page-of">
            page {pagination.pageIndex + 1} of {table.getPageCount()}
          </span>
        )}
        {step('Next', () => table.nextPage(), table.getCanNextPage())}
        {step('Last', () => table.lastPage(), table.getCanNextPage())}
      </span>
    </div>
  );
}
