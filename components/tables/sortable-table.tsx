'use client';

import { flexRender, type RowData, type Table } from '@tanstack/react-table';

declare module '@tanstack/react-table' {
  // The augmentation must repeat the library's type parameters even though it does not use them.
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  interface ColumnMeta<TData extends RowData, TValue> {
    numeric?: boolean;
    title?: string;
  }
}

/**
 * The body of a server-sorted table: headers that sort on click (▲/▼, `aria-sort`), then the
 * rows. Numeric columns (column meta `numeric`) are right-aligned in tabular figures. The row
 * `cursorRowId` (a keyboard cursor) is marked and kept in view.
 */
export function SortableTable<T>({
  table,
  label,
  busy,
  cursorRowId,
}: {
  table: Table<T>;
  label: string;
  busy: boolean;
  cursorRowId?: string;
}) {
  return (
    <table className="w-full text-sm" aria-label={label} aria-busy={busy}>
      <thead className="border-b border-rule bg-paper-deep/60 text-xs text-ink-soft">
        {table.getHeaderGroups().map((hg) => (
          <tr key={hg.id}>
            {hg.headers.map((h) => {
              const meta = h.column.columnDef.meta;
              const dir = h.column.getIsSorted();
              const text = flexRender(h.column.columnDef.header, h.getContext());
              return (
                <th
                  key={h.id}
                  scope="col"
                  title={meta?.title}
                  aria-sort={
                    dir === 'asc' ? 'ascending' : dir === 'desc' ? 'descending' : undefined
                  }
                  className={`px-2 py-1.5 font-medium whitespace-nowrap ${meta?.numeric ? 'text-right' : 'text-left'}`}
                >
                  {h.column.getCanSort() ? (
                    <button
                      type="button"
                      className={`inline-flex items-center gap-1 hover:text-ink ${dir ? 'text-ink' : ''}`}
                      onClick={h.column.getToggleSortingHandler()}
                    >
                      {text}
                      <span aria-hidden className="w-2">
                        {dir === 'asc' ? '▲' : dir === 'desc' ? '▼' : ''}
                      </span>
                    </button>
                  ) : (
                    text
                  )}
                </th>
              );
            })}
          </tr>
        ))}
      </thead>
      <tbody className="divide-y divide-rule/60">
        {table.getRowModel().rows.map((r) => (
          <tr
            key={r.id}
            className={
              r.id === cursorRowId
                ? 'bg-accent/10 outline outline-2 -outline-offset-2 outline-accent'
                : 'hover:bg-paper-deep/40'
            }
            aria-current={r.id === cursorRowId ? 'true' : undefined}
            data-testid={r.id === cursorRowId ? 'cursor-row' : undefined}
            ref={
              r.id === cursorRowId ? (el) => el?.scrollIntoView({ block: 'nearest' }) : undefined
            }
          >
            {r.getVisibleCells().map((c) => (
              <td
                key={c.id}
                className={`px-2 py-1 whitespace-nowrap ${c.column.columnDef.meta?.numeric ? 'num' : ''}`}
              >
                {flexRender(c.column.columnDef.cell, c.getContext())}
              </td>
            ))}
          </tr>
        ))}
      </tbody>
    </table>
  );
}
