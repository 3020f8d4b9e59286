'use client';

import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import Link from 'next/link';
import { api } from '@/lib/api-client';
import { formatDateTime } from '@/lib/format/dates';
import { EmptyState, ErrorNote, ProgressBar } from '@/components/ui/panel';
import { TracerBadge } from '@/components/ui/tracer-badge';

export type CatalogStatus = 'queued' | 'ingesting' | 'ready' | 'failed';

/** A catalog as the JSON API returns it (see the catalog API contract). */
export interface CatalogJson {
  id: string;
  projectId: string;
  name: string;
  kind: string;
  status: CatalogStatus;
  progress: number;
  rowCount: number;
  rejectedCount: number;
  error: string | null;
  fileName: string;
  fileBytes: number;
  format: string;
  policy: string;
  createdAt: string;
  readyAt: string | null;
  archivedAt: string | null;
  createdBy: { id: string; name: string } | null;
}

/** True once a catalog will not change by itself any more. */
export const isFinal = (status: CatalogStatus) => status === 'ready' || status === 'failed';

/** Polling interval while a catalog is still being read, in milliseconds. */
export const POLL_MS = 1000;

const STATUS_WORDS: Record<CatalogStatus, string> = {
  queued: 'waiting to start',
  ingesting: 'reading',
  ready: 'ready',
  failed: 'failed',
};

/** The status word, and a progress bar while the file is still being read. */
export function CatalogStatusCell({ catalog }: { catalog: CatalogJson }) {
  if (isFinal(catalog.status)) {
    return (
      <span
        data-testid="catalog-status"
        className={catalog.status === 'failed' ? 'font-medium text-danger' : 'text-ok'}
        title={catalog.error ?? undefined}
      >
        {STATUS_WORDS[catalog.status]}
      </span>
    );
  }
  return (
    <span className="flex flex-wrap items-center gap-x-2 gap-y-1">
      <span data-testid="catalog-status" className="whitespace-nowrap text-ink-soft">
        {STATUS_WORDS[catalog.status]}
      </span>
      <ProgressBar value={catalog.progress} label={`Reading ${catalog.name}`} />
    </span>
  );
}

/** Integers with thin grouping, the same in every table. */
export const formatCount = (n: number) => n.toLocaleString('en-US');

/** Bytes in words: `12.3 MB`. */
export function formatBytes(n: number): string {
  if (n < 1024) return `${n} B`;
  const units = ['KB', 'MB', 'GB'];
  let x = n / 1024;
  let i = 0;
  while (x >= 1024 && i < units.length - 1) {
    x /= 1024;
    i++;
  }
  return `${x.toFixed(x < 10 ? 1 : 0)} ${units[i]}`;
}

/** "Show archived": a list's toggle for the records it leaves out by default. */
export function ShowArchived({
  checked,
  onChange,
}: {
  checked: boolean;
  onChange: (checked: boolean) => void;
}) {
  return (
    <label className="mb-2 flex items-center gap-2 text-sm text-ink-soft">
      <input type="checkbox" checked={checked} onChange={(e) => onChange(e.target.checked)} />
      Show archived
    </label>
  );
}

/** Every catalog of a project, newest first, refreshed every second while any is being read. */
export function CatalogList({ projectId, canEdit }: { projectId: string; canEdit: boolean }) {
  const [showArchived, setShowArchived] = useState(false);
  const { data, error, isPending } = useQuery({
    queryKey: ['catalogs', projectId, { showArchived }],
    queryFn: () =>
      api<{ catalogs: CatalogJson[] }>(
        `/api/projects/${projectId}/catalogs${showArchived ? '?archived=include' : ''}`,
      ),
    refetchInterval: (q) =>
      q.state.data?.catalogs.some((c) => !isFinal(c.status)) ? POLL_MS : false,
  });
  const toggle = <ShowArchived checked={showArchived} onChange={setShowArchived} />;
  if (error) return <ErrorNote>Could not load the catalogs: {error.message}</ErrorNote>;
  if (isPending) return <p className="text-sm text-ink-soft">Loading catalogs…</p>;
  if (data.catalogs.length === 0 && !showArchived) {
    return (
      <EmptyState title="No catalogs yet">
        {canEdit ? (
          <>
            Upload a CSV, TSV or VOTable file of HI or CO clouds, HII regions or OB associations
            with <strong>Upload catalog</strong>. You will check how its columns map to l, b and
            velocity before it is read.
          </>
        ) : (
          <>An editor or owner of this project uploads the catalogs; they will appear here.</>
        )}
      </EmptyState>
    );
  }
  return (
    <div>
      {toggle}
      <div className="overflow-x-auto rounded-lg border border-rule bg-white/70">
        <table className="w-full text-sm" aria-label="Catalogs">
          <thead className="border-b border-rule text-left text-xs tracking-wide text-ink-soft">
            <tr>
              <th className="px-3 py-2">Name</th>
              <th className="px-3 py-2">Class</th>
              <th className="px-3 py-2">Status</th>
              <th className="px-3 py-2 text-right">Rows</th>
              <th className="px-3 py-2 text-right">Rejected</th>
              <th className="px-3 py-2">Uploaded by</th>
              <th className="px-3 py-2">Uploaded</th>
            </tr>
          </thead>
          <tbody className="divide-y divide-rule">
            {data.catalogs.map((c) => (
              <tr key={c.id} className="hover:bg-paper-deep/40">
                <td className="px-3 py-2">
                  <Link
                    href={`/projects/${projectId}/catalogs/${c.id}`}
                    className="font-medium text-accent hover:underline"
                  >
                    {c.name}
                  </Link>
                  <span className="block text-xs text-ink-soft">
                    {c.fileName}
                    {c.archivedAt && ' · archived'}
                  </span>
                </td>
                <td className="px-3 py-2">
                  <TracerBadge kind={c.kind} />
                </td>
                <td className="px-3 py-2">
                  <CatalogStatusCell catalog={c} />
                </td>
                <td className="num px-3 py-2">
                  {isFinal(c.status) ? formatCount(c.rowCount) : '—'}
                </td>
                <td className={`num px-3 py-2 ${c.rejectedCount > 0 ? 'text-danger' : ''}`}>
                  {isFinal(c.status) ? formatCount(c.rejectedCount) : '—'}
                </td>
                <td className="px-3 py-2">{c.createdBy?.name ?? 'a former member'}</td>
                <td className="px-3 py-2 whitespace-nowrap">
                  <time dateTime={c.createdAt}>{formatDateTime(c.createdAt)}</time>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
