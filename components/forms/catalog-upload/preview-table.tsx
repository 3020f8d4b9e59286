import type { BadCell } from '@/lib/ingest/preview-check';
import type { PreviewResponse } from './preview-types';

const DELIMITER_WORDS: Record<string, string> = {
  ',': 'commas',
  '\t': 'tabs',
  ';': 'semicolons',
  whitespace: 'spaces',
};

/**
 * The first rows of the file as the server read them, each header marked with its mapped field
 * and each cell the ingest would reject under the current mapping marked, its reason as a tooltip.
 */
export function PreviewTable({
  preview,
  roles,
  badCells = [],
}: {
  preview: PreviewResponse['preview'];
  roles: Map<string, string[]>;
  badCells?: BadCell[];
}) {
  const bad = new Map(badCells.map((c) => [`${c.rowIndex}:${c.column}`, c.reason]));
  const badRows = new Set(badCells.map((c) => c.rowIndex)).size;
  const how =
    preview.format === 'votable'
      ? 'Read as a VOTable.'
      : `Read as delimited text, columns separated by ${DELIMITER_WORDS[preview.delimiter ?? ''] ?? 'an unknown delimiter'}.`;
  return (
    <div>
      <p className="mb-2 text-xs text-ink-soft">
        {how} The first {preview.rows.length} data rows; the line numbers are those of the file.
      </p>
      {badCells.length > 0 ? (
        <p className="mb-2 text-sm text-danger" data-testid="bad-cell-count">
          {badCells.length} cell{badCells.length === 1 ? '' : 's'} in {badRows} of these rows would
          be rejected with this mapping (marked; point at a cell for the reason).
        </p>
      ) : (
        <p className="mb-2 text-sm text-ok" data-testid="bad-cell-count">
          Every cell shown passes the checks with this mapping.
        </p>
      )}
      <div className="max-h-96 overflow-auto rounded-md border border-rule bg-white">
        <table className="w-full text-xs" aria-label="Preview of the file">
          <thead className="sticky top-0 bg-paper-deep text-left">
            <tr>
              <th className="px-2 py-1.5 text-right font-medium text-ink-soft">line</th>
              {preview.columns.map((c) => (
                <th
                  key={c.name}
                  className="px-2 py-1.5 align-bottom font-semibold whitespace-nowrap"
                >
                  {c.name}
                  {c.unit && <span className="font-normal text-ink-soft"> [{c.unit}]</span>}
                  {roles.has(c.name) && (
                    <span className="mt-0.5 block w-fit rounded bg-accent-soft px-1 font-normal text-accent">
                      → {roles.get(c.name)!.join(', ')}
                    </span>
                  )}
                </th>
              ))}
            </tr>
          </thead>
          <tbody className="divide-y divide-rule font-mono">
            {preview.rows.map((r, k) => (
              <tr key={r.row} className={bad.has(`${k}:-1`) ? 'bg-danger/10' : undefined}>
                <td className="num px-2 py-1 text-ink-soft" title={bad.get(`${k}:-1`)}>
                  {r.line}
                </td>
                {preview.columns.map((c, i) => {
                  const reason = bad.get(`${k}:${i}`);
                  return (
                    <td
                      key={c.name}
                      title={reason}
                      data-bad={reason ? 'true' : undefined}
                      className={`px-2 py-1 whitespace-nowrap ${reason ? 'bg-danger/10 text-danger underline decoration-wavy' : ''}`}
                    >
                      {r.values[i] ?? ''}
                    </td>
                  );
                })}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
