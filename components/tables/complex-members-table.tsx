'use client';

import { Fragment, useState } from 'react';
import { fmt } from '@/components/link-runs/format';
import type { Member } from '@/components/link-runs/types';
import { TracerBadge } from '@/components/ui/tracer-badge';

type NumericKey =
  | 'l'
  | 'b'
  | 'v'
  | 'radiusArcsec'
  | 'posErrArcsec'
  | 'vErrKms'
  | 'lineWidthKms'
  | 'distKpc'
  | 'distErrKpc';

const NUMERIC: [NumericKey, React.ReactNode, string, number][] = [
  ['l', 'l (°)', 'Galactic longitude', 4],
  ['b', 'b (°)', 'Galactic latitude', 4],
  [
    'v',
    <>
      v<sub>LSR</sub> (km/s)
    </>,
    'velocity in the LSR frame, radio convention',
    2,
  ],
  ['radiusArcsec', 'radius (″)', 'angular radius', 1],
  ['posErrArcsec', 'σ pos (″)', 'position error', 2],
  ['vErrKms', 'σ v (km/s)', 'velocity error', 2],
  ['lineWidthKms', 'line width σ (km/s)', 'line width as a Gaussian σ', 2],
  ['distKpc', 'distance (kpc)', 'independent distance', 2],
  ['distErrKpc', 'σ dist (kpc)', 'distance error', 2],
];

/**
 * The members of a complex in canonical fields with units; each row opens to show the source's
 * columns exactly as they were in the uploaded file.
 */
export function ComplexMembersTable({ members }: { members: Member[] }) {
  const [open, setOpen] = useState<Set<string>>(new Set());
  const toggle = (key: string) =>
    setOpen((s) => {
      const next = new Set(s);
      if (next.has(key)) next.delete(key);
      else next.add(key);
      return next;
    });
  const span = 5 + NUMERIC.length;
  return (
    <div className="overflow-x-auto rounded-md border border-rule bg-white">
      <table className="w-full text-sm" aria-label="Members">
        <thead className="border-b border-rule bg-paper-deep/60 text-xs text-ink-soft">
          <tr>
            <th className="w-8 px-2 py-1.5" />
            <th className="px-2 py-1.5 text-left font-medium">catalog</th>
            <th className="px-2 py-1.5 text-right font-medium" title="data row of the file">
              row
            </th>
            <th className="px-2 py-1.5 text-right font-medium" title="line of the file">
              line
            </th>
            <th className="px-2 py-1.5 text-left font-medium">name</th>
            {NUMERIC.map(([key, header, title]) => (
              <th
                key={key}
                className="px-2 py-1.5 text-right font-medium whitespace-nowrap"
                title={title}
              >
                {header}
              </th>
            ))}
          </tr>
        </thead>
        <tbody className="divide-y divide-rule/60">
          {members.map((m) => {
            const key = `${m.catalogId}:${m.row}`;
            const isOpen = open.has(key);
            const columns = Object.entries(m.original);
            return (
              <Fragment key={key}>
                <tr className="hover:bg-paper-deep/40">
                  <td className="px-2 py-1">
                    <button
                      type="button"
                      aria-expanded={isOpen}
                      aria-label={`${isOpen ? 'Hide' : 'Show'} original columns of row ${m.row} of ${m.catalogName}`}
                      className="rounded px-1 text-ink-soft hover:bg-paper-deep hover:text-ink"
                      onClick={() => toggle(key)}
                    >
                      {isOpen ? '▾' : '▸'}
                    </button>
                  </td>
                  <td className="px-2 py-1 whitespace-nowrap">
                    <span className="flex items-center gap-2">
                      <TracerBadge kind={m.kind} />
                      {m.catalogName}
                    </span>
                  </td>
                  <td className="num px-2 py-1">{m.row}</td>
                  <td className="num px-2 py-1">{m.line}</td>
                  <td className="px-2 py-1 whitespace-nowrap">{m.name ?? '—'}</td>
                  {NUMERIC.map(([k, , , decimals]) => (
                    <td key={k} className="num px-2 py-1">
                      {fmt(m[k], decimals)}
                    </td>
                  ))}
                </tr>
                {isOpen && (
                  <tr className="bg-paper-deep/30">
                    <td />
                    <td colSpan={span - 1} className="px-2 py-2">
                      {columns.length === 0 ? (
                        <span className="text-xs text-ink-soft">
                          The file’s columns were not kept for this catalog.
                        </span>
                      ) : (
                        <dl className="grid grid-cols-[repeat(auto-fill,minmax(11rem,1fr))] gap-x-4 gap-y-1 text-xs">
                          {columns.map(([name, value]) => (
                            <div key={name} className="min-w-0">
                              <dt className="truncate text-ink-soft">{name}</dt>
                              <dd className="truncate font-mono">{value === '' ? '—' : value}</dd>
                            </div>
                          ))}
                        </dl>
                      )}
                    </td>
                  </tr>
                )}
              </Fragment>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
