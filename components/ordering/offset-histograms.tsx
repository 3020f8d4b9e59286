'use client';

import { useMemo } from 'react';
import { niceTicks } from '@/components/plots/scatter-canvas';
import { PLOT_COLOURS, axisNumber } from '@/components/link-runs/svg-figure';
import { fmt } from '@/components/link-runs/format';
import { markerPath, tracerStyle, TRACER_KINDS, type TracerKind } from '@/lib/tracers';
import { ZoomFigure, type Domain, type HoverTarget } from './zoom-figure';
import type { RotationCurve } from '@/lib/astro/rotation-curves';
import { complexFlowSign } from './flow';
import type { Ci, ClassSummary, OrderingResult } from './types';
import { pc } from './words';

type Binned = { edges: number[]; counts: number[]; n: number };

/** Equal bins of a common, round width over [lo, hi] (kpc) for every series. */
function binAll(
  series: Float64Array[],
  targetBins: number,
): { edges: number[]; bin: (v: Float64Array) => Binned } {
  let lo = Infinity;
  let hi = -Infinity;
  for (const s of series)
    for (const v of s) {
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  if (!(hi > lo)) {
    lo = Number.isFinite(lo) ? lo - 0.05 : -0.5;
    hi = Number.isFinite(hi) ? hi + 0.05 : 0.5;
  }
  const t = niceTicks(lo, hi, targetBins);
  const step = t.ticks.length > 1 ? t.ticks[1] - t.ticks[0] : (hi - lo) / targetBins;
  const start = Math.floor(lo / step) * step;
  const n = Math.max(1, Math.ceil((hi - start) / step + 1e-9));
  const edges = Array.from({ length: n + 1 }, (_, i) => +(start + i * step).toPrecision(12));
  return {
    edges,
    bin: (v) => {
      const counts = new Array<number>(n).fill(0);
      for (const x of v) counts[Math.min(n - 1, Math.max(0, Math.floor((x - start) / step)))]++;
      return { edges, counts, n: v.length };
    },
  };
}

/** A step outline through the bins' tops, from the baseline at the first edge to the last. */
function stepPath(b: Binned, px: (x: number) => number, py: (y: number) => number, frac: boolean) {
  const y = (c: number) => py(frac && b.n ? c / b.n : c);
  let d = `M${px(b.edges[0]).toFixed(1)} ${py(0).toFixed(1)}`;
  b.counts.forEach((c, i) => {
    d += `V${y(c).toFixed(1)}H${px(b.edges[i + 1]).toFixed(1)}`;
  });
  return `${d}V${py(0).toFixed(1)}`;
}

function MedianMark({
  median,
  ci,
  colour,
  row,
  shape,
  px,
  top,
}: {
  median: number | null;
  ci: Ci | null;
  colour: string;
  row: number;
  shape?: ReturnType<typeof tracerStyle>['shape'];
  px: (x: number) => number;
  top: number;
}) {
  if (median === null) return null;
  const y = top + 8 + row * 10;
  return (
    <g>
      {ci && <line x1={px(ci[0])} x2={px(ci[1])} y1={y} y2={y} stroke={colour} strokeWidth={2.5} />}
      <line
        x1={px(median)}
        x2={px(median)}
        y1={y}
        y2={1e4}
        stroke={colour}
        strokeDasharray="4 3"
        strokeWidth={1.2}
      />
      {shape ? (
        <path d={markerPath(shape, px(median), y, 4.2)} fill={colour} />
      ) : (
        <circle cx={px(median)} cy={y} r={3.5} fill={colour} />
      )}
    </g>
  );
}

/**
 * Histograms of the offsets from the arm ridge (kpc) of every class's sources, signed downstream
 * as the class statistics are (offset × flow sign: positive downstream of the ridge, i.e. ahead
 * in rotation inside corotation and behind outside), overlaid as step outlines of the share of
 * each class per bin, with each class's median and 95 % bootstrap interval on top; and the
 * histogram of the per-complex gas-to-young-star offset across the arm, signed the same way.
 * Only complexes that enter the signed statistics (used, on a known side of corotation) count.
 */
export function OffsetHistograms({
  result,
  curve,
  patternSpeedKmsKpc,
  fileStem,
}: {
  result: OrderingResult;
  curve: RotationCurve;
  patternSpeedKmsKpc: number;
  fileStem: string;
}) {
  const sign = useMemo(
    () =>
      new Map(
        result.complexes.map((c) => [
          c.id,
          c.used ? complexFlowSign(c, curve, patternSpeedKmsKpc) : 0,
        ]),
      ),
    [result.complexes, curve, patternSpeedKmsKpc],
  );
  const series = useMemo(() => {
    const by = new Map<TracerKind, number[]>();
    for (const s of result.sources) {
      const f = sign.get(s.complexId) ?? 0;
      if (s.perpOffsetKpc === null || f === 0) continue;
      const list = by.get(s.kind) ?? [];
      list.push(f * s.perpOffsetKpc);
      by.set(s.kind, list);
    }
    return TRACER_KINDS.filter((k) => by.has(k)).map((k) => ({
      kind: k,
      values: Float64Array.from(by.get(k)!),
      summary: result.classes.find((c) => c.kind === k) as ClassSummary | undefined,
    }));
  }, [result, sign]);
  const classHists = useMemo(() => {
    const b = binAll(
      series.map((s) => s.values),
      28,
    );
    return { edges: b.edges, list: series.map((s) => ({ ...s, hist: b.bin(s.values) })) };
  }, [series]);
  const across = useMemo(
    () =>
      Float64Array.from(
        result.complexes.flatMap((c) => {
          const f = sign.get(c.id) ?? 0;
          return f !== 0 && c.gasToStarsAcrossKpc !== null
            ? [f * c.gasToStarsAcrossKpc * 1000]
            : [];
        }),
      ),
    [result.complexes, sign],
  );
  const acrossHist = useMemo(() => binAll([across], 24).bin(across), [across]);

  const classDomain = useMemo<Domain>(() => {
    const e = classHists.edges;
    let top = 0.05;
    for (const s of classHists.list)
      for (const c of s.hist.counts) top = Math.max(top, s.hist.n ? c / s.hist.n : 0);
    return {
      x0: e[0],
      x1: e[e.length - 1],
      y0: 0,
      y1: top * (1.15 + 0.08 * classHists.list.length),
    };
  }, [classHists]);
  const classTargets = useMemo<HoverTarget[]>(
    () =>
      classHists.list.flatMap((s) =>
        s.hist.counts.map((c, i) => ({
          x: (s.hist.edges[i] + s.hist.edges[i + 1]) / 2,
          y: s.hist.n ? c / s.hist.n : 0,
          text: `${tracerStyle(s.kind).label}: ${c} of ${s.hist.n} sources (${fmt(s.hist.n ? (100 * c) / s.hist.n : 0, 1)} %) between ${axisNumber(s.hist.edges[i], 3)} and ${axisNumber(s.hist.edges[i + 1], 3)} kpc`,
        })),
      ),
    [classHists],
  );
  const acrossDomain = useMemo<Domain>(() => {
    const e = acrossHist.edges;
    return { x0: e[0], x1: e[e.length - 1], y0: 0, y1: Math.max(1, ...acrossHist.counts) * 1.25 };
  }, [acrossHist]);
  const acrossTargets = useMemo<HoverTarget[]>(
    () =>
      acrossHist.counts.map((c, i) => ({
        x: (acrossHist.edges[i] + acrossHist.edges[i + 1]) / 2,
        y: c,
        text: `${c} complexes with a gas-to-young-star offset between ${fmt(acrossHist.edges[i], 1)} and ${fmt(acrossHist.edges[i + 1], 1)} pc`,
      })),
    [acrossHist],
  );
  const g = result.gasToStars;

  return (
    <div className="grid gap-6 xl:grid-cols-2">
      <ZoomFigure
        title="Offsets from the arm ridge by class"
        fileStem={`${fileStem}-offsets-by-class`}
        width={560}
        height={340}
        domain={classDomain}
        zoomY={false}
        xLabel="offset from the ridge, downstream positive (kpc)"
        yLabel="share of the class’s sources"
        targets={classTargets}
        testId="ordering-class-histograms"
        caption="Offsets signed along the flow: positive is downstream of the ridge (ahead in rotation inside corotation, behind outside). Step outlines: the share of each class’s sources per bin, from the complexes used. On top: each class’s median with its 95 % bootstrap interval."
        overlay={() => (
          <g transform="translate(470 24)">
            {classHists.list.map((s, i) => {
              const t = tracerStyle(s.kind);
              return (
                <g key={s.kind} transform={`translate(0 ${i * 15})`}>
                  <path d={markerPath(t.shape, 0, -3, 4)} fill={t.colour} />
                  <text x={8} y={0} fill={PLOT_COLOURS.ink}>
                    {t.label} ({s.hist.n})
                  </text>
                </g>
              );
            })}
          </g>
        )}
      >
        {({ px, py }) => (
          <>
            <line
              x1={px(0)}
              x2={px(0)}
              y1={0}
              y2={1e4}
              stroke={PLOT_COLOURS.ink}
              strokeWidth={0.8}
            />
            {classHists.list.map((s) => {
              const t = tracerStyle(s.kind);
              return (
                <path
                  key={s.kind}
                  d={stepPath(s.hist, px, py, true)}
                  fill={t.colour}
                  fillOpacity={0.08}
                  stroke={t.colour}
                  strokeWidth={1.6}
                />
              );
            })}
            {classHists.list.map((s, i) => {
              const t = tracerStyle(s.kind);
              return (
                <MedianMark
                  key={`m${s.kind}`}
                  median={s.summary?.medianOffsetKpc ?? null}
                  ci={s.summary?.ci95 ?? null}
                  colour={t.colour}
                  shape={t.shape}
                  row={i}
                  px={px}
                  top={14}
                />
              );
            })}
          </>
        )}
      </ZoomFigure>
      <ZoomFigure
        title="Gas-to-young-star offset across the arm, per complex"
        fileStem={`${fileStem}-gas-to-stars`}
        width={560}
        height={340}
        domain={acrossDomain}
        zoomY={false}
        xLabel="young stars minus gas across the arm, downstream positive (pc)"
        yLabel="complexes"
        targets={acrossTargets}
        testId="ordering-gas-to-stars-histogram"
        caption={`Positive: the young stars lie downstream of their gas (ahead in rotation inside corotation, behind outside). On top: the median (${pc(g.medianAcrossKpc, 1)} pc) with its 95 % bootstrap interval; ${across.length} complexes.`}
      >
        {({ px, py }) => (
          <>
            <line
              x1={px(0)}
              x2={px(0)}
              y1={0}
              y2={1e4}
              stroke={PLOT_COLOURS.ink}
              strokeWidth={0.8}
            />
            <path
              d={stepPath(acrossHist, px, py, false)}
              fill={PLOT_COLOURS.accent}
              fillOpacity={0.18}
              stroke={PLOT_COLOURS.accent}
              strokeWidth={1.6}
            />
            <MedianMark
              median={g.medianAcrossKpc === null ? null : g.medianAcrossKpc * 1000}
              ci={g.ci95 ? [g.ci95[0] * 1000, g.ci95[1] * 1000] : null}
              colour={PLOT_COLOURS.ink}
              row={0}
              px={px}
              top={14}
            />
          </>
        )}
      </ZoomFigure>
    </div>
  );
}
