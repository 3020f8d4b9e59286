'use client';

import { useState } from 'react';
import { Panel } from '@/components/ui/panel';
import { runExportUrl } from '@/lib/export/query';

const SHAPES = [
  ['links', 'Links', 'one row per link, with both sources and their catalogs’ names', true],
  ['complexes', 'Complexes', 'one row per complex: size, classes, centroid, review', false],
  ['sources', 'Sources', 'one row per source of the run’s catalogs, with its complex', true],
] as const;

const linkClass =
  'rounded-md border border-rule bg-white px-2.5 py-1 text-sm text-accent hover:bg-paper-deep/60';

/**
 * Download links for a finished run: CSV and VOTable of each shape, and the methods record.
 * "With the original columns" adds every uploaded column of each source to links and sources.
 */
export function RunExports({ runId }: { runId: string }) {
  const [original, setOriginal] = useState(false);
  const columns = original ? 'original' : 'canonical';
  return (
    <Panel title="Export">
      <label className="mb-3 flex items-center gap-2 text-sm">
        <input type="checkbox" checked={original} onChange={(e) => setOriginal(e.target.checked)} />
        with the original columns
        <span className="text-xs text-ink-soft">
          (links and sources: every uploaded column of each side, as uploaded)
        </span>
      </label>
      <ul className="space-y-2 text-sm">
        {SHAPES.map(([shape, label, explain, joins]) => {
          const query = { shape, columns: joins ? columns : 'canonical' } as const;
          const joined = joins && original ? ' with the original columns' : '';
          return (
            <li key={shape} className="flex flex-wrap items-center gap-2">
              <span className="w-24 font-medium">{label}</span>
              <a
                className={linkClass}
                href={runExportUrl(runId, 'csv', query)}
                download
                aria-label={`${label} as CSV${joined}`}
              >
                CSV
              </a>
              <a
                className={linkClass}
                href={runExportUrl(runId, 'vot', query)}
                download
                aria-label={`${label} as VOTable${joined}`}
              >
                VOTable
              </a>
              <span className="text-xs text-ink-soft">{explain}</span>
            </li>
          );
        })}
        <li className="flex flex-wrap items-center gap-2">
          <span className="w-24 font-medium">Methods</span>
          <a
            className={linkClass}
            href={`/api/link-runs/${runId}/methods.json`}
            download
            aria-label="Methods as JSON"
          >
            JSON
          </a>
          <span className="text-xs text-ink-soft">
            every parameter, software version, reference and the decimals of each exported quantity,
            for a methods section
          </span>
        </li>
      </ul>
    </Panel>
  );
}
