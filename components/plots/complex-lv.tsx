'use client';

import { niceTicks } from '@/components/plots/scatter-canvas';
import { PLOT_COLOURS, SvgFigure, axisNumber } from '@/components/plots/figure';
import type { Complex, Member } from '@/components/link-runs/types';
import { markerPath, tracerStyle } from '@/lib/tracers';

const W = 520;
const H = 300;
const M = { left: 56, right: 14, top: 14, bottom: 44 };

/**
 * Whether to plot longitudes in (−180°, 180°] instead of [0°, 360°): true when that makes the
 * points' longitude span shorter, i.e. when they straddle l = 0°.
 */
function wrapsAtZero(ls: number[]): boolean {
  if (ls.length === 0) return false;
  const w = ls.map((l) => (l > 180 ? l - 360 : l));
  return Math.max(...w) - Math.min(...w) < Math.max(...ls) - Math.min(...ls);
}

/**
 * The complex in the longitude–velocity plane: its members with a velocity as class markers over
 * faint dots at the centroids of other complexes of the run (`background`), l increasing to the
 * left, v_LSR upwards.
 */
export function ComplexLv({
  members,
  background,
  backgroundNote,
  fileStem,
}: {
  members: Member[];
  background: Pick<Complex, 'id' | 'l' | 'v'>[];
  backgroundNote: string;
  fileStem: string;
}) {
  const withV = members.filter((m) => m.v !== null) as (Member & { v: number })[];
  const bg = background.filter((c) => c.v !== null) as { id: string; l: number; v: number }[];
  const all = [...withV, ...bg];
  const wrap = wrapsAtZero(all.map((p) => p.l));
  const lx = (l: number) => (wrap && l > 180 ? l - 360 : l);
  const ls = all.map((p) => lx(p.l));
  const vs = all.map((p) => p.v);
  const pad = (lo: number, hi: number, min: number): [number, number] => {
    const span = Math.max(hi - lo, min);
    const mid = (lo + hi) / 2;
    return [mid - span * 0.55, mid + span * 0.55];
  };
  const [lLo, lHi] = all.length ? pad(Math.min(...ls), Math.max(...ls), 1) : [0, 1];
  const [vLo, vHi] = all.length ? pad(Math.min(...vs), Math.max(...vs), 10) : [0, 1];
  const w = W - M.left - M.right;
  const h = H - M.top - M.bottom;
  // l grows to the left; `pxPlotted` takes the plotted (possibly wrapped) longitude.
  const pxPlotted = (x: number) => M.left + ((lHi - x) / (lHi - lLo)) * w;
  const px = (l: number) => pxPlotted(lx(l));
  const py = (v: number) => M.top + ((vHi - v) / (vHi - vLo)) * h;
  const lt = niceTicks(lLo, lHi, 6);
  const vt = niceTicks(vLo, vHi, 5);
  const missing = members.length - withV.length;
  return (
    <SvgFigure
      title="Place in the longitude–velocity plane"
      fileStem={fileStem}
      width={W}
      height={H}
      caption={
        <>
          {backgroundNote}
          {missing > 0 &&
            ` ${missing} member${missing === 1 ? ' has' : 's have'} no velocity and are not shown.`}
        </>
      }
    >
      {lt.ticks.map((t) => (
        <g key={`l${t}`}>
          <line
            x1={pxPlotted(t)}
            x2={pxPlotted(t)}
            y1={M.top}
            y2={M.top + h}
            stroke={PLOT_COLOURS.faint}
            strokeWidth={0.5}
          />
          <text x={pxPlotted(t)} y={M.top + h + 14} textAnchor="middle" fill={PLOT_COLOURS.inkSoft}>
            {axisNumber(((t % 360) + 360) % 360, lt.decimals)}
          </text>
        </g>
      ))}
      {vt.ticks.map((t) => (
        <g key={`v${t}`}>
          <line
            x1={M.left}
            x2={M.left + w}
            y1={py(t)}
            y2={py(t)}
            stroke={PLOT_COLOURS.faint}
            strokeWidth={0.5}
          />
          <text x={M.left - 6} y={py(t)} dy="0.35em" textAnchor="end" fill={PLOT_COLOURS.inkSoft}>
            {axisNumber(t, vt.decimals)}
          </text>
        </g>
      ))}
      <rect x={M.left} y={M.top} width={w} height={h} fill="none" stroke={PLOT_COLOURS.ink} />
      {bg.map((c) => (
        <circle key={`bg${c.id}`} cx={px(c.l)} cy={py(c.v)} r={1.6} fill={PLOT_COLOURS.rule} />
      ))}
      {withV.map((m) => {
        const t = tracerStyle(m.kind);
        return (
          <path
            key={`${m.catalogId}:${m.row}`}
            d={markerPath(t.shape, px(m.l), py(m.v), 5)}
            fill={t.colour}
            stroke={PLOT_COLOURS.background}
            strokeWidth={0.6}
          >
            <title>{`${m.name ?? `row ${m.row}`}: l = ${axisNumber(m.l, 4)}°, v = ${axisNumber(m.v, 2)} km/s`}</title>
          </path>
        );
      })}
      <text x={M.left + w / 2} y={H - 8} textAnchor="middle" fill={PLOT_COLOURS.ink}>
        Galactic longitude l (°)
      </text>
      <text
        transform={`translate(14 ${M.top + h / 2}) rotate(-90)`}
        textAnchor="middle"
        fill={PLOT_COLOURS.ink}
      >
        v
        <tspan baselineShift="sub" fontSize={8}>
          LSR
        </tspan>{' '}
        (km/s)
      </text>
    </SvgFigure>
  );
}
