import { fmt } from '@/components/link-runs/format';
import type { Link } from '@/components/link-runs/types';

/**
 * Links as a table: the two sources (catalog and 1-based data row of its file), their angular
 * separation and velocity difference, the match radius used for the pair, and the reliability.
 */
export function LinksTable({
  links,
  catalogName,
  label,
  withRadius = true,
}: {
  links: (Omit<Link, 'radiusArcsec' | 'reliability'> &
    Partial<Pick<Link, 'radiusArcsec' | 'reliability'>>)[];
  catalogName: (id: string) => string;
  label: string;
  /** Show the pair's match radius and the link's reliability (absent from run comparisons). */
  withRadius?: boolean;
}) {
  return (
    <div className="overflow-x-auto rounded-md border border-rule bg-white">
      <table className="w-full text-sm" aria-label={label}>
        <thead className="border-b border-rule bg-paper-deep/60 text-xs text-ink-soft">
          <tr>
            <th className="px-2 py-1.5 text-left font-medium">catalog A</th>
            <th className="px-2 py-1.5 text-right font-medium" title="data row of the file">
              row A
            </th>
            <th className="px-2 py-1.5 text-left font-medium">catalog B</th>
            <th className="px-2 py-1.5 text-right font-medium" title="data row of the file">
              row B
            </th>
            <th className="px-2 py-1.5 text-right font-medium">separation (″)</th>
            <th className="px-2 py-1.5 text-right font-medium">Δv (km/s)</th>
            {withRadius && (
              <>
                <th
                  className="px-2 py-1.5 text-right font-medium"
                  title="match radius used for the pair"
                >
                  radius (″)
                </th>
                <th
                  className="px-2 py-1.5 text-right font-medium"
                  title="1 − chance links / links at this separation, from shifted repeats"
                >
                  reliability
                </th>
              </>
            )}
          </tr>
        </thead>
        <tbody className="divide-y divide-rule/60">
          {links.map((k) => (
            <tr key={`${k.catalogA}:${k.rowA}-${k.catalogB}:${k.rowB}`}>
              <td className="px-2 py-1">{catalogName(k.catalogA)}</td>
              <td className="num px-2 py-1">{k.rowA}</td>
              <td className="px-2 py-1">{catalogName(k.catalogB)}</td>
              <td className="num px-2 py-1">{k.rowB}</td>
              <td className="num px-2 py-1">{fmt(k.sepArcsec, 2)}</td>
              <td className="num px-2 py-1">{fmt(k.dvKms, 2)}</td>
              {withRadius && (
                <>
                  <td className="num px-2 py-1">{fmt(k.radiusArcsec, 1)}</td>
                  <td className="num px-2 py-1">{fmt(k.reliability, 3)}</td>
                </>
              )}
            </tr>
          ))}
        </tbody>
      </table>
      {links.length === 0 && (
        <p className="px-3 py-4 text-center text-sm text-ink-soft">No links.</p>
      )}
    </div>
  );
}
