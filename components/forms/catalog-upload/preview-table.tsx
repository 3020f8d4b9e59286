import type { PreviewResponse } from './preview-types';

const DELIMITER_WORDS: Record<string, string> = {
  ',': 'commas',
  '\t': 'tabs',
  ';': 'semicolons',
  whitespace: 'spaces',
};

/** The first rows of the file as the server read them, each header marked with its mapped field. */
export function PreviewTable({
  preview,
  roles,
}: {
  preview: PreviewResponse['preview'];
  roles: Map<string, string[]>;
}) {
  const how =
    preview.format === 'votable'
      ? 'Read as a VOTable.'
      : `Read as delimited text, columns separated by ${DELIMITER_WORDS[preview.delimiter ?? ''] ?? 'an unknown delimiter'}.`;
  return (
    <div>
      <p className="mb-2 text-xs text-ink-soft">
        {how} The first {preview.rows.length} data rows; the line numbers are those of the file.
      </p>
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
            {preview.rows.map((r) => (
              <tr key={r.row}>
                <td className="num px-2 py-1 text-ink-soft">{r.line}</td>
                {preview.columns.map((c, i) => (
                  <td key={c.name} className="px-2 py-1 whitespace-nowrap">
                    {r.values[i] ?? ''}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
