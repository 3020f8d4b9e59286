'use client';

import { useMutation } from '@tanstack/react-query';
import { useState } from 'react';
import type { KinematicFlag } from '@/lib/astro/kinematic-distance';
import { api } from '@/lib/api-client';
import {
  KINEMATIC_FLAG_TEXT,
  readPastedRows,
  type KinematicDistanceRow,
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

type Source = { line: number; l: number; b: number; v: number };
type Computed = { sources: Source[]; curve: ToolCurveUsed; results: KinematicDistanceRow[] };

const EXAMPLE =
  '# l (deg)  b (deg)  v_LSR (km/s)\n30.0 0.0 50.0\n24.6 -0.15 112.0\n49.2 0.3 8.5\n135.8 1.2 -42.0\n';

const FLAG_SHORT: Record<KinematicFlag, string> = {
  'beyond-terminal': 'beyond terminal velocity',
  'near-tangent': 'close to the tangent point',
  'unreliable-longitude': 'unreliable longitude',
  'outer-galaxy': 'outer Galaxy: one root',
  'no-solution': 'no distance',
};

const COLUMNS: Column[] = [
  { label: 'Line', numeric: true },
  { label: 'l (deg)', numeric: true },
  { label: 'b (deg)', numeric: true },
  { label: 'v_LSR (km/s)', numeric: true },
  { label: 'R (kpc)', numeric: true },
  { label: 'near (kpc)', numeric: true },
  { label: 'far (kpc)', numeric: true },
  { label: 'tangent (kpc)', numeric: true },
  { label: 'Notes' },
];

const kpc = (x: number | null) => (x === null ? '—' : x.toFixed(3));

function readSources(text: string): Source[] {
  return readPastedRows(text, 3).map(({ line, values }) => {
    const [l, b, v] = values.map((s, j) => {
      const n = Number(s);
      if (s === '' || !Number.isFinite(n)) {
        throw new RangeError(`line ${line}: ${['l', 'b', 'v'][j]} "${s}" is not a number`);
      }
      return n;
    });
    return { line, l, b, v };
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
  const [theta0, setTheta0] = useState(preset.theta0Kms.toFixed(2));
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
      const body = await api<{ curve: ToolCurveUsed; results: KinematicDistanceRow[] }>(
        '/api/tools/kinematic-distance',
        {
          method: 'POST',
          json: {
            curve: curveName,
            R0: constants[0],
            // The preset's Θ(R0) is shown rounded; send it only when edited, so the curve stays exact.
            theta0: theta0 === preset.theta0Kms.toFixed(2) ? undefined : constants[1],
            sources: sources.map(({ l, b, v }) => ({ l, b, v })),
          },
        },
      );
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
              setTheta0(next.theta0Kms.toFixed(2));
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
            label="Θ0 = Θ(R0) (km/s)"
            name="theta0"
            inputMode="decimal"
            value={theta0}
            onChange={(e) => setTheta0(e.target.value)}
          />
        </div>
        <p className="text-xs text-ink-soft">Source: {preset.source}.</p>
        <PasteArea
          label="Sources (l, b, v_LSR)"
          name="distanceSources"
          rows={6}
          placeholder={EXAMPLE}
          value={text}
          onChange={(e) => setText(e.target.value)}
          hint="One source per line: Galactic l and b in degrees and v_LSR in km/s, separated by spaces, tabs or commas; lines starting with # are skipped. Up to 100 000 lines."
        />
        <div className="flex items-center gap-3">
          <Button type="submit" disabled={compute.isPending}>
            {compute.isPending ? 'Computing…' : 'Compute distances'}
          </Button>
          <Button type="button" variant="quiet" onClick={() => setText(EXAMPLE)}>
            Fill an example
          </Button>
        </div>
        <ErrorNote>{error}</ErrorNote>
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
  const { sources, results, curve } = result;
  const rows = results.map((r, i) => [
    sources[i].line,
    sources[i].l,
    sources[i].b,
    sources[i].v,
    kpc(r.R),
    kpc(r.near),
    kpc(r.far),
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
    ['line', 'l_deg', 'b_deg', 'v_lsr_kms', 'R_kpc', 'near_kpc', 'far_kpc', 'tangent_kpc', 'flags'],
    results.map((r, i) => [
      sources[i].line,
      sources[i].l,
      sources[i].b,
      sources[i].v,
      r.R,
      r.near,
      r.far,
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
          {results.length} source{results.length === 1 ? '' : 's'} on {curve.label} (R0 ={' '}
          {curve.R0.toFixed(2)} kpc, Θ0 = {curve.theta0.toFixed(2)} km/s). Distances are along the
          line of sight from the Sun; R is the Galactocentric radius. Click a row to plot it.
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
          roots={{ near: row.near, far: row.far, tangent: row.tangent }}
        />
      )}
    </div>
  );
}
