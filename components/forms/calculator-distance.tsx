'use client';

import { useMutation } from '@tanstack/react-query';
import { useState } from 'react';
import type { KinematicFlag } from '@/lib/astro/kinematic-distance';
import { api } from '@/lib/api-client';
import {
  KINEMATIC_FLAG_TEXT,
  readPastedRows,
  type IntervalMethod,
  type KinematicDistanceRow,
  type KpcInterval,
  type ToolCurveName,
  type ToolCurvePreset,
  type ToolCurveUsed,
} from '@/lib/calculators';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { ErrorNote } from '@/components/ui/panel';
import { VelocityDistancePlot } from '@/components/plots/velocity-distance-plot';
import {
  CsvActions,
  calculationError,
  PasteArea,
  ResultsTable,
  toCsv,
  type Column,
} from './calculator-results';

type Source = { line: number; l: number; b: number; v: number; vErr?: number };
type Response = {
  curve: ToolCurveUsed;
  intervals: IntervalMethod;
  results: KinematicDistanceRow[];
};
type Computed = Response & { sources: Source[] };

const EXAMPLE =
  '# l (deg)  b (deg)  v_LSR (km/s)  [σ_v (km/s)]\n30.0 0.0 50.0\n24.6 -0.15 112.0 3\n49.2 0.3 8.5\n135.8 1.2 -42.0\n';

const FLAG_SHORT: Record<KinematicFlag, string> = {
  'beyond-terminal': 'beyond terminal velocity',
  'near-tangent': 'close to the tangent point',
  'unreliable-longitude': 'unreliable longitude',
  'outer-galaxy': 'outer Galaxy: single root',
  'no-solution': 'no distance',
};

const COLUMNS: Column[] = [
  { label: 'Line', numeric: true },
  { label: 'l (deg)', numeric: true },
  { label: 'b (deg)', numeric: true },
  { label: 'v_LSR (km/s)', numeric: true },
  { label: 'R (kpc)', numeric: true },
  { label: 'near (kpc)', numeric: true },
  { label: 'near 68 % (kpc)', numeric: true },
  { label: 'far (kpc)', numeric: true },
  { label: 'far 68 % (kpc)', numeric: true },
  { label: 'single (kpc)', numeric: true },
  { label: 'single 68 % (kpc)', numeric: true },
  { label: 'tangent (kpc)', numeric: true },
  { label: 'Notes' },
];

const kpc = (x: number | null) => (x === null ? '—' : x.toFixed(3));
const range = (r: KpcInterval | null | undefined) =>
  r ? `${r[0].toFixed(2)}–${r[1].toFixed(2)}` : '—';

const NAMES = ['l', 'b', 'v', 'σ_v'];

/** Why a pasted row's values cannot be read, or null: every value a number, σ_v positive. */
function refuseValues(values: string[]): string | null {
  const bad = values.findIndex((s) => s === '' || !Number.isFinite(Number(s)));
  if (bad >= 0) return `${NAMES[bad]} "${values[bad]}" is not a number`;
  if (values[3] !== undefined && !(Number(values[3]) > 0))
    return `σ_v "${values[3]}" must be a positive number`;
  return null;
}

function readSources(text: string): Source[] {
  return readPastedRows(text, 3, 4, refuseValues).map(({ line, values }) => {
    const [l, b, v, vErr] = values.map(Number);
    return { line, l, b, v, vErr };
  });
}

/**
 * Pasted (l, b, v_LSR) rows → kinematic distances on a chosen rotation curve, with flags in
 * words, CSV copy and download, and the velocity–distance plot of the selected row.
 */
export function DistanceCalculator({ presets }: { presets: ToolCurvePreset[] }) {
  const [curveName, setCurveName] = useState<ToolCurveName>(presets[0].name);
  const preset = presets.find((p) => p.name === curveName) ?? presets[0];
  const [R0, setR0] = useState(String(preset.R0Kpc));
  const [theta0, setTheta0] = useState(String(preset.theta0Kms));
  const [text, setText] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [selected, setSelected] = useState(0);
  const compute = useMutation({
    mutationFn: async (): Promise<Computed> => {
      const sources = readSources(text);
      if (sources.length === 0) throw new Error('Paste at least one l b v row.');
      const constants = [
        ['R0', R0],
        ['Θ0', theta0],
      ].map(([name, s]) => {
        const n = Number(s);
        if (s.trim() === '' || !(n > 0))
          throw new RangeError(`${name} "${s}" must be a positive number.`);
        return n;
      });
      const body = await api<Response>('/api/tools/kinematic-distance', {
        method: 'POST',
        json: {
          curve: curveName,
          R0: constants[0],
          theta0: constants[1],
          sources: sources.map(({ l, b, v, vErr }) => ({ l, b, v, vErr })),
        },
      });
      return { sources, ...body };
    },
    onMutate: () => setError(null),
    onSuccess: () => setSelected(0),
    onError: (e) => setError(calculationError(e, () => readSources(text))),
  });
  const result = compute.data;

  return (
    <div className="space-y-4">
      <form
        className="space-y-3"
        onSubmit={(e) => {
          e.preventDefault();
          compute.mutate();
        }}
      >
        <div className="grid gap-3 sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)_minmax(0,1fr)]">
          <SelectField
            label="Rotation curve"
            name="curve"
            value={curveName}
            onChange={(e) => {
              const next = presets.find((p) => p.name === e.target.value) ?? presets[0];
              setCurveName(next.name);
              setR0(String(next.R0Kpc));
              setTheta0(String(next.theta0Kms));
            }}
          >
            {presets.map((p) => (
              <option key={p.name} value={p.name}>
                {p.label}
              </option>
            ))}
          </SelectField>
          <TextField
            label="R0 (kpc)"
            name="R0"
            inputMode="decimal"
            value={R0}
            onChange={(e) => setR0(e.target.value)}
          />
          <TextField
            label="Θ0 (km/s)"
            name="theta0"
            inputMode="decimal"
            value={theta0}
            onChange={(e) => setTheta0(e.target.value)}
          />
        </div>
        <p className="text-xs text-ink-soft">Source: {preset.source}.</p>
        <PasteArea
          label="Sources (l, b, v_LSR, optional σ_v)"
          name="distanceSources"
          rows={6}
          placeholder={EXAMPLE}
          value={text}
          onChange={(e) => setText(e.target.value)}
          hint="One source per line: Galactic l and b in degrees, v_LSR in km/s and optionally its 1σ uncertainty σ_v in km/s (measurement and streaming together; 7 km/s of streaming when left out), separated by spaces, tabs or commas; lines starting with # are skipped. Up to 100 000 lines; the first 10 000 get 68 % intervals."
        />
        <div className="flex items-center gap-3">
          <Button type="submit" disabled={compute.isPending}>
            {compute.isPending ? 'Computing…' : 'Compute distances'}
          </Button>
          <Button type="button" variant="quiet" onClick={() => setText(EXAMPLE)}>
            Fill an example
          </Button>
        </div>
        <ErrorNote>{error && <span className="whitespace-pre-line">{error}</span>}</ErrorNote>
      </form>
      {result && (
        <DistanceResults
          result={result}
          selected={Math.min(selected, result.results.length - 1)}
          onSelect={setSelected}
        />
      )}
    </div>
  );
}

function DistanceResults({
  result,
  selected,
  onSelect,
}: {
  result: Computed;
  selected: number;
  onSelect: (i: number) => void;
}) {
  const { sources, results, curve, intervals } = result;
  const rows = results.map((r, i) => [
    sources[i].line,
    sources[i].l,
    sources[i].b,
    sources[i].v,
    kpc(r.R),
    kpc(r.near),
    range(r.intervals?.near),
    kpc(r.far),
    range(r.intervals?.far),
    kpc(r.single),
    range(r.intervals?.single),
    kpc(r.tangent),
    r.flags.length === 0 ? (
      <span className="text-ink-soft">two roots</span>
    ) : (
      <span title={r.flags.map((f) => KINEMATIC_FLAG_TEXT[f]).join(' ')}>
        {r.flags.map((f) => FLAG_SHORT[f]).join('; ')}
      </span>
    ),
  ]);
  const csv = toCsv(
    [
      'line',
      'l_deg',
      'b_deg',
      'v_lsr_kms',
      'v_err_kms',
      'R_kpc',
      'near_kpc',
      'near_lo_kpc',
      'near_hi_kpc',
      'far_kpc',
      'far_lo_kpc',
      'far_hi_kpc',
      'single_kpc',
      'single_lo_kpc',
      'single_hi_kpc',
      'tangent_kpc',
      'flags',
    ],
    results.map((r, i) => [
      sources[i].line,
      sources[i].l,
      sources[i].b,
      sources[i].v,
      sources[i].vErr ?? intervals.defaultVelocityErrKms,
      r.R,
      r.near,
      r.intervals?.near?.[0] ?? null,
      r.intervals?.near?.[1] ?? null,
      r.far,
      r.intervals?.far?.[0] ?? null,
      r.intervals?.far?.[1] ?? null,
      r.single,
      r.intervals?.single?.[0] ?? null,
      r.intervals?.single?.[1] ?? null,
      r.tangent,
      r.flags.join(';'),
    ]),
  );
  const usedFlags = [...new Set(results.flatMap((r) => r.flags))];
  const row = results[selected];
  const source = sources[selected];
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <p className="text-sm text-ink-soft">
          {results.length} source{results.length === 1 ? '' : 's'} on {curve.label} (R0 = {curve.R0}{' '}
          kpc, Θ0 = {curve.theta0} km/s). Distances are along the line of sight from the Sun; R is
          the Galactocentric radius; an outer-Galaxy source has its one root under single.{' '}
          {intervals.note} Click a row to plot it.
        </p>
        <CsvActions csv={csv} filename={`kinematic-distances_${curve.name}.csv`} />
      </div>
      <ResultsTable
        caption="Kinematic distances"
        columns={COLUMNS}
        rows={rows}
        selected={selected}
        onSelect={onSelect}
      />
      {usedFlags.length > 0 && (
        <dl className="space-y-1 rounded-md border border-rule bg-paper-deep/40 px-3 py-2 text-xs">
          {usedFlags.map((f) => (
            <div key={f} className="flex gap-2">
              <dt className="shrink-0 font-medium text-ink">{FLAG_SHORT[f]}:</dt>
              <dd className="text-ink-soft">{KINEMATIC_FLAG_TEXT[f]}</dd>
            </div>
          ))}
        </dl>
      )}
      {row && source && (
        <VelocityDistancePlot
          lDeg={source.l}
          bDeg={source.b}
          vKms={source.v}
          curve={curve}
          roots={{ near: row.near, far: row.far, single: row.single, tangent: row.tangent }}
        />
      )}
    </div>
  );
}
