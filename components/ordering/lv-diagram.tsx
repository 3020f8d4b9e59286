'use client';

import { useMemo } from 'react';
import { PLOT_COLOURS, axisNumber } from '@/components/plots/figure';
import { fmt } from '@/components/link-runs/format';
import { armLocusLv, type ArmSpec } from '@/lib/astro/arms';
import { fromGalactocentric } from '@/lib/astro/galactocentric';
import type { RotationCurve } from '@/lib/astro/rotation-curves';
import { markerPath, tracerStyle, TRACER_KINDS } from '@/lib/tracers';
import { ZoomFigure, type Domain, type HoverTarget, type Scales } from './zoom-figure';
import type { ResultComplex, ResultSource } from './types';
import { describeComplex } from './face-on-map';

/** Longitude folded into (−180°, 180°] so that the inner Galaxy is one contiguous strip. */
const fold = (lDeg: number) => (lDeg > 180 ? lDeg - 360 : lDeg);
/** Tick labels back in [0°, 360°). */
const lTick = (l: number, decimals: number) => axisNumber(((l % 360) + 360) % 360, decimals);

/** An arm locus split wherever it jumps across l = ±180° (folded), as polylines of (l, v). */
function locusPieces(arm: ArmSpec, curve: RotationCurve): [number, number][][] {
  const lv = armLocusLv(arm, curve, 0.5);
  const pieces: [number, number][][] = [];
  let cur: [number, number][] = [];
  for (let i = 0; i < lv.lDeg.length; i++) {
    const l = fold(lv.lDeg[i]);
    const v = lv.vLsrKms[i];
    if (cur.length && Math.abs(l - cur[cur.length - 1][0]) > 90) {
      pieces.push(cur);
      cur = [];
    }
    cur.push([l, v]);
  }
  if (cur.length) pieces.push(cur);
  return pieces;
}

/**
 * The longitude–velocity diagram of an analysis: each arm's locus for circular rotation on the
 * analysis's rotation curve (`armLocusLv`), and the complexes' sources by class at their own
 * longitude and their complex's LSR velocity (radio convention). Longitude grows to the left.
 */
/**
 * An arm's name beside its locus at the middle of the part of the locus in view (kept 10 % of
 * the view away from its edges), and written towards the plot's centre, so the label is never
 * cut by the plot frame however the view is zoomed or panned.
 */
function LocusLabel({
  name,
  piece,
  scales,
}: {
  name: string;
  piece: [number, number][];
  scales: Scales;
}) {
  const { view, px, py } = scales;
  const mx = 0.1 * (view.x1 - view.x0);
  const my = 0.1 * (view.y1 - view.y0);
  const inView = piece.filter(
    ([x, y]) => x > view.x0 + mx && x < view.x1 - mx && y > view.y0 + my && y < view.y1 - my,
  );
  if (inView.length === 0) return null;
  const [x, y] = inView[Math.floor(inView.length / 2)];
  const towardsLeft = px(x) > (px(view.x0) + px(view.x1)) / 2;
  return (
    <text
      x={px(x) + (towardsLeft ? -4 : 4)}
      y={py(y) - 4}
      textAnchor={towardsLeft ? 'end' : 'start'}
      fill={PLOT_COLOURS.accent}
      fontSize={10}
    >
      {name}
    </text>
  );
}

export function LvDiagram({
  arms,
  curve,
  complexes,
  sources,
  fileStem,
}: {
  arms: ArmSpec[];
  curve: RotationCurve;
  complexes: ResultComplex[];
  sources: ResultSource[];
  fileStem: string;
}) {
  const loci = useMemo(
    () => arms.map((a) => ({ name: a.name, pieces: locusPieces(a, curve) })),
    [arms, curve],
  );
  const byId = useMemo(() => new Map(complexes.map((c) => [c.id, c])), [complexes]);
  const points = useMemo(
    () =>
      sources.flatMap((s) => {
        const c = byId.get(s.complexId);
        if (!c || c.vLsrKms === null) return [];
        const l = fold(fromGalactocentric(s.xKpc, s.yKpc, 0, curve.R0Kpc).lDeg);
        return [{ l, v: c.vLsrKms, kind: s.kind, used: c.used, complex: c }];
      }),
    [sources, byId, curve.R0Kpc],
  );
  const domain = useMemo<Domain>(() => {
    let lo = -50;
    let hi = 50;
    for (const l of loci)
      for (const p of l.pieces)
        for (const [, v] of p)
          if (Number.isFinite(v)) {
            lo = Math.min(lo, v);
            hi = Math.max(hi, v);
          }
    for (const p of points) {
      lo = Math.min(lo, p.v);
      hi = Math.max(hi, p.v);
    }
    const pad = 0.05 * (hi - lo);
    return { x0: -180, x1: 180, y0: Math.floor(lo - pad), y1: Math.ceil(hi + pad) };
  }, [loci, points]);
  const targets = useMemo<HoverTarget[]>(() => {
    const t: HoverTarget[] = points.map((p) => ({
      x: p.l,
      y: p.v,
      text: `${tracerStyle(p.kind).label} member at l ${lTick(p.l, 2)}° — ${describeComplex(p.complex)}`,
    }));
    for (const l of loci)
      for (const piece of l.pieces)
        for (let i = 0; i < piece.length; i += 6)
          t.push({
            x: piece[i][0],
            y: piece[i][1],
            text: `${l.name} locus: l ${lTick(piece[i][0], 1)}°, v ${fmt(piece[i][1], 1)} km/s`,
          });
    return t;
  }, [points, loci]);
  const kinds = TRACER_KINDS.filter((k) => points.some((p) => p.kind === k));

  return (
    <ZoomFigure
      title="Longitude–velocity diagram with arm loci"
      fileStem={fileStem}
      width={760}
      height={420}
      domain={domain}
      xLabel="Galactic longitude l (°)"
      yLabel="LSR velocity v (km/s)"
      xReversed
      formatX={lTick}
      targets={targets}
      testId="ordering-lv"
      caption={`Arm loci for circular rotation on ${curve.label} (R0 = ${fmt(curve.R0Kpc, 2)} kpc, Θ0 = ${fmt(curve.theta0Kms, 1)} km/s) at b = 0°. Sources at their own longitude and their complex’s velocity; faint markers belong to complexes left out of the statistics.`}
      overlay={({ px }) => (
        <g transform={`translate(${px(180) + 8} 22)`}>
          {kinds.map((k, i) => {
            const t = tracerStyle(k);
            return (
              <g key={k} transform={`translate(${i * 52} 0)`}>
                <path d={markerPath(t.shape, 0, -3, 4)} fill={t.colour} />
                <text x={8} y={0} fill={PLOT_COLOURS.ink}>
                  {t.label}
                </text>
              </g>
            );
          })}
        </g>
      )}
    >
      {(scales) => (
        <>
          <line
            x1={scales.px(180)}
            x2={scales.px(-180)}
            y1={scales.py(0)}
            y2={scales.py(0)}
            stroke={PLOT_COLOURS.rule}
          />
          {loci.map((l) =>
            l.pieces.map((piece, j) => (
              <g key={`${l.name}${j}`}>
                <polyline
                  points={piece
                    .map(([x, y]) => `${scales.px(x).toFixed(1)},${scales.py(y).toFixed(1)}`)
                    .join(' ')}
                  fill="none"
                  stroke={PLOT_COLOURS.accent}
                  strokeWidth={1.6}
                  strokeOpacity={0.7}
                />
                {j === 0 && <LocusLabel name={l.name} piece={piece} scales={scales} />}
              </g>
            )),
          )}
          {points.map((p, i) => {
            const t = tracerStyle(p.kind);
            return (
              <path
                key={i}
                d={markerPath(t.shape, scales.px(p.l), scales.py(p.v), 3)}
                fill={t.colour}
                fillOpacity={p.used ? 0.85 : 0.25}
              />
            );
          })}
        </>
      )}
    </ZoomFigure>
  );
}
