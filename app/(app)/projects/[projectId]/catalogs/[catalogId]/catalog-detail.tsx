'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useRef, useState } from 'react';
import { ApiError, api } from '@/lib/api-client';
import { formatDateTime } from '@/lib/format/dates';
import { catalogDependentsSchema, type CatalogDependents } from '@/lib/schemas/catalogs';
import type { Mapping } from '@/lib/ingest/mapping';
import { asSentence, describeParseReport } from '@/lib/ingest/report';
import { tracerStyle } from '@/lib/tracers';
import { CatalogPlots } from '@/components/plots/catalog-plots';
import { CatalogRowsTable } from '@/components/tables/catalog-rows-table';
import {
  CatalogStatusCell,
  formatBytes,
  formatCount,
  isFinal,
  POLL_MS,
  type CatalogJson,
} from '@/components/tables/catalog-list';
import { Button } from '@/components/ui/button';
import { EmptyState, ErrorNote, PageHeader, Panel } from '@/components/ui/panel';
import { TracerBadge } from '@/components/ui/tracer-badge';

type CatalogDetailJson = CatalogJson & {
  usedBy: CatalogDependents;
  rejected: { line: number; reason: string }[];
  mapping: Mapping | null;
  columns: string[];
  dataRowCount: number | null;
  decimalComma: boolean;
  assumptions: string[];
};

const FRAME_WORDS: Record<string, string> = { lsr: 'LSR', heliocentric: 'heliocentric' };

/** The saved mapping as "field ← column (unit, …)" lines. */
function mappingLines(m: Mapping): [string, string][] {
  const lines: [string, string][] = [];
  const p = m.position;
  const [lon, lat] = p.system === 'galactic' ? ['l', 'b'] : ['RA', 'Dec'];
  lines.push([
    'Position',
    `${p.system === 'galactic' ? 'Galactic' : 'equatorial J2000'}: ${lon} ← ${p.lon.column} (${p.lon.unit}), ${lat} ← ${p.lat.column} (${p.lat.unit})`,
  ]);
  if (m.velocity) {
    lines.push([
      'Velocity',
      `${m.velocity.column} (${m.velocity.unit}, ${FRAME_WORDS[m.velocity.frame]}, ${m.velocity.convention} convention)`,
    ]);
  }
  if (m.velocityError)
    lines.push(['Velocity error', `${m.velocityError.column} (${m.velocityError.unit})`]);
  if (m.size)
    lines.push([
      'Size',
      `${m.size.column} (${m.size.unit}, ${m.size.kind === 'fwhm' ? 'FWHM' : m.size.kind})`,
    ]);
  if (m.positionError)
    lines.push(['Position error', `${m.positionError.column} (${m.positionError.unit})`]);
  if (m.lineWidth) {
    lines.push([
      'Line width',
      `${m.lineWidth.column} (${m.lineWidth.unit}, ${m.lineWidth.kind === 'fwhm' ? 'FWHM' : 'σ'})`,
    ]);
  }
  if (m.distance) lines.push(['Distance', `${m.distance.column} (${m.distance.unit})`]);
  if (m.distanceError)
    lines.push(['Distance error', `${m.distanceError.column} (${m.distanceError.unit})`]);
  if (m.name) lines.push(['Name', m.name.column]);
  return lines;
}

async function fetchPoints(catalogId: string): Promise<Float32Array> {
  const res = await fetch(`/api/catalogs/${catalogId}/points`);
  if (!res.ok) throw new Error(`the points could not be loaded (HTTP ${res.status})`);
  // The endpoint sends little-endian float32; every browser platform in use is little-endian.
  return new Float32Array(await res.arrayBuffer());
}

function Fact({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div>
      <dt className="text-xs tracking-wide text-ink-soft">{label}</dt>
      <dd className="mt-0.5">{children}</dd>
    </div>
  );
}

const TONE_CLASS = { ok: 'text-ok', warn: '', error: 'text-danger' } as const;

/** The parse report: one summary that agrees with status, counts and list, then the rejected rows. */
function ParseReport({ catalog }: { catalog: CatalogDetailJson }) {
  const summary = describeParseReport(catalog);
  return (
    <div className="space-y-2">
      <p className={`text-sm ${TONE_CLASS[summary.tone]}`} data-testid="rejected-summary">
        {summary.text}
      </p>
      {catalog.rejected.length > 0 && (
        <div className="max-h-80 overflow-auto rounded-md border border-rule bg-white">
          <table className="w-full text-sm" aria-label="Rejected rows">
            <thead className="sticky top-0 bg-paper-deep text-left text-xs text-ink-soft">
              <tr>
                <th className="w-20 px-2 py-1.5 text-right font-medium">line</th>
                <th className="px-2 py-1.5 font-medium">reason</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-rule/60">
              {catalog.rejected.map((r) => (
                <tr key={r.line}>
                  <td className="num px-2 py-1">{r.line}</td>
                  <td className="px-2 py-1">{r.reason}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}

type UsedBy = CatalogDependents;

/** The runs and analyses that read a catalog, each linked to its page. */
function DependentList({ projectId, usedBy }: { projectId: string; usedBy: UsedBy }) {
  return (
    <ul data-testid="catalog-dependents" className="mt-2 list-disc space-y-0.5 pl-5 text-sm">
      {usedBy.runs.map((r) => (
        <li key={r.id}>
          Link run{' '}
          <a href={`/projects/${projectId}/link-runs/${r.id}`} className="text-accent underline">
            {r.name}
          </a>
        </li>
      ))}
      {usedBy.analyses.map((a) => (
        <li key={a.id}>Analysis {a.name}</li>
      ))}
    </ul>
  );
}

/**
 * Delete for an unused catalog; for one that runs or analyses read, the dialog lists them and
 * offers to archive instead, which hides the catalog but keeps every run that uses it whole.
 */
function DeleteCatalog({
  projectId,
  catalog,
  usedBy,
  onDeleted,
  onArchived,
}: {
  projectId: string;
  catalog: CatalogJson;
  usedBy: UsedBy;
  onDeleted: () => void;
  onArchived: () => void;
}) {
  const dialog = useRef<HTMLDialogElement>(null);
  const [error, setError] = useState<string | null>(null);
  // A run started since the page loaded shows up in the refusal's details.
  const [refusedBy, setRefusedBy] = useState<UsedBy | null>(null);
  const dependents = refusedBy ?? usedBy;
  const inUse = dependents.runs.length + dependents.analyses.length > 0;
  const remove = useMutation({
    mutationFn: () => api(`/api/catalogs/${catalog.id}`, { method: 'DELETE' }),
    onSuccess: onDeleted,
    onError: (e) => {
      const parsed = e instanceof ApiError ? catalogDependentsSchema.safeParse(e.details) : null;
      if (parsed?.success) setRefusedBy(parsed.data);
      else setError(e.message);
    },
  });
  const archive = useMutation({
    mutationFn: () =>
      api(`/api/catalogs/${catalog.id}`, { method: 'PATCH', json: { archived: true } }),
    onSuccess: () => {
      dialog.current?.close();
      onArchived();
    },
    onError: (e) => setError(e.message),
  });
  const busy = !isFinal(catalog.status);
  return (
    <>
      <Button
        variant="danger"
        disabled={busy}
        title={busy ? 'A catalog can be deleted once it is no longer being read.' : undefined}
        onClick={() => {
          setError(null);
          setRefusedBy(null);
          dialog.current?.showModal();
        }}
      >
        Delete
      </Button>
      <dialog
        ref={dialog}
        aria-labelledby="delete-title"
        className="m-auto max-w-md rounded-lg border border-rule bg-paper p-5 text-ink shadow-xl backdrop:bg-ink/30"
      >
        <h2 id="delete-title" className="text-lg font-semibold">
          {inUse ? `“${catalog.name}” is in use` : `Delete “${catalog.name}”?`}
        </h2>
        {inUse ? (
          <>
            <p className="mt-2 text-sm text-ink-soft">
              These read its rows, so it cannot be deleted while they exist:
            </p>
            <DependentList projectId={projectId} usedBy={dependents} />
            <p className="mt-2 text-sm text-ink-soft">
              Archive it instead: it leaves the catalog list and the new-run form, and every run and
              analysis above stays complete and exportable. Delete them first to delete the catalog.
            </p>
          </>
        ) : (
          <p className="mt-2 text-sm text-ink-soft">
            Its {formatCount(catalog.rowCount)} rows and parse report are removed for everyone in
            the project. This cannot be undone; upload the file again to get it back.
          </p>
        )}
        <div className="mt-3">
          <ErrorNote>{error}</ErrorNote>
        </div>
        <div className="mt-4 flex justify-end gap-2">
          <Button variant="quiet" onClick={() => dialog.current?.close()}>
            Keep it
          </Button>
          {inUse ? (
            <Button disabled={archive.isPending} onClick={() => archive.mutate()}>
              {archive.isPending ? 'Archiving…' : 'Archive catalog'}
            </Button>
          ) : (
            <Button variant="danger" disabled={remove.isPending} onClick={() => remove.mutate()}>
              {remove.isPending ? 'Deleting…' : 'Delete catalog'}
            </Button>
          )}
        </div>
      </dialog>
    </>
  );
}

/** An archived catalog says so, and an editor can bring it back to the lists. */
function RestoreCatalog({ catalogId, onRestored }: { catalogId: string; onRestored: () => void }) {
  const restore = useMutation({
    mutationFn: () =>
      api(`/api/catalogs/${catalogId}`, { method: 'PATCH', json: { archived: false } }),
    onSuccess: onRestored,
  });
  return (
    <Button variant="quiet" disabled={restore.isPending} onClick={() => restore.mutate()}>
      {restore.isPending ? 'Restoring…' : 'Restore from archive'}
    </Button>
  );
}

/**
 * One catalog: status (polled every second until it is ready or failed), file facts, the
 * saved mapping, the parse report, the sky and longitude–velocity plots and the row table.
 */
export function CatalogDetail({
  projectId,
  catalogId,
  canEdit,
}: {
  projectId: string;
  catalogId: string;
  canEdit: boolean;
}) {
  const router = useRouter();
  const qc = useQueryClient();
  const { data, error } = useQuery({
    queryKey: ['catalog', catalogId],
    queryFn: () => api<{ catalog: CatalogDetailJson }>(`/api/catalogs/${catalogId}`),
    refetchInterval: (q) =>
      q.state.data && !isFinal(q.state.data.catalog.status) ? POLL_MS : false,
  });
  const ready = data?.catalog.status === 'ready';
  const points = useQuery({
    queryKey: ['catalog-points', catalogId],
    queryFn: () => fetchPoints(catalogId),
    enabled: ready,
    staleTime: Infinity,
  });

  if (error) {
    return (
      <>
        <PageHeader title="Catalog" />
        <ErrorNote>This catalog could not be loaded: {error.message}</ErrorNote>
      </>
    );
  }
  if (!data) return <p className="text-sm text-ink-soft">Loading catalog…</p>;
  const c = data.catalog;
  const t = tracerStyle(c.kind);
  return (
    <div className="space-y-6">
      <PageHeader
        title={c.name}
        lead={`${t.description}, from ${c.fileName}.${c.archivedAt ? ' Archived: hidden from the catalog list and new runs; the runs that use it keep it.' : ''}`}
        actions={
          <div className="flex items-center gap-2">
            {ready && (
              <a
                href={`/api/catalogs/${c.id}/export.csv`}
                download
                className="inline-flex items-center rounded-md border border-rule bg-white/60 px-3.5 py-2 text-sm font-medium hover:bg-white"
              >
                Download CSV
              </a>
            )}
            {canEdit && c.archivedAt && (
              <RestoreCatalog
                catalogId={c.id}
                onRestored={() => {
                  void qc.invalidateQueries({ queryKey: ['catalog', catalogId] });
                  void qc.invalidateQueries({ queryKey: ['catalogs', projectId] });
                }}
              />
            )}
            {canEdit && (
              <DeleteCatalog
                projectId={projectId}
                catalog={c}
                usedBy={c.usedBy}
                onDeleted={() => {
                  qc.removeQueries({ queryKey: ['catalog', catalogId] });
                  void qc.invalidateQueries({ queryKey: ['catalogs', projectId] });
                  router.push(`/projects/${projectId}/catalogs`);
                }}
                onArchived={() => {
                  void qc.invalidateQueries({ queryKey: ['catalog', catalogId] });
                  void qc.invalidateQueries({ queryKey: ['catalogs', projectId] });
                }}
              />
            )}
          </div>
        }
      />

      <Panel>
        <dl className="grid gap-4 text-sm sm:grid-cols-3 lg:grid-cols-6">
          <Fact label="Class">
            <TracerBadge kind={c.kind} />
          </Fact>
          <Fact label="Status">
            <CatalogStatusCell catalog={c} />
          </Fact>
          <Fact label="Rows">
            <span className="num" data-testid="row-count">
              {isFinal(c.status) ? formatCount(c.rowCount) : '—'}
            </span>
          </Fact>
          <Fact label="Rejected">
            <span className="num">{isFinal(c.status) ? formatCount(c.rejectedCount) : '—'}</span>
          </Fact>
          <Fact label="File">
            {c.format === 'votable' ? 'VOTable' : 'delimited text'},{' '}
            <span className="num">{formatBytes(c.fileBytes)}</span>
          </Fact>
          <Fact label="Uploaded">
            {c.createdBy?.name ?? 'a former member'},{' '}
            <time dateTime={c.createdAt}>{formatDateTime(c.createdAt)}</time>
          </Fact>
        </dl>
        {c.status === 'failed' && (
          <div className="mt-4">
            <ErrorNote>
              Reading failed: {asSentence(c.error ?? 'no reason was recorded')} Nothing of this file
              was kept; fix the file or the mapping and upload it again.
            </ErrorNote>
          </div>
        )}
        {!isFinal(c.status) && (
          <p className="mt-4 text-sm text-ink-soft">
            The file is being read on the server. You can leave this page; the catalog will be here
            when you come back.
          </p>
        )}
      </Panel>

      <div className="grid gap-6 lg:grid-cols-2">
        <Panel title="Column mapping">
          <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm">
            {(c.mapping
              ? mappingLines(c.mapping)
              : [['—', 'no mapping was recorded'] as [string, string]]
            ).map(([k, v]) => (
              <div key={k} className="contents">
                <dt className="text-ink-soft">{k}</dt>
                <dd className="font-mono text-xs leading-5">{v}</dd>
              </div>
            ))}
          </dl>
          <p className="mt-3 text-xs text-ink-soft">
            Bad rows: {c.policy === 'reject-file' ? 'reject the whole file' : 'skip and report'}.
            Decimal commas: {c.decimalComma ? 'read (30,1 as 30.1)' : 'not read'}.
          </p>
          {c.assumptions.length > 0 && (
            <div className="mt-3 text-sm" data-testid="catalog-assumptions">
              <p className="font-medium">Assumptions made when reading</p>
              <ul className="mt-1 list-disc space-y-0.5 pl-5 text-ink-soft">
                {c.assumptions.map((a) => (
                  <li key={a}>{a}</li>
                ))}
              </ul>
            </div>
          )}
        </Panel>
        <Panel title="Parse report">
          {isFinal(c.status) ? (
            <ParseReport catalog={c} />
          ) : (
            <p className="text-sm text-ink-soft">Shown once the file has been read.</p>
          )}
        </Panel>
      </div>

      {ready && (
        <>
          <Panel title="Sky and longitude–velocity plane">
            {points.error && <ErrorNote>{points.error.message}</ErrorNote>}
            {points.data ? (
              points.data.length === 0 ? (
                <EmptyState title="No rows to plot" />
              ) : (
                <CatalogPlots points={points.data} kind={c.kind} name={c.name} />
              )
            ) : (
              !points.error && (
                <p className="text-sm text-ink-soft">Loading {formatCount(c.rowCount)} points…</p>
              )
            )}
          </Panel>
          <Panel title="Rows">
            <CatalogRowsTable catalogId={c.id} />
          </Panel>
        </>
      )}
    </div>
  );
}
