'use client';

import { useMemo } from 'react';
import { MapLegend } from '@/components/plots/map-legend';
import { PLOT_COLOURS, axisNumber } from '@/components/plots/figure';
import { fmt } from '@/components/link-runs/format';
import { armPoints, type ArmSpec } from '@/lib/astro/arms';
import { toGalactocentric } from '@/lib/astro/galactocentric';
import { markerPath, tracerStyle, TRACER_KINDS } from '@/lib/tracers';
import { ZoomFigure, type Domain, type HoverTarget } from './zoom-figure';
import type { ResultComplex, ResultSource } from './types';
import { CHOICE_WORDS, exclusionWords } from './words';

const MARGIN = { left: 58, right: 14, top: 14, bottom: 44 };

/** One arm's ridge as an SVG polyline in data coordinates, with the point where its name goes. */
function armLine(arm: ArmSpec) {
  const p = armPoints(arm, 1);
  const n = p.xKpc.length;
  const xy: [number, number][] = [];
  for (let i = 0; i < n; i++) xy.push([p.xKpc[i], p.yKpc[i]]);
  return { name: arm.name, xy, end: xy[n - 1] };
}

/**
 * The face-on map in the Galactocentric frame of `@/lib/astro/galactocentric`, seen from the
 * north Galactic pole (x and y in kpc; the Sun at (R0, 0); rotation is clockwise): the arm ridge
 * lines, the Sun, the Galactic centre, the solar and corotation circles and — for a result — the
 * complexes' sources by class (colour and shape) with each complex's distance interval drawn as a
 * thin segment along its line of sight. Sources of complexes left out of the statistics are faint.
 */
export function FaceOnMap({
  title,
  fileStem,
  arms,
  R0Kpc,
  corotationKpc,
  corotationSource,
  complexes = [],
  sources = [],
  size = 620,
  testId,
}: {
  title: string;
  fileStem: string;
  arms: ArmSpec[];
  R0Kpc: number;
  corotationKpc: number | null;
  /** Where the pattern speed behind the corotation circle came from, for the caption. */
  corotationSource: 'fitted' | 'assumed' | null;
  complexes?: ResultComplex[];
  sources?: ResultSource[];
  size?: number;
  testId?: string;
}) {
  const lines = useMemo(() => arms.map(armLine), [arms]);
  const segments = useMemo(
    () =>
      complexes.flatMap((c) => {
        if (c.distLoKpc === null || c.distHiKpc === null) return [];
        const a = toGalactocentric(c.lDeg, c.bDeg, c.distLoKpc, R0Kpc);
        const b = toGalactocentric(c.lDeg, c.bDeg, c.distHiKpc, R0Kpc);
        return [{ id: c.id, x1: a.xKpc, y1: a.yKpc, x2: b.xKpc, y2: b.yKpc, used: c.used }];
      }),
    [complexes, R0Kpc],
  );
  const used = useMemo(() => new Map(complexes.map((c) => [c.id, c.used])), [complexes]);
  const width = size;
  const height = size;
  const domain = useMemo<Domain>(() => {
    let ext = Math.max(R0Kpc, corotationKpc ?? 0) + 1;
    for (const l of lines) for (const [x, y] of l.xy) ext = Math.max(ext, Math.hypot(x, y) + 0.5);
    // Complexes left out (far roots, tangent points) may lie far off; zooming out reaches them.
    for (const c of complexes)
      if (c.used && c.xKpc !== null && c.yKpc !== null)
        ext = Math.max(ext, Math.hypot(c.xKpc, c.yKpc) + 0.5);
    ext = Math.min(Math.ceil(ext), 30);
    const w = width - MARGIN.left - MARGIN.right;
    const h = height - MARGIN.top - MARGIN.bottom;
    // Equal kpc per pixel on both axes.
    const half = (ext * h) / w;
    return { x0: -ext, x1: ext, y0: -half, y1: half };
  }, [lines, complexes, R0Kpc, corotationKpc, width, height]);
  const targets = useMemo<HoverTarget[]>(() => {
    const t: HoverTarget[] = [
      { x: R0Kpc, y: 0, text: `Sun, at (${fmt(R0Kpc, 2)}, 0) kpc` },
      { x: 0, y: 0, text: 'Galactic centre' },
    ];
    for (const c of complexes) {
      if (c.xKpc === null || c.yKpc === null) continue;
      t.push({ x: c.xKpc, y: c.yKpc, text: describeComplex(c) });
    }
    for (const s of sources) {
      t.push({
        x: s.xKpc,
        y: s.yKpc,
        text: `${tracerStyle(s.kind).label} member of complex ${s.complexId} at (${fmt(s.xKpc, 2)}, ${fmt(s.yKpc, 2)}) kpc; offset from the ridge ${s.perpOffsetKpc === null ? '—' : `${fmt(s.perpOffsetKpc, 3)} kpc`}`,
      });
    }
    return t;
  }, [complexes, sources, R0Kpc]);
  const kinds = TRACER_KINDS.filter((k) => sources.some((s) => s.kind === k));

  return (
    <ZoomFigure
      title={title}
      fileStem={fileStem}
      width={width}
      height={height}
      margin={MARGIN}
      domain={domain}
      xLabel="x (kpc)"
      yLabel="y (kpc)"
      targets={targets}
      testId={testId}
      caption={
        <>
          Seen from the north Galactic pole: Galactic centre at the origin, the Sun on the +x axis
          at R0 = {fmt(R0Kpc, 2)} kpc, longitude l = 90° toward −y, rotation clockwise (Reid et al.
          2014 frame).{' '}
          {corotationKpc !== null
            ? `Dashed circle: corotation at R = ${fmt(corotationKpc, 2)} kpc (${corotationSource ?? 'stated'} pattern speed).`
            : 'No corotation circle: no pattern speed, or none with a corotation radius.'}{' '}
          Dotted circle: the solar circle.
          {segments.length > 0 &&
            ' Grey segments: each complex’s distance interval along its line of sight.'}
        </>
      }
      overlay={() => (
        <MapLegend
          x={MARGIN.left + 8}
          y={MARGIN.top + 8}
          width={118}
          kinds={kinds}
          kindWords={(k) => tracerStyle(k).label}
          rows={[
            { key: 'sun', glyph: <SunGlyph x={0} y={-3} />, words: 'Sun' },
            { key: 'centre', glyph: <CentreGlyph x={0} y={-3} />, words: 'Galactic centre' },
          ]}
        />
      )}
    >
      {({ px, py, unitPx }) => (
        <>
          <circle
            cx={px(0)}
            cy={py(0)}
            r={R0Kpc * unitPx}
            fill="none"
            stroke={PLOT_COLOURS.rule}
            strokeDasharray="1 3"
          />
          {corotationKpc !== null && (
            <circle
              cx={px(0)}
              cy={py(0)}
              r={corotationKpc * unitPx}
              fill="none"
              stroke={PLOT_COLOURS.inkSoft}
              strokeDasharray="6 4"
              data-testid="corotation-circle"
            />
          )}
          {lines.map((l) => (
            <g key={l.name}>
              <polyline
                points={l.xy.map(([x, y]) => `${px(x).toFixed(1)},${py(y).toFixed(1)}`).join(' ')}
                fill="none"
                stroke={PLOT_COLOURS.accent}
                strokeWidth={2}
                strokeOpacity={0.75}
              />
              <text x={px(l.end[0]) + 4} y={py(l.end[1])} fill={PLOT_COLOURS.accent} fontSize={10}>
                {l.name}
              </text>
            </g>
          ))}
          {segments.map((s) => (
            <line
              key={`seg${s.id}`}
              x1={px(s.x1)}
              y1={py(s.y1)}
              x2={px(s.x2)}
              y2={py(s.y2)}
              stroke={PLOT_COLOURS.inkSoft}
              strokeOpacity={s.used ? 0.45 : 0.2}
              strokeWidth={0.8}
            />
          ))}
          {sources.map((s, i) => {
            const t = tracerStyle(s.kind);
            return (
              <path
                key={i}
                d={markerPath(t.shape, px(s.xKpc), py(s.yKpc), 3.2)}
                fill={t.colour}
                fillOpacity={used.get(s.complexId) === false ? 0.25 : 0.85}
              />
            );
          })}
          <CentreGlyph x={px(0)} y={py(0)} />
          <SunGlyph x={px(R0Kpc)} y={py(0)} />
        </>
      )}
    </ZoomFigure>
  );
}

function SunGlyph({ x, y }: { x: number; y: number }) {
  return (
    <g>
      <circle
        cx={x}
        cy={y}
        r={5}
        fill={PLOT_COLOURS.background}
        stroke={PLOT_COLOURS.ink}
        strokeWidth={1.3}
      />
      <circle cx={x} cy={y} r={1.4} fill={PLOT_COLOURS.ink} />
    </g>
  );
}

function CentreGlyph({ x, y }: { x: number; y: number }) {
  return (
    <g stroke={PLOT_COLOURS.ink} strokeWidth={1.5}>
      <line x1={x - 5} x2={x + 5} y1={y} y2={y} />
      <line x1={x} x2={x} y1={y - 5} y2={y + 5} />
    </g>
  );
}

/** The hover readout of one complex: where it is, which distance and why, its arm and offset. */
export function describeComplex(c: ResultComplex): string {
  const parts = [
    `Complex ${c.id}: l ${axisNumber(c.lDeg, 2)}°, b ${axisNumber(c.bDeg, 2)}°, v ${c.vLsrKms === null ? '—' : `${fmt(c.vLsrKms, 1)} km/s`}`,
    `d ${fmt(c.distKpc, 2)} kpc (${CHOICE_WORDS[c.choice] ?? c.choice}${c.distLoKpc !== null && c.distHiKpc !== null ? `; 68 % ${fmt(c.distLoKpc, 2)}–${fmt(c.distHiKpc, 2)}` : ''}${c.distCi95 ? `; 95 % ${fmt(c.distCi95[0], 2)}–${fmt(c.distCi95[1], 2)}` : ''}${c.pNear !== null ? `; P(near) ${fmt(c.pNear, 2)}` : ''})`,
  ];
  if (c.arm)
    parts.push(
      `${c.arm}, ${fmt(c.perpOffsetKpc, 3)} kpc from the ridge${c.perpCi95 ? ` (95 % ${fmt(c.perpCi95[0], 3)} to ${fmt(c.perpCi95[1], 3)})` : ''}, ahead +`,
    );
  parts.push(
    c.used
      ? 'used'
      : `left out: ${c.excludedBecause ? exclusionWords(c.excludedBecause) : 'no reason recorded'}`,
  );
  return parts.join(' · ');
}
