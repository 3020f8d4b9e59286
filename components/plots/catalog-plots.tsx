'use client';

import { useParams } from 'next/navigation';
import { useCallback, useMemo } from 'react';
import { tracerStyle } from '@/lib/tracers';
import { ScatterCanvas, type AxisSpec } from './scatter-canvas';

/** Longitude wrapped into [0°, 360°) for ticks and readout. */
const wrap360 = (lDeg: number) => ((lDeg % 360) + 360) % 360;

const L_AXIS: AxisSpec = { symbol: 'l', label: 'Galactic longitude l', unit: '°', reversed: true };
const L_AXIS_WRAPPED: AxisSpec = { ...L_AXIS, toDisplay: wrap360 };
const B_AXIS: AxisSpec = { symbol: 'b', label: 'Galactic latitude b', unit: '°' };

/**
 * Galactic longitudes (degrees, [0, 360)) of interleaved (l, b, v) Float32 triples as a flat
 * array for plotting. When the points straddle l = 0° (a catalog of the inner Galaxy from
 * l = 340° to 20°, say), longitudes above 180° are shifted by −360° so the plot is one
 * contiguous strip; the returned axis then prints ticks wrapped back into [0°, 360°).
 */
export function plottedLongitudes(points: Float32Array): { lDeg: Float32Array; axis: AxisSpec } {
  const n = Math.floor(points.length / 3);
  let lo = Infinity;
  let hi = -Infinity;
  let loWrapped = Infinity;
  let hiWrapped = -Infinity;
  for (let i = 0; i < n; i++) {
    const l = points[3 * i];
    if (l !== l) continue;
    const lw = l > 180 ? l - 360 : l;
    if (l < lo) lo = l;
    if (l > hi) hi = l;
    if (lw < loWrapped) loWrapped = lw;
    if (lw > hiWrapped) hiWrapped = lw;
  }
  const wrapped = hiWrapped - loWrapped < hi - lo;
  const lDeg = new Float32Array(n);
  for (let i = 0; i < n; i++) {
    const l = points[3 * i];
    lDeg[i] = wrapped && l > 180 ? l - 360 : l;
  }
  return { lDeg, axis: wrapped ? L_AXIS_WRAPPED : L_AXIS };
}

/** Every `offset`-th value of interleaved (l, b, v) triples: 1 for b, 2 for v. */
export function column(points: Float32Array, offset: 1 | 2): Float32Array {
  const n = Math.floor(points.length / 3);
  const out = new Float32Array(n);
  for (let i = 0; i < n; i++) out[i] = points[3 * i + offset];
  return out;
}

const V_AXIS: AxisSpec = { symbol: 'v', label: 'LSR velocity v', unit: 'km/s' };

/**
 * A catalog's two plots from the interleaved (l, b, v) triples of the `/points` endpoint: the
 * sky in Galactic coordinates (l growing to the left, as the Milky Way is drawn; b upwards) and
 * the longitude–velocity diagram (v_LSR, radio convention; rows without a velocity are left
 * out). The plotted longitudes are computed once for both.
 */
export function CatalogPlots({
  points,
  kind,
  name,
}: {
  points: Float32Array;
  kind: string;
  name: string;
}) {
  const { lDeg, axis } = useMemo(() => plottedLongitudes(points), [points]);
  const bDeg = useMemo(() => column(points, 1), [points]);
  const vKms = useMemo(() => column(points, 2), [points]);
  const t = tracerStyle(kind);
  const { catalogId } = useParams<{ catalogId?: string }>();
  // Point i is row i + 1 of the catalog: the points file is written in row order on ingest.
  const describe = useCallback(
    (i: number) => {
      const v = points[3 * i + 2];
      return `${name} · row ${i + 1} · l = ${points[3 * i].toFixed(4)}°, b = ${points[3 * i + 1].toFixed(4)}°, v = ${v === v ? `${v.toFixed(2)} km/s` : '—'}`;
    },
    [points, name],
  );
  const lookUp = useCallback(
    async (i: number) => {
      if (!catalogId) return describe(i);
      const res = await fetch(
        `/api/catalogs/${catalogId}/rows?sort=row&dir=asc&pageSize=1&page=${i + 1}`,
      );
      if (!res.ok) return describe(i);
      const { rows } = (await res.json()) as { rows: { name?: string | null }[] };
      const rowName = rows[0]?.name;
      return rowName ? `${rowName} — ${describe(i)}` : describe(i);
    },
    [catalogId, describe],
  );
  const plots = [
    {
      ys: bDeg,
      y: B_AXIS,
      title: `Sky plot of ${name}`,
      stem: 'sky',
      aspect: 0.4,
      testId: 'sky-plot',
    },
    {
      ys: vKms,
      y: V_AXIS,
      title: `Longitude–velocity diagram of ${name}`,
      stem: 'lv',
      aspect: 0.5,
      testId: 'lv-plot',
    },
  ];
  return (
    <div className="space-y-6">
      {plots.map((p) => (
        <ScatterCanvas
          key={p.testId}
          xs={lDeg}
          ys={p.ys}
          x={axis}
          y={p.y}
          colour={t.colour}
          shape={t.shape}
          legend={`${name} (${t.label})`}
          title={p.title}
          fileStem={`${name}-${p.stem}`}
          aspect={p.aspect}
          testId={p.testId}
          describe={describe}
          lookUp={lookUp}
        />
      ))}
    </div>
  );
}
