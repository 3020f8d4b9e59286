'use client';

import { useQueryClient } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { api, ApiError } from '@/lib/api-client';
import { mappingAssumptions } from '@/lib/ingest/assumptions';
import type { Mapping } from '@/lib/ingest/mapping';
import { previewBadCells } from '@/lib/ingest/preview-check';
import type { TableHeader } from '@/lib/ingest/types';
import { TRACERS, TRACER_KINDS, type TracerKind } from '@/lib/tracers';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { ErrorNote, Panel } from '@/components/ui/panel';
import { formatBytes, type CatalogJson } from '@/components/tables/catalog-list';
import {
  draftFromMapping,
  mappingFromDraft,
  withPosition,
  roleOfColumns,
  EMPTY_DRAFT,
  type MappingDraft,
} from './mapping-draft';
import { MappingForm } from './mapping-form';
import { PreviewTable } from './preview-table';
import { PREVIEW_BYTES, type PositionCandidateJson, type PreviewResponse } from './preview-types';
import { describeCandidate, SuggestionNotes } from './suggestion-notes';

type Policy = 'skip-bad-rows' | 'reject-file';

/** An API error as a sentence that says what was wrong and what to do. */
function explainUpload(e: unknown, file: File): string {
  if (!(e instanceof ApiError)) return e instanceof Error ? e.message : String(e);
  if (e.status === 413) {
    return `${file.name} (${formatBytes(file.size)}) is larger than this server accepts. ${
      e.code === 'error' ? '' : e.message
    } Split the catalog into parts, or ask the administrator to raise the upload limit.`.trim();
  }
  if (e.status === 422) {
    const details = e.details as { candidates?: PositionCandidateJson[] } | undefined;
    const options = details?.candidates?.map(describeCandidate).join('; ');
    return `${e.message}${options ? ` Possible readings: ${options}.` : ''} Choose the position columns above and try again.`;
  }
  if (e.status === 403) return 'Only editors and owners of this project can upload catalogs.';
  const where = e.details as { line?: number; column?: string; field?: string } | undefined;
  const at = [
    where?.field && `field ${where.field}`,
    where?.column && `column ${where.column}`,
    where?.line && `line ${where.line}`,
  ]
    .filter(Boolean)
    .join(', ');
  return `${e.message}${at ? ` (${at})` : ''}`;
}

/** A candidate's position reading as a mapping's position (the server only offers valid units). */
const positionOf = (c: PositionCandidateJson) =>
  ({ system: c.system, lon: c.lon, lat: c.lat }) as Mapping['position'];

const stem = (fileName: string) => fileName.replace(/\.[^.]+$/, '');

/**
 * Upload of a catalog in three steps on one screen: choose a file; check the preview and the
 * suggested column mapping (the server reads only the first 256 KB for this); name the catalog,
 * choose its tracer class and bad-row policy, and send the whole file.
 */
export function CatalogUpload({ projectId }: { projectId: string }) {
  const router = useRouter();
  const qc = useQueryClient();
  const [file, setFile] = useState<File | null>(null);
  const [preview, setPreview] = useState<PreviewResponse | null>(null);
  const [draft, setDraft] = useState<MappingDraft>(EMPTY_DRAFT);
  const [name, setName] = useState('');
  const [kind, setKind] = useState<TracerKind | ''>('');
  const [policy, setPolicy] = useState<Policy>('skip-bad-rows');
  const [decimalComma, setDecimalComma] = useState(false);
  const [reading, setReading] = useState(false);
  const [uploading, setUploading] = useState(false);
  const [previewError, setPreviewError] = useState<string | null>(null);
  const [submitError, setSubmitError] = useState<string | null>(null);

  async function choose(f: File | null) {
    setFile(f);
    setPreview(null);
    setPreviewError(null);
    setSubmitError(null);
    if (!f) return;
    setName((n) => n || stem(f.name));
    setReading(true);
    try {
      const body = new FormData();
      body.set('file', f.slice(0, PREVIEW_BYTES), f.name);
      const res = await api<PreviewResponse>(`/api/projects/${projectId}/catalogs/preview`, {
        method: 'POST',
        body,
      });
      const s = res.suggestion;
      const first = s.candidates[0];
      const position = s.positionUnambiguous && first ? positionOf(first) : undefined;
      setDraft(draftFromMapping(s.mapping ?? { ...s.fields, position }));
      setDecimalComma(res.decimalComma?.applied ?? false);
      setPreview(res);
    } catch (e) {
      setPreviewError(`${f.name} could not be read: ${explainUpload(e, f)}`);
    } finally {
      setReading(false);
    }
  }

  async function submit() {
    if (!file) return;
    setSubmitError(null);
    const checked = mappingFromDraft(draft);
    if ('problem' in checked) {
      setSubmitError(checked.problem);
      return;
    }
    if (!kind) {
      setSubmitError('Choose the tracer class of this catalog.');
      return;
    }
    setUploading(true);
    try {
      const body = new FormData();
      body.set('file', file, file.name);
      body.set('name', name.trim());
      body.set('kind', kind);
      body.set('policy', policy);
      body.set('decimalComma', String(decimalComma));
      body.set('mapping', JSON.stringify(checked.mapping));
      const { catalog } = await api<{ catalog: CatalogJson }>(
        `/api/projects/${projectId}/catalogs`,
        {
          method: 'POST',
          body,
        },
      );
      await qc.invalidateQueries({ queryKey: ['catalogs', projectId] });
      router.push(`/projects/${projectId}/catalogs/${catalog.id}`);
    } catch (e) {
      setSubmitError(explainUpload(e, file));
      setUploading(false);
    }
  }

  const check = preview ? mappingFromDraft(draft) : null;
  const header: TableHeader | null = preview
    ? {
        format: preview.preview.format,
        delimiter: preview.preview.delimiter,
        columns: preview.preview.columns,
        headerLine: preview.preview.headerLine ?? null,
      }
    : null;
  const mapped = header && check && 'mapping' in check ? check.mapping : null;
  const cellCheck =
    header && mapped
      ? previewBadCells(
          header,
          mapped,
          preview!.preview.rows.map((r) => r.values),
          { decimalComma },
        )
      : null;
  const assumptions =
    header && mapped && cellCheck && 'cells' in cellCheck
      ? mappingAssumptions(header, mapped, { decimalComma })
      : [];
  const commaColumns = preview?.decimalComma?.columns ?? [];
  return (
    <div className="space-y-6">
      <Panel title="1 · Choose a file">
        <label className="block text-sm">
          <span className="font-medium">Catalog file</span>
          <input
            type="file"
            name="catalogFile"
            accept=".csv,.tsv,.txt,.dat,.tab,.vot,.xml,text/csv,text/plain,text/tab-separated-values,application/x-votable+xml"
            className="mt-1 block w-full text-sm file:mr-3 file:rounded-md file:border file:border-rule file:bg-white file:px-3 file:py-1.5 file:text-sm"
            onChange={(e) => choose(e.target.files?.[0] ?? null)}
          />
          <span className="mt-1 block text-xs text-ink-soft">
            CSV, TSV, semicolon- or space-separated text with a header row, or a VOTable. Only the
            first 256 KB are read for the preview; the whole file is sent when you upload.
          </span>
        </label>
        {reading && (
          <p className="mt-3 text-sm text-ink-soft">Reading the start of {file?.name}…</p>
        )}
        <div className="mt-3">
          <ErrorNote>{previewError}</ErrorNote>
        </div>
      </Panel>

      {preview && file && (
        <>
          <Panel title="2 · Check the columns">
            <div className="space-y-4">
              <SuggestionNotes
                suggestion={preview.suggestion}
                onUseCandidate={(c) => setDraft(withPosition(draft, positionOf(c)))}
              />
              {(commaColumns.length > 0 || decimalComma) && (
                <div className="rounded-md border border-accent/30 bg-accent-soft/40 px-3 py-2 text-sm">
                  {commaColumns.length > 0 && (
                    <p>
                      Numbers in {commaColumns.map((c) => `\`${c}\``).join(', ')} are written with a
                      decimal comma (like 30,1).
                    </p>
                  )}
                  <label className="mt-1 flex items-center gap-2">
                    <input
                      type="checkbox"
                      name="decimalComma"
                      checked={decimalComma}
                      onChange={(e) => setDecimalComma(e.target.checked)}
                    />
                    Read 30,1 as 30.1
                  </label>
                </div>
              )}
              <PreviewTable
                preview={preview.preview}
                roles={roleOfColumns(draft)}
                badCells={cellCheck && 'cells' in cellCheck ? cellCheck.cells : []}
              />
              {cellCheck && 'problem' in cellCheck && (
                <p className="text-sm text-danger">{cellCheck.problem}</p>
              )}
              <MappingForm draft={draft} columns={preview.preview.columns} onChange={setDraft} />
              {check && 'problem' in check && (
                <p className="text-sm text-danger">{check.problem}</p>
              )}
              {assumptions.length > 0 && (
                <div className="text-sm" data-testid="assumptions">
                  <p className="font-medium">
                    Assumptions the reading makes with this mapping (stored with the catalog):
                  </p>
                  <ul className="mt-1 list-disc space-y-0.5 pl-5 text-ink-soft">
                    {assumptions.map((a) => (
                      <li key={a}>{a}</li>
                    ))}
                  </ul>
                </div>
              )}
            </div>
          </Panel>

          <Panel title="3 · Name it and upload">
            <form
              className="space-y-4"
              onSubmit={(e) => {
                e.preventDefault();
                void submit();
              }}
            >
              <div className="grid gap-3 md:grid-cols-3">
                <TextField
                  label="Catalog name"
                  name="catalogName"
                  required
                  maxLength={200}
                  value={name}
                  onChange={(e) => setName(e.target.value)}
                />
                <SelectField
                  label="Tracer class"
                  name="tracerClass"
                  required
                  value={kind}
                  onChange={(e) => setKind(e.target.value as TracerKind | '')}
                >
                  <option value="">Choose…</option>
                  {TRACER_KINDS.map((k) => (
                    <option key={k} value={k}>
                      {TRACERS[k].label} — {TRACERS[k].description}
                    </option>
                  ))}
                </SelectField>
                <SelectField
                  label="Bad rows"
                  name="policy"
                  value={policy}
                  onChange={(e) => setPolicy(e.target.value as Policy)}
                >
                  <option value="skip-bad-rows">skip them and list them in the parse report</option>
                  <option value="reject-file">reject the whole file</option>
                </SelectField>
              </div>
              <ErrorNote>{submitError}</ErrorNote>
              <div className="flex items-center gap-3">
                <Button type="submit" disabled={uploading || !check || 'problem' in check}>
                  {uploading ? `Uploading ${formatBytes(file.size)}…` : 'Upload and read catalog'}
                </Button>
                <span className="text-xs text-ink-soft">
                  {file.name}, {formatBytes(file.size)}. Reading continues on the server if you
                  leave this page.
                </span>
              </div>
            </form>
          </Panel>
        </>
      )}
    </div>
  );
}
