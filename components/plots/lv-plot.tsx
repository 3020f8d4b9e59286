'use client';

import { useMemo } from 'react';
import { tracerStyle } from '@/lib/tracers';
import { ScatterCanvas, type AxisSpec } from './scatter-canvas';
import { column, plottedLongitudes } from './sky-plot';

const V_AXIS: AxisSpec = { symbol: 'v', label: 'LSR velocity v', unit: 'km/s' };

/**
 * The longitude–velocity diagram of a catalog: l (growing to the left) against v_LSR (radio
 * convention, km/s). Rows without a velocity are left out. `points` are the interleaved
 * (l, b, v) triples of the `/points` endpoint.
 */
export function LvPlot({
  points,
  kind,
  name,
}: {
  points: Float32Array;
  kind: string;
  name: string;
}) {
  const { lDeg, axis } = useMemo(() => plottedLongitudes(points), [points]);
  const vKms = useMemo(() => column(points, 2), [points]);
  const t = tracerStyle(kind);
  return (
    <ScatterCanvas
      xs={lDeg}
      ys={vKms}
      x={axis}
      y={V_AXIS}
      colour={t.colour}
      shape={t.shape}
      legend={`${name} (${t.label})`}
      title={`Longitude–velocity diagram of ${name}`}
      fileStem={`${name}-lv`}
      aspect={0.5}
      testId="lv-plot"
    />
  );
}
