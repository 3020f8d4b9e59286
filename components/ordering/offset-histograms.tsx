'use client';

import { useMemo } from 'react';
import { niceTicks } from '@/components/plots/scatter-canvas';
import { PLOT_COLOURS, axisNumber } from '@/components/plots/figure';
import { fmt } from '@/components/link-runs/format';
import { markerPath, tracerStyle, TRACER_KINDS, type TracerKind } from '@/lib/tracers';
import { ZoomFigure, type Domain, type HoverTarget } from './zoom-figure';
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
 * Histograms of the offsets from the arm ridge (kpc, as measured: positive ahead of the ridge in
 * the sense of rotation) of every class's sources at their complexes' median distances, overlaid
 * as step outlines of the share of each class per bin, with each class's median and its 95 %
 * interval (which carries the distance errors) on top. Only complexes the analysis used count.
 */
export function OffsetHistograms({
  result,
  fileStem,
}: {
  result: OrderingResult;
  fileStem: string;
}) {
  const series = useMemo(() => {
    const used = new Set(result.complexes.filter((c) => c.used).map((c) => c.id));
    const by = new Map<TracerKind, number[]>();
    for (const s of result.sources) {
      if (s.perpOffsetKpc === null || !used.has(s.complexId)) continue;
      const list = by.get(s.kind) ?? [];
      list.push(s.perpOffsetKpc);
      by.set(s.kind, list);
    }
    return TRACER_KINDS.filter((k) => by.has(k)).map((k) => ({
      kind: k,
      values: Float64Array.from(by.get(k)!),
      summary: result.classes.find((c) => c.kind === k) as ClassSummary | undefined,
    }));
  }, [result]);
  const classHists = useMemo(() => {
    const b = binAll(
      series.map((s) => s.values),
      28,
    );
    return { edges: b.edges, list: series.map((s) => ({ ...s, hist: b.bin(s.values) })) };
  }, [series]);
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

  return (
    <ZoomFigure
      title="Offsets from the arm ridge by class"
      fileStem={`${fileStem}-offsets-by-class`}
      width={560}
      height={340}
      domain={classDomain}
      zoomY={false}
      xLabel="offset from the ridge, ahead in rotation positive (kpc)"
      yLabel="share of the class’s sources"
      targets={classTargets}
      testId="ordering-class-histograms"
      caption="Offsets as measured: positive ahead of the ridge in the sense of rotation, each source at its complex’s median distance. Step outlines: the share of each class’s sources per bin, from the complexes used. On top: each class’s median with its 95 % interval over complexes and distance draws."
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
          <line x1={px(0)} x2={px(0)} y1={0} y2={1e4} stroke={PLOT_COLOURS.ink} strokeWidth={0.8} />
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
  );
}

/**
 * The histogram of each used complex's young-star minus gas offset across the arm within the
 * complex (pc, positive ahead in rotation), with the median and its 95 % interval on top. These
 * offsets are bounded by the link radius: they show how young stars sit on their own cloud.
 */
export function IntraComplexHistogram({
  result,
  fileStem,
}: {
  result: OrderingResult;
  fileStem: string;
}) {
  const across = useMemo(
    () =>
      Float64Array.from(
        result.complexes.flatMap((c) =>
          c.used && c.intraAcrossKpc !== null ? [c.intraAcrossKpc * 1000] : [],
        ),
      ),
    [result.complexes],
  );
  const hist = useMemo(() => binAll([across], 24).bin(across), [across]);
  const domain = useMemo<Domain>(() => {
    const e = hist.edges;
    return { x0: e[0], x1: e[e.length - 1], y0: 0, y1: Math.max(1, ...hist.counts) * 1.25 };
  }, [hist]);
  const targets = useMemo<HoverTarget[]>(
    () =>
      hist.counts.map((c, i) => ({
        x: (hist.edges[i] + hist.edges[i + 1]) / 2,
        y: c,
        text: `${c} complexes with young stars between ${fmt(hist.edges[i], 1)} and ${fmt(hist.edges[i + 1], 1)} pc from their own gas`,
      })),
    [hist],
  );
  const ic = result.intraComplex;
  return (
    <ZoomFigure
      title="Young stars on their own cloud, per complex"
      fileStem={`${fileStem}-intra-complex`}
      width={560}
      height={300}
      domain={domain}
      zoomY={false}
      xLabel="young stars minus gas within the complex, across the arm, ahead + (pc)"
      yLabel="complexes"
      targets={targets}
      testId="ordering-intra-histogram"
      caption={`Positive: the young stars of a complex lie ahead of its own gas in the sense of rotation. On top: the median (${pc(ic.medianAcrossKpc, 1)} pc) with its 95 % interval; ${across.length} complexes.`}
    >
      {({ px, py }) => (
        <>
          <line x1={px(0)} x2={px(0)} y1={0} y2={1e4} stroke={PLOT_COLOURS.ink} strokeWidth={0.8} />
          <path
            d={stepPath(hist, px, py, false)}
            fill={PLOT_COLOURS.accent}
            fillOpacity={0.18}
            stroke={PLOT_COLOURS.accent}
            strokeWidth={1.6}
          />
          <MedianMark
            median={ic.medianAcrossKpc === null ? null : ic.medianAcrossKpc * 1000}
            ci={ic.ci95 ? [ic.ci95[0] * 1000, ic.ci95[1] * 1000] : null}
            colour={PLOT_COLOURS.ink}
            row={0}
            px={px}
            top={14}
          />
        </>
      )}
    </ZoomFigure>
  );
}
