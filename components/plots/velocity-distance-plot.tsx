'use client';

import { useMemo, useRef } from 'react';
import { vLsrAtKms } from '@/lib/astro/kinematic-distance';
import { toolCurve, type ToolCurveName } from '@/lib/calculators';
import { FigureDownloads, PLOT_COLOURS, saveSvgFigure } from './figure';

/** Theme colours (a saved SVG gets them written out); the mark is the HII tracer's orange. */
const COLOUR = {
  paper: PLOT_COLOURS.background,
  ink: PLOT_COLOURS.ink,
  inkSoft: PLOT_COLOURS.inkSoft,
  rule: PLOT_COLOURS.faint,
  accent: PLOT_COLOURS.accent,
  mark: '#d55e00',
};

const W = 720;
const H = 400;
const M = { left: 66, right: 24, top: 44, bottom: 54 };
const PW = W - M.left - M.right;
const PH = H - M.top - M.bottom;
const SAMPLES = 600;
/** A paper-coloured halo keeps labels readable where they cross the curve or the grid. */
const HALO = { stroke: COLOUR.paper, strokeWidth: 3, paintOrder: 'stroke' } as const;

export type VelocityDistancePlotProps = {
  lDeg: number;
  bDeg: number;
  vKms: number;
  curve: { name: ToolCurveName; label: string; R0: number; theta0: number };
  /** `single` is the one root of an outer-Galaxy source (near and far null). */
  roots: { near: number | null; far: number | null; single: number | null; tangent: number | null };
};

/** Round steps of 1, 2 or 5 × 10^k covering [lo, hi] with about `count` ticks. */
function ticks(lo: number, hi: number, count: number): number[] {
  const raw = (hi - lo) / count;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((f) => f * mag).find((s) => s >= raw) ?? 10 * mag;
  const out: number[] = [];
  for (let t = Math.ceil(lo / step) * step; t <= hi + step * 1e-9; t += step) {
    out.push(Math.abs(t) < step * 1e-9 ? 0 : t);
  }
  return out;
}

function niceCeil(x: number): number {
  const mag = 10 ** Math.floor(Math.log10(x));
  return ([1, 1.5, 2, 2.5, 3, 4, 5, 6, 8, 10].find((f) => f * mag >= x) ?? 10) * mag;
}

/**
 * v_LSR (km/s) against line-of-sight distance d (kpc) along one sight line (l, b in degrees)
 * under circular rotation on the chosen curve, with the source's velocity as a horizontal line
 * and its near, far (or single outer-Galaxy) and tangent-point distances marked. Drawn as inline SVG; "Download SVG"
 * saves exactly what is shown.
 */
export function VelocityDistancePlot({
  lDeg,
  bDeg,
  vKms,
  curve,
  roots,
}: VelocityDistancePlotProps) {
  const svgRef = useRef<SVGSVGElement>(null);
  const plot = useMemo(() => {
    const rc = toolCurve(curve.name, curve.R0, curve.theta0);
    const dMax = niceCeil(
      Math.max(
        15,
        1.15 * (roots.far ?? roots.single ?? 0),
        2.3 * (roots.tangent ?? 0),
        1.15 * (roots.near ?? 0),
      ),
    );
    const d = new Float64Array(SAMPLES + 1);
    const v = new Float64Array(SAMPLES + 1);
    let vMin = Math.min(vKms, 0);
    let vMax = Math.max(vKms, 0);
    for (let i = 0; i <= SAMPLES; i++) {
      d[i] = (dMax * i) / SAMPLES;
      v[i] = vLsrAtKms(lDeg, bDeg, d[i], rc);
      vMin = Math.min(vMin, v[i]);
      vMax = Math.max(vMax, v[i]);
    }
    const pad = Math.max(5, 0.08 * (vMax - vMin));
    const vTicks = ticks(vMin - pad, vMax + pad, 6);
    const vLo = Math.min(vMin - pad, vTicks[0]);
    const vHi = Math.max(vMax + pad, vTicks[vTicks.length - 1]);
    const x = (dist: number) => M.left + (dist / dMax) * PW;
    const y = (vel: number) => M.top + ((vHi - vel) / (vHi - vLo)) * PH;
    let path = '';
    for (let i = 0; i <= SAMPLES; i++) {
      path += `${i === 0 ? 'M' : 'L'}${x(d[i]).toFixed(2)},${y(v[i]).toFixed(2)}`;
    }
    const vTangent = roots.tangent === null ? null : vLsrAtKms(lDeg, bDeg, roots.tangent, rc);
    return { dMax, dTicks: ticks(0, dMax, 6), vTicks, x, y, path, vTangent };
  }, [
    lDeg,
    bDeg,
    vKms,
    curve.name,
    curve.R0,
    curve.theta0,
    roots.far,
    roots.single,
    roots.near,
    roots.tangent,
  ]);

  const { x, y } = plot;
  const atTangent = roots.tangent !== null && roots.near !== null && roots.near === roots.far;
  // The square marks the far root, or the single root of an outer-Galaxy source.
  const square = roots.far ?? roots.single;
  const squareName = roots.far !== null ? 'far' : 'single';
  const tangentAbove = plot.vTangent !== null && plot.vTangent >= vKms;
  const rootLabelDy = tangentAbove ? 18 : -10;
  const title = `l = ${lDeg.toFixed(3)}°, b = ${bDeg.toFixed(3)}°, v_LSR = ${vKms.toFixed(1)} km/s — ${curve.label}, R0 = ${curve.R0} kpc, Θ0 = ${curve.theta0} km/s`;

  return (
    <figure className="min-w-0 space-y-2">
      <svg
        ref={svgRef}
        data-figure=""
        xmlns="http://www.w3.org/2000/svg"
        viewBox={`0 0 ${W} ${H}`}
        role="img"
        aria-label={`Velocity against distance along the line of sight: ${title}`}
        className="h-auto w-full max-w-3xl rounded-md border border-rule"
        fontFamily="Inter, ui-sans-serif, system-ui, sans-serif"
      >
        <title>{title}</title>
        <rect x={0} y={0} width={W} height={H} fill={COLOUR.paper} />
        <text x={M.left} y={22} fontSize={12} fill={COLOUR.ink}>
          {title}
        </text>
        {plot.dTicks.map((t) => (
          <g key={`d${t}`}>
            <line
              x1={x(t)}
              x2={x(t)}
              y1={M.top}
              y2={M.top + PH}
              stroke={COLOUR.rule}
              strokeWidth={0.6}
            />
            <text
              x={x(t)}
              y={M.top + PH + 16}
              fontSize={11}
              textAnchor="middle"
              fill={COLOUR.inkSoft}
              fontFamily="ui-monospace, monospace"
            >
              {t}
            </text>
          </g>
        ))}
        {plot.vTicks.map((t) => (
          <g key={`v${t}`}>
            <line
              x1={M.left}
              x2={M.left + PW}
              y1={y(t)}
              y2={y(t)}
              stroke={COLOUR.rule}
              strokeWidth={t === 0 ? 1.2 : 0.6}
            />
            <text
              x={M.left - 6}
              y={y(t) + 4}
              fontSize={11}
              textAnchor="end"
              fill={COLOUR.inkSoft}
              fontFamily="ui-monospace, monospace"
            >
              {t}
            </text>
          </g>
        ))}
        <rect
          x={M.left}
          y={M.top}
          width={PW}
          height={PH}
          fill="none"
          stroke={COLOUR.inkSoft}
          strokeWidth={0.8}
        />
        <text x={M.left + PW / 2} y={H - 12} fontSize={12} textAnchor="middle" fill={COLOUR.ink}>
          Distance along the line of sight d (kpc)
        </text>
        <text
          x={16}
          y={M.top + PH / 2}
          fontSize={12}
          textAnchor="middle"
          fill={COLOUR.ink}
          transform={`rotate(-90 16 ${M.top + PH / 2})`}
        >
          v_LSR (km/s)
        </text>
        <path
          d={plot.path}
          fill="none"
          stroke={COLOUR.accent}
          strokeWidth={2}
          data-series="curve"
        />
        <line
          x1={M.left}
          x2={M.left + PW}
          y1={y(vKms)}
          y2={y(vKms)}
          stroke={COLOUR.mark}
          strokeWidth={1.2}
          strokeDasharray="6 4"
          data-series="velocity"
        />
        <text
          x={M.left + PW - 4}
          y={y(vKms) - 5}
          fontSize={11}
          textAnchor="end"
          fill={COLOUR.mark}
          {...HALO}
        >
          v = {vKms.toFixed(1)} km/s
        </text>
        {!atTangent && roots.near !== null && (
          <g data-root="near">
            <circle
              cx={x(roots.near)}
              cy={y(vKms)}
              r={5}
              fill={COLOUR.paper}
              stroke={COLOUR.ink}
              strokeWidth={1.6}
            />
            <text
              x={x(roots.near) - 6}
              y={y(vKms) + rootLabelDy}
              fontSize={11}
              textAnchor="end"
              fill={COLOUR.ink}
              {...HALO}
            >
              near {roots.near.toFixed(2)} kpc
            </text>
          </g>
        )}
        {!atTangent && square !== null && (
          <g data-root={squareName}>
            <rect
              x={x(square) - 4.5}
              y={y(vKms) - 4.5}
              width={9}
              height={9}
              fill={COLOUR.paper}
              stroke={COLOUR.ink}
              strokeWidth={1.6}
            />
            <text
              x={x(square) + 6}
              y={y(vKms) + rootLabelDy}
              fontSize={11}
              textAnchor="start"
              fill={COLOUR.ink}
              {...HALO}
            >
              {squareName} {square.toFixed(2)} kpc
            </text>
          </g>
        )}
        {roots.tangent !== null && plot.vTangent !== null && roots.tangent <= plot.dMax && (
          <g data-root="tangent">
            <path
              d={`M${x(roots.tangent)},${y(plot.vTangent) - 6}l6,6l-6,6l-6,-6z`}
              fill={COLOUR.accent}
              stroke={COLOUR.paper}
              strokeWidth={1}
            />
            <text
              x={x(roots.tangent)}
              y={y(plot.vTangent) + (tangentAbove ? -10 : 20)}
              fontSize={11}
              textAnchor="middle"
              fill={COLOUR.accent}
              {...HALO}
            >
              tangent {roots.tangent.toFixed(2)} kpc, v_t = {plot.vTangent.toFixed(1)} km/s
              {atTangent ? ' (source placed here)' : ''}
            </text>
          </g>
        )}
      </svg>
      <figcaption className="flex flex-wrap items-center justify-between gap-2 text-xs text-ink-soft">
        <span>
          Circular rotation on the chosen curve; ○ near and □ far (or single) roots on the dashed
          velocity line, ◆ the tangent point (terminal velocity).
        </span>
        <FigureDownloads
          title="velocity against distance"
          save={(format) =>
            saveSvgFigure(
              svgRef.current,
              `velocity-distance_l${lDeg.toFixed(3)}_b${bDeg.toFixed(3)}`,
              format,
            )
          }
        />
      </figcaption>
    </figure>
  );
}
