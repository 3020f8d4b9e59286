'use client';

import { useMutation } from '@tanstack/react-query';
import { useState } from 'react';
import { formatSexagesimal } from '@/lib/astro/coordinates';
import { api } from '@/lib/api-client';
import { readPastedRows, type CoordinateFrame, type PastedRow } from '@/lib/calculators';
import { Button } from '@/components/ui/button';
import { SelectField } from '@/components/ui/field';
import { ErrorNote } from '@/components/ui/panel';
import {
  CsvActions,
  calculationError,
  PasteArea,
  ResultsTable,
  toCsv,
  type Column,
} from './calculator-results';

type Converted = { from: CoordinateFrame; rows: PastedRow[]; points: Array<[number, number]> };

const EXAMPLES: Record<CoordinateFrame, string> = {
  equatorial: '# RA Dec (degrees or sexagesimal)\n266.40499 -28.93617\n18:03:40.2 -24:22:43\n',
  galactic: '# l b (degrees)\n30.0 0.0\n111.5 -0.75\n',
};

const deg = (x: number) => x.toFixed(6);

/** Pasted positions → converted positions in a table, with CSV copy and download. */
export function ConvertCalculator() {
  const [from, setFrom] = useState<CoordinateFrame>('equatorial');
  const [text, setText] = useState('');
  const [error, setError] = useState<string | null>(null);
  const convert = useMutation({
    mutationFn: async (): Promise<Converted> => {
      const rows = readPastedRows(text, 2);
      if (rows.length === 0) throw new Error('Paste at least one position, one per line.');
      const { points } = await api<{ points: Array<[number, number]> }>('/api/tools/convert', {
        method: 'POST',
        json: { from, points: rows.map((r) => r.values) },
      });
      return { from, rows, points };
    },
    onMutate: () => setError(null),
    onError: (e) => setError(calculationError(e, () => readPastedRows(text, 2))),
  });
  const result = convert.data;
  return (
    <div className="space-y-4">
      <form
        className="space-y-3"
        onSubmit={(e) => {
          e.preventDefault();
          convert.mutate();
        }}
      >
        <div className="max-w-sm">
          <SelectField
            label="Input frame"
            name="convertFrom"
            value={from}
            onChange={(e) => setFrom(e.target.value as CoordinateFrame)}
          >
            <option value="equatorial">Equatorial J2000 / ICRS (RA, Dec) → Galactic</option>
            <option value="galactic">Galactic (l, b) → equatorial J2000 / ICRS</option>
          </SelectField>
        </div>
        <PasteArea
          label="Positions"
          name="convertPositions"
          rows={6}
          placeholder={EXAMPLES[from]}
          value={text}
          onChange={(e) => setText(e.target.value)}
          hint={
            from === 'equatorial'
              ? 'One position per line: RA and Dec in degrees, or sexagesimal (18:03:40.2 -24:22:43, 18h03m40.2s -24d22m43s, 18 03 40.2 -24 22 43). Separate by spaces, tabs or commas; lines starting with # are skipped. Up to 100 000 lines.'
              : 'One position per line: l and b in degrees, separated by spaces, tabs or commas; lines starting with # are skipped. Up to 100 000 lines.'
          }
        />
        <div className="flex items-center gap-3">
          <Button type="submit" disabled={convert.isPending}>
            {convert.isPending ? 'Converting…' : 'Convert'}
          </Button>
          <Button type="button" variant="quiet" onClick={() => setText(EXAMPLES[from])}>
            Fill an example
          </Button>
        </div>
        <ErrorNote>{error && <span className="whitespace-pre-line">{error}</span>}</ErrorNote>
      </form>
      {result && <ConvertResults result={result} />}
    </div>
  );
}

function ConvertResults({ result }: { result: Converted }) {
  const { from, rows, points } = result;
  const toGalactic = from === 'equatorial';
  const columns: Column[] = toGalactic
    ? [
        { label: 'Line', numeric: true },
        { label: 'RA (as given)', numeric: true },
        { label: 'Dec (as given)', numeric: true },
        { label: 'l (deg)', numeric: true },
        { label: 'b (deg)', numeric: true },
      ]
    : [
        { label: 'Line', numeric: true },
        { label: 'l (as given, deg)', numeric: true },
        { label: 'b (as given, deg)', numeric: true },
        { label: 'RA (deg)', numeric: true },
        { label: 'Dec (deg)', numeric: true },
        { label: 'RA (h:m:s)', numeric: true },
        { label: 'Dec (d:m:s)', numeric: true },
      ];
  const cells = (i: number): Array<string | number> => {
    const [lon, lat] = points[i];
    const given = [rows[i].line, rows[i].values[0], rows[i].values[1]];
    return toGalactic
      ? [...given, deg(lon), deg(lat)]
      : [
          ...given,
          deg(lon),
          deg(lat),
          formatSexagesimal(lon, { hours: true, secondsDecimals: 3 }),
          formatSexagesimal(lat, { secondsDecimals: 2 }),
        ];
  };
  const all = points.map((_, i) => cells(i));
  const header = toGalactic
    ? ['line', 'ra_input', 'dec_input', 'l_deg', 'b_deg']
    : ['line', 'l_input_deg', 'b_input_deg', 'ra_deg', 'dec_deg', 'ra_hms', 'dec_dms'];
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <p className="text-sm text-ink-soft">
          {points.length} position{points.length === 1 ? '' : 's'} converted
          {toGalactic ? ' to Galactic (IAU 1958, J2000 pole).' : ' to J2000 / ICRS.'}
        </p>
        <CsvActions
          csv={toCsv(header, all)}
          filename={toGalactic ? 'positions-galactic.csv' : 'positions-equatorial.csv'}
        />
      </div>
      <ResultsTable caption="Converted positions" columns={columns} rows={all} />
    </div>
  );
}
