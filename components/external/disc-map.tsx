'use client';

import { useMemo } from 'react';
import { MapLegend } from '@/components/plots/map-legend';
import { PLOT_COLOURS } from '@/components/plots/figure';
import { fmt } from '@/components/link-runs/format';
import { ZoomFigure, type Domain, type HoverTarget } from '@/components/ordering/zoom-figure';
import { ringEdgesKpc } from '@/lib/external/ring-offsets';
import type { LogSpiralArms, RingSpec } from '@/lib/external/types';
import { markerPath, tracerStyle, TRACER_KINDS } from '@/lib/tracers';
import { armRidgesXY, roleOfKind } from './figure-model';
import type { ExternalResultJson } from './types';

const ROLE_WORDS = { gas: 'gas', young: 'young stars', other: 'not measured' } as const;

const SIZE = 620;
const MARGIN = { left: 58, right: 14, top: 14, bottom: 44 };

export const DISC_MAP_TITLE = 'Deprojected face-on map of the disc';

/**
 * The sources deprojected into the galaxy's disc (x along the receding major axis, azimuth
 * counterclockwise in the sense of rotation, kpc), each tracer kind by its colour and shape
 * (`lib/tracers`; kinds neither gas nor young stars faint), the
 * ring edges of the analysis, and the arm ridges it used (fitted or entered) over the rings.
 */
export function DiscMap({
  result,
  rings,
  fileStem,
}: {
  result: ExternalResultJson;
  rings: RingSpec;
  fileStem: string;
}) {
  const { gasKinds, youngKinds } = result.input;
  const points = useMemo(() => {
    const { RKpc, phiDeg, kind } = result.sources;
    return RKpc.map((r, i) => ({
      x: r * Math.cos((phiDeg[i] * Math.PI) / 180),
      y: r * Math.sin((phiDeg[i] * Math.PI) / 180),
      R: r,
      phiDeg: phiDeg[i],
      kind: kind[i],
      role: roleOfKind(kind[i], gasKinds, youngKinds),
    }));
  }, [result.sources, gasKinds, youngKinds]);
  const kinds = TRACER_KINDS.filter((k) => result.sources.kind.includes(k));
  const arms: LogSpiralArms | null = result.armModel;
  const ridges = useMemo(
    () => (arms ? armRidgesXY(arms, rings.minKpc, rings.maxKpc) : []),
    [arms, rings],
  );
  const edges = useMemo(() => Array.from(ringEdgesKpc(rings)), [rings]);
  const domain = useMemo<Domain>(() => {
    const ext = Math.ceil(rings.maxKpc * 1.1);
    const w = SIZE - MARGIN.left - MARGIN.right;
    const h = SIZE - MARGIN.top - MARGIN.bottom;
    // Equal kpc per pixel on both axes.
    return { x0: -ext, x1: ext, y0: (-ext * h) / w, y1: (ext * h) / w };
  }, [rings.maxKpc]);
  const targets = useMemo<HoverTarget[]>(
    () =>
      points.map((p) => ({
        x: p.x,
        y: p.y,
        text: `${tracerStyle(p.kind).label} (${ROLE_WORDS[p.role]}) at R ${fmt(p.R, 2)} kpc, φ ${fmt(p.phiDeg, 1)}°`,
      })),
    [points],
  );

  return (
    <ZoomFigure
      title={DISC_MAP_TITLE}
      fileStem={`${fileStem}-disc`}
      width={SIZE}
      height={SIZE}
      margin={MARGIN}
      domain={domain}
      xLabel="x along the receding major axis (kpc)"
      yLabel="y in the disc (kpc)"
      targets={targets}
      testId="external-disc-map"
      caption={
        <>
          The sources deprojected into the disc: x along the receding major axis, azimuth φ
          counterclockwise in the sense of rotation ({result.rotation} on the sky
          {result.rotationInference ? ', inferred from trailing arms' : ''}). Thin circles: the ring
          edges of the analysis.{' '}
          {arms
            ? `Lines: the ${arms.m} log-spiral arm ridges (pitch ${fmt(arms.pitchDeg, 1)}°, ${result.armsFit ? 'fitted to the positions' : 'entered'}).`
            : 'No arm ridges: too few sources to fit them.'}
        </>
      }
      overlay={() => (
        <MapLegend
          x={MARGIN.left + 8}
          y={MARGIN.top + 8}
          width={150}
          kinds={kinds}
          kindWords={(k) =>
            `${tracerStyle(k).label} (${ROLE_WORDS[roleOfKind(k, gasKinds, youngKinds)]})`
          }
          rows={[]}
        />
      )}
    >
      {({ px, py, unitPx }) => (
        <>
          {edges.map((r) => (
            <circle
              key={r}
              cx={px(0)}
              cy={py(0)}
              r={r * unitPx}
              fill="none"
              stroke={PLOT_COLOURS.rule}
              strokeWidth={0.7}
              data-testid="disc-ring"
            />
          ))}
          {points.map((p, i) => {
            const t = tracerStyle(p.kind);
            return (
              <path
                key={i}
                d={markerPath(t.shape, px(p.x), py(p.y), 2.6)}
                fill={t.colour}
                fillOpacity={p.role === 'other' ? 0.3 : 0.8}
              />
            );
          })}
          {ridges.map((xy, k) => (
            <polyline
              key={k}
              points={xy.map(([x, y]) => `${px(x).toFixed(1)},${py(y).toFixed(1)}`).join(' ')}
              fill="none"
              stroke={PLOT_COLOURS.accent}
              strokeWidth={2}
              strokeOpacity={0.85}
              data-testid="disc-arm"
            />
          ))}
          <g stroke={PLOT_COLOURS.ink} strokeWidth={1.5}>
            <line x1={px(0) - 5} x2={px(0) + 5} y1={py(0)} y2={py(0)} />
            <line x1={px(0)} x2={px(0)} y1={py(0) - 5} y2={py(0) + 5} />
          </g>
        </>
      )}
    </ZoomFigure>
  );
}
