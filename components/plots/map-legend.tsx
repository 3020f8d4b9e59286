/**
 * The legend box of the face-on maps (Milky Way and external galaxy): one row per tracer kind in
 * its colour and shape, then the map's own rows (glyphs and lines), ending with the arm ridge.
 */
import type { ReactNode } from 'react';
import { PLOT_COLOURS } from '@/components/plots/figure';
import { markerPath, tracerStyle } from '@/lib/tracers';
import type { TracerKind } from '@/lib/ordering/types';

/** A legend row after the tracer kinds: its glyph and words. */
export type LegendRow = { key: string; glyph: ReactNode; words: string };

const ROW_PX = 16;

export function MapLegend({
  x,
  y,
  width,
  kinds,
  kindWords,
  rows,
}: {
  x: number;
  y: number;
  width: number;
  kinds: TracerKind[];
  kindWords: (kind: TracerKind) => string;
  rows: LegendRow[];
}) {
  const ridge: LegendRow = {
    key: 'ridge',
    glyph: <line x1={-5} x2={5} y1={-3} y2={-3} stroke={PLOT_COLOURS.accent} strokeWidth={2} />,
    words: 'arm ridge line',
  };
  const all = [...rows, ridge];
  return (
    <g transform={`translate(${x} ${y})`}>
      <rect
        width={width}
        height={ROW_PX * (kinds.length + all.length) + 6}
        fill={PLOT_COLOURS.background}
        fillOpacity={0.9}
        stroke={PLOT_COLOURS.rule}
      />
      {kinds.map((k, i) => {
        const t = tracerStyle(k);
        return (
          <g key={k} transform={`translate(10 ${14 + ROW_PX * i})`}>
            <path d={markerPath(t.shape, 0, -3, 4)} fill={t.colour} />
            <text x={10} y={0} fill={PLOT_COLOURS.ink}>
              {kindWords(k)}
            </text>
          </g>
        );
      })}
      {all.map((r, i) => (
        <g key={r.key} transform={`translate(10 ${14 + ROW_PX * (kinds.length + i)})`}>
          {r.glyph}
          <text x={10} y={0} fill={PLOT_COLOURS.ink}>
            {r.words}
          </text>
        </g>
      ))}
    </g>
  );
}
