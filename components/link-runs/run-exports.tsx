import { Panel } from '@/components/ui/panel';

const SHAPES = [
  ['links', 'Links', 'one row per link, with both sources’ columns'],
  ['complexes', 'Complexes', 'one row per complex: size, classes, centroid, review'],
  ['sources', 'Sources', 'one row per linked source with its complex'],
] as const;

const linkClass =
  'rounded-md border border-rule bg-white px-2.5 py-1 text-sm text-accent hover:bg-paper-deep/60';

/** Download links for a finished run: CSV and VOTable of each shape, and the methods record. */
export function RunExports({ runId }: { runId: string }) {
  const base = `/api/link-runs/${runId}`;
  return (
    <Panel title="Export">
      <ul className="space-y-2 text-sm">
        {SHAPES.map(([shape, label, explain]) => (
          <li key={shape} className="flex flex-wrap items-center gap-2">
            <span className="w-24 font-medium">{label}</span>
            <a
              className={linkClass}
              href={`${base}/export.csv?shape=${shape}`}
              download
              aria-label={`${label} as CSV`}
            >
              CSV
            </a>
            <a
              className={linkClass}
              href={`${base}/export.vot?shape=${shape}`}
              download
              aria-label={`${label} as VOTable`}
            >
              VOTable
            </a>
            <span className="text-xs text-ink-soft">{explain}</span>
          </li>
        ))}
        <li className="flex flex-wrap items-center gap-2">
          <span className="w-24 font-medium">Methods</span>
          <a
            className={linkClass}
            href={`${base}/methods.json`}
            download
            aria-label="Methods as JSON"
          >
            JSON
          </a>
          <span className="text-xs text-ink-soft">
            every parameter, software version and reference, for a methods section
          </span>
        </li>
      </ul>
    </Panel>
  );
}
