'use client';

import { niceTicks } from '@/components/plots/scatter-canvas';
import { PLOT_COLOURS, SvgFigure, axisNumber } from '@/components/plots/figure';
import type { Link, Member } from '@/components/link-runs/types';
import { markerPath, tracerStyle } from '@/lib/tracers';

const W = 380;
const H = 380;
const M = { left: 56, right: 14, top: 14, bottom: 44 };
const DEG_TO_RAD = Math.PI / 180;

/** Longitude difference l − l0 in degrees, wrapped into [−180°, 180°). */
const dLon = (l: number, l0: number) => ((((l - l0 + 180) % 360) + 360) % 360) - 180;

/**
 * Offsets of the members from the complex centroid in the tangent plane, in arcsec: x = Δl·cos b0
 * (flat-sky approximation, good for complexes of a few degrees or less) and y = Δb.
 */
export function skyOffsetsArcsec(members: Member[], l0: number, b0: number) {
  const cosB0 = Math.cos(b0 * DEG_TO_RAD);
  return members.map((m) => ({ x: dLon(m.l, l0) * cosB0 * 3600, y: (m.b - b0) * 3600 }));
}

/**
 * A small sky plot of a complex: members as class markers at their offsets from the centroid
 * (l increasing to the left, b upwards, equal scales), the links as lines, and around each linked
 * member a dashed circle of the largest match radius used by its links.
 */
export function ComplexSky({
  members,
  links,
  l0,
  b0,
  fileStem,
}: {
  members: Member[];
  links: Link[];
  l0: number;
  b0: number;
  fileStem: string;
}) {
  const offsets = skyOffsetsArcsec(members, l0, b0);
  const index = new Map(members.map((m, i) => [`${m.catalogId}:${m.row}`, i]));
  const circle = new Float64Array(members.length);
  for (const k of links) {
    for (const key of [`${k.catalogA}:${k.rowA}`, `${k.catalogB}:${k.rowB}`]) {
      const i = index.get(key);
      if (i !== undefined) circle[i] = Math.max(circle[i], k.radiusArcsec);
    }
  }
  let extent = 1;
  offsets.forEach((o, i) => {
    extent = Math.max(extent, Math.abs(o.x) + circle[i], Math.abs(o.y) + circle[i]);
  });
  extent *= 1.08;
  // Arcminutes read better once the complex spans more than a few arcminutes.
  const inArcmin = extent > 300;
  const unit = inArcmin ? '′' : '″';
  const toUnit = (arcsec: number) => (inArcmin ? arcsec / 60 : arcsec);
  const w = W - M.left - M.right;
  const h = H - M.top - M.bottom;
  const scale = Math.min(w, h) / (2 * extent);
  const cx = M.left + w / 2;
  const cy = M.top + h / 2;
  // l grows to the left: a positive Δl·cos b is drawn left of the centre.
  const px = (x: number) => cx - x * scale;
  const py = (y: number) => cy - y * scale;
  const ticks = niceTicks(toUnit(-extent), toUnit(extent), 5);
  const toArcsec = (t: number) => (inArcmin ? t * 60 : t);
  const kinds = [...new Set(members.map((m) => m.kind))];
  return (
    <SvgFigure
      title="Members on the sky"
      fileStem={fileStem}
      width={W}
      height={H}
      caption={`Offsets from the centroid l = ${axisNumber(l0, 4)}°, b = ${axisNumber(b0, 4)}°; dashed circles: match radius.`}
    >
      <defs>
        <clipPath id="complex-sky-clip">
          <rect x={M.left} y={M.top} width={w} height={h} />
        </clipPath>
      </defs>
      {ticks.ticks.map((t) => (
        <g key={t}>
          <line
            x1={px(toArcsec(t))}
            x2={px(toArcsec(t))}
            y1={M.top}
            y2={M.top + h}
            stroke={PLOT_COLOURS.faint}
            strokeWidth={0.5}
          />
          <line
            x1={M.left}
            x2={M.left + w}
            y1={py(toArcsec(t))}
            y2={py(toArcsec(t))}
            stroke={PLOT_COLOURS.faint}
            strokeWidth={0.5}
          />
          <text
            x={px(toArcsec(t))}
            y={M.top + h + 14}
            textAnchor="middle"
            fill={PLOT_COLOURS.inkSoft}
          >
            {axisNumber(t, ticks.decimals)}
          </text>
          <text
            x={M.left - 6}
            y={py(toArcsec(t))}
            dy="0.35em"
            textAnchor="end"
            fill={PLOT_COLOURS.inkSoft}
          >
            {axisNumber(t, ticks.decimals)}
          </text>
        </g>
      ))}
      <rect x={M.left} y={M.top} width={w} height={h} fill="none" stroke={PLOT_COLOURS.ink} />
      <g clipPath="url(#complex-sky-clip)">
        {offsets.map((o, i) =>
          circle[i] > 0 ? (
            <circle
              key={`c${i}`}
              cx={px(o.x)}
              cy={py(o.y)}
              r={circle[i] * scale}
              fill="none"
              stroke={tracerStyle(members[i].kind).colour}
              strokeOpacity={0.6}
              strokeDasharray="3 3"
            />
          ) : null,
        )}
        {links.map((k) => {
          const a = index.get(`${k.catalogA}:${k.rowA}`);
          const b = index.get(`${k.catalogB}:${k.rowB}`);
          if (a === undefined || b === undefined) return null;
          return (
            <line
              key={`${k.catalogA}:${k.rowA}-${k.catalogB}:${k.rowB}`}
              x1={px(offsets[a].x)}
              y1={py(offsets[a].y)}
              x2={px(offsets[b].x)}
              y2={py(offsets[b].y)}
              stroke={PLOT_COLOURS.inkSoft}
              strokeWidth={0.8}
            />
          );
        })}
        {offsets.map((o, i) => {
          const t = tracerStyle(members[i].kind);
          return (
            <path
              key={`m${i}`}
              d={markerPath(t.shape, px(o.x), py(o.y), 5)}
              fill={t.colour}
              stroke={PLOT_COLOURS.background}
              strokeWidth={0.6}
            >
              <title>{`${members[i].name ?? `row ${members[i].row}`} (${members[i].catalogName})`}</title>
            </path>
          );
        })}
      </g>
      {kinds.map((k, i) => (
        <g key={k}>
          <path
            d={markerPath(tracerStyle(k).shape, M.left + 12, M.top + 12 + i * 15, 4.5)}
            fill={tracerStyle(k).colour}
          />
          <text x={M.left + 22} y={M.top + 12 + i * 15} dy="0.35em" fill={PLOT_COLOURS.ink}>
            {tracerStyle(k).label}
          </text>
        </g>
      ))}
      <text x={M.left + w / 2} y={H - 8} textAnchor="middle" fill={PLOT_COLOURS.ink}>
        {`Δl cos b (${unit}), l increasing to the left`}
      </text>
      <text
        transform={`translate(14 ${M.top + h / 2}) rotate(-90)`}
        textAnchor="middle"
        fill={PLOT_COLOURS.ink}
      >
        {`Δb (${unit})`}
      </text>
    </SvgFigure>
  );
}
