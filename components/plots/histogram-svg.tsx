'use client';

import { niceTicks } from '@/components/plots/scatter-canvas';
import { PLOT_COLOURS, SvgFigure, axisNumber } from '@/components/plots/figure';

const W = 360;
const H = 210;
const M = { left: 52, right: 12, top: 12, bottom: 42 };

/**
 * A histogram given as bin `edges` (length n + 1) and `counts` (length n), drawn as an inline
 * SVG bar chart with the quantity and its unit on the x axis and what is counted on the y axis.
 */
export function HistogramSvg({
  title,
  edges,
  counts,
  xLabel,
  yLabel,
  fileStem,
  labelBin,
}: {
  title: string;
  edges: number[];
  counts: number[];
  /** Axis title with its unit, e.g. `separation (″)`. */
  xLabel: string;
  /** What the bars count, e.g. `links`. */
  yLabel: string;
  fileStem: string;
  /**
   * For bins of unequal width (complex sizes 2, 3, …, 6–10, …): draw every bin equally wide and
   * label it with this text instead of a numeric axis.
   */
  labelBin?: (lo: number, hi: number) => string;
}) {
  const w = W - M.left - M.right;
  const h = H - M.top - M.bottom;
  const usable = edges.length === counts.length + 1 && counts.length > 0;
  const lo = usable ? edges[0] : 0;
  const hi = usable ? edges[edges.length - 1] : 1;
  const maxCount = Math.max(1, ...counts);
  const n = counts.length;
  const px = (x: number) => M.left + ((x - lo) / (hi - lo || 1)) * w;
  // The left and right pixel of bin i: proportional to its edges, or equal slots per bin.
  const binX = (i: number): [number, number] =>
    labelBin
      ? [M.left + (i / n) * w, M.left + ((i + 1) / n) * w]
      : [px(edges[i]), px(edges[i + 1])];
  const yTicks = niceTicks(0, maxCount, 4).ticks.filter((t) => Number.isInteger(t));
  const yTop = Math.max(maxCount, yTicks[yTicks.length - 1] ?? 1);
  const py = (c: number) => M.top + h - (c / yTop) * h;
  const xt = niceTicks(lo, hi, 6);
  const total = counts.reduce((a, b) => a + b, 0);
  return (
    <SvgFigure
      title={title}
      fileStem={fileStem}
      width={W}
      height={H}
      caption={`${total.toLocaleString('en-US')} ${yLabel} in ${n} bins`}
    >
      {yTicks.map((t) => (
        <g key={`y${t}`}>
          <line x1={M.left} x2={M.left + w} y1={py(t)} y2={py(t)} stroke={PLOT_COLOURS.faint} />
          <text x={M.left - 6} y={py(t)} dy="0.35em" textAnchor="end" fill={PLOT_COLOURS.inkSoft}>
            {t.toLocaleString('en-US')}
          </text>
        </g>
      ))}
      {usable &&
        counts.map((c, i) => {
          const [x0, x1] = binX(i);
          return (
            <rect
              key={i}
              x={x0 + 0.5}
              width={Math.max(0.5, x1 - x0 - 1)}
              y={py(c)}
              height={M.top + h - py(c)}
              fill={PLOT_COLOURS.accent}
              fillOpacity={0.85}
            >
              <title>{`${axisNumber(edges[i], xt.decimals + 1)} to ${axisNumber(edges[i + 1], xt.decimals + 1)}: ${c}`}</title>
            </rect>
          );
        })}
      <line x1={M.left} x2={M.left + w} y1={M.top + h} y2={M.top + h} stroke={PLOT_COLOURS.ink} />
      <line x1={M.left} x2={M.left} y1={M.top} y2={M.top + h} stroke={PLOT_COLOURS.ink} />
      {labelBin &&
        usable &&
        counts.map((_, i) => {
          const [x0, x1] = binX(i);
          return (
            <text
              key={`b${i}`}
              x={(x0 + x1) / 2}
              y={M.top + h + 15}
              textAnchor="middle"
              fill={PLOT_COLOURS.inkSoft}
            >
              {labelBin(edges[i], edges[i + 1])}
            </text>
          );
        })}
      {!labelBin &&
        xt.ticks.map((t) => (
          <g key={`x${t}`}>
            <line
              x1={px(t)}
              x2={px(t)}
              y1={M.top + h}
              y2={M.top + h + 4}
              stroke={PLOT_COLOURS.ink}
            />
            <text x={px(t)} y={M.top + h + 15} textAnchor="middle" fill={PLOT_COLOURS.inkSoft}>
              {axisNumber(t, xt.decimals)}
            </text>
          </g>
        ))}
      <text x={M.left + w / 2} y={H - 6} textAnchor="middle" fill={PLOT_COLOURS.ink}>
        {xLabel}
      </text>
      <text
        transform={`translate(13 ${M.top + h / 2}) rotate(-90)`}
        textAnchor="middle"
        fill={PLOT_COLOURS.ink}
      >
        {yLabel}
      </text>
      {!usable && (
        <text x={M.left + w / 2} y={M.top + h / 2} textAnchor="middle" fill={PLOT_COLOURS.inkSoft}>
          nothing to show
        </text>
      )}
    </SvgFigure>
  );
}
