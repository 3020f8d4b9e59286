'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useEffect, useMemo, useState } from 'react';
import { api } from '@/lib/api-client';
import type { CatalogJson } from '@/components/tables/catalog-list';
import { LINK_MODE_WORDS, fmtCount, fmtSeconds } from '@/components/link-runs/format';
import { runsKey } from '@/components/link-runs/run-list';
import type {
  Estimate,
  LinkMode,
  MissingVelocity,
  Run,
  RunParams,
} from '@/components/link-runs/types';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { EmptyState, ErrorNote, Panel } from '@/components/ui/panel';
import { TracerBadge } from '@/components/ui/tracer-badge';

/** What the reader typed, kept as text so that half-typed numbers survive. */
type Draft = {
  name: string;
  catalogIds: string[];
  radiusMode: 'fixed' | 'scaled';
  radiusValue: string;
  radiusUnit: 'arcsec' | 'arcmin';
  radiusFactor: string;
  radiusMinArcsec: string;
  velocityMode: 'fixed' | 'scaled' | 'ignore';
  velocityKms: string;
  velocityFactor: string;
  linkMode: LinkMode;
  missingVelocity: MissingVelocity;
  chanceTrials: string;
  complexCap: string;
};

const DEFAULT_DRAFT: Draft = {
  name: '',
  catalogIds: [],
  radiusMode: 'fixed',
  radiusValue: '60',
  radiusUnit: 'arcsec',
  radiusFactor: '1',
  radiusMinArcsec: '5',
  velocityMode: 'fixed',
  velocityKms: '5',
  velocityFactor: '1',
  linkMode: 'all',
  missingVelocity: 'exclude',
  chanceTrials: '0',
  complexCap: '500',
};

/** Limits the server enforces: catalogs per run, and the widest match radius (10°). */
const MAX_CATALOGS = 8;
const MAX_RADIUS_ARCSEC = 36_000;

/** Milliseconds the form waits after the last change before it asks for a new estimate. */
const ESTIMATE_DEBOUNCE_MS = 400;

/** The draft of an earlier run's parameters, keeping only catalogs that are still ready. */
function draftFrom(params: RunParams, readyIds: Set<string>): Draft {
  const r = params.radius;
  const v = params.velocity;
  return {
    ...DEFAULT_DRAFT,
    catalogIds: params.catalogIds.filter((id) => readyIds.has(id)),
    radiusMode: r.mode,
    radiusValue: r.mode === 'fixed' ? String(r.arcsec) : DEFAULT_DRAFT.radiusValue,
    radiusFactor: r.mode === 'scaled' ? String(r.factor) : DEFAULT_DRAFT.radiusFactor,
    radiusMinArcsec: r.mode === 'scaled' ? String(r.minArcsec) : DEFAULT_DRAFT.radiusMinArcsec,
    velocityMode: v.mode,
    velocityKms: v.mode === 'fixed' ? String(v.kms) : DEFAULT_DRAFT.velocityKms,
    velocityFactor: v.mode === 'scaled' ? String(v.factor) : DEFAULT_DRAFT.velocityFactor,
    linkMode: params.linkMode,
    missingVelocity: params.missingVelocity ?? 'exclude',
    chanceTrials: String(params.chanceTrials),
    complexCap: String(params.complexCap ?? 500),
  };
}

/** A finite number from a field, or a sentence naming the field and the offending text. */
function numberIn(
  text: string,
  field: string,
  test: (x: number) => boolean,
  rule: string,
): number | string {
  const x = Number(text.trim());
  if (text.trim() === '' || !Number.isFinite(x)) return `${field}: “${text}” is not a number.`;
  return test(x) ? x : `${field}: ${text} — ${rule}.`;
}

/** The request body of the draft, or every problem with it. */
function bodyOf(d: Draft): { body: RunParams } | { problems: string[] } {
  const problems: string[] = [];
  const take = (v: number | string) => {
    if (typeof v === 'string') {
      problems.push(v);
      return NaN;
    }
    return v;
  };
  if (d.catalogIds.length < 2) problems.push('Catalogs: choose at least two ready catalogs.');
  if (d.catalogIds.length > MAX_CATALOGS) {
    problems.push(`Catalogs: ${d.catalogIds.length} chosen; a run links at most ${MAX_CATALOGS}.`);
  }
  const within = (lo: number, hi: number) => (x: number) => x > lo && x <= hi;
  let radius: RunParams['radius'];
  if (d.radiusMode === 'fixed') {
    const perUnit = d.radiusUnit === 'arcmin' ? 60 : 1;
    const value = take(
      numberIn(
        d.radiusValue,
        'Match radius',
        within(0, MAX_RADIUS_ARCSEC / perUnit),
        `must be above 0 and at most ${MAX_RADIUS_ARCSEC / perUnit} ${d.radiusUnit} (10°)`,
      ),
    );
    radius = { mode: 'fixed', arcsec: value * perUnit };
  } else {
    radius = {
      mode: 'scaled',
      factor: take(
        numberIn(d.radiusFactor, 'Size factor', within(0, 100), 'must be above 0 and at most 100'),
      ),
      minArcsec: take(
        numberIn(
          d.radiusMinArcsec,
          'Smallest radius',
          (x) => x >= 0 && x <= MAX_RADIUS_ARCSEC,
          `must be from 0 to ${MAX_RADIUS_ARCSEC}″`,
        ),
      ),
    };
  }
  let velocity: RunParams['velocity'];
  if (d.velocityMode === 'fixed') {
    velocity = {
      mode: 'fixed',
      kms: take(
        numberIn(
          d.velocityKms,
          'Velocity window',
          within(0, 1000),
          'must be above 0 and at most 1000 km/s',
        ),
      ),
    };
  } else if (d.velocityMode === 'scaled') {
    velocity = {
      mode: 'scaled',
      factor: take(
        numberIn(
          d.velocityFactor,
          'Line-width factor',
          within(0, 100),
          'must be above 0 and at most 100',
        ),
      ),
    };
  } else velocity = { mode: 'ignore' };
  const integer = (lo: number, hi: number) => (x: number) =>
    Number.isInteger(x) && x >= lo && x <= hi;
  const chanceTrials = take(
    numberIn(
      d.chanceTrials,
      'Chance-link repeats',
      integer(0, 10),
      'must be a whole number from 0 to 10',
    ),
  );
  const complexCap = take(
    numberIn(
      d.complexCap,
      'Complex size cap',
      integer(2, 100_000),
      'must be a whole number from 2 to 100 000',
    ),
  );
  if (problems.length) return { problems };
  const body: RunParams = {
    catalogIds: d.catalogIds,
    radius,
    velocity,
    linkMode: d.linkMode,
    chanceTrials,
    missingVelocity: d.missingVelocity,
    complexCap,
  };
  if (d.name.trim()) body.name = d.name.trim();
  return { body };
}

/** `value` once it has stopped changing for `ms` milliseconds. */
function useDebounced<T>(value: T, ms: number): T {
  const [settled, setSettled] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setSettled(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return settled;
}

function Choice({
  name,
  checked,
  onChange,
  label,
  explain,
}: {
  name: string;
  checked: boolean;
  onChange: () => void;
  label: string;
  explain?: string;
}) {
  return (
    <label className="flex items-start gap-2 text-sm">
      <input
        type="radio"
        name={name}
        checked={checked}
        onChange={onChange}
        className="mt-1 accent-accent"
      />
      <span>
        <span className="font-medium">{label}</span>
        {explain && <span className="text-ink-soft"> — {explain}</span>}
      </span>
    </label>
  );
}

function EstimateView({
  estimate,
  catalogs,
}: {
  estimate: Estimate;
  catalogs: Map<string, CatalogJson>;
}) {
  const name = (id: string) => catalogs.get(id)?.name ?? id;
  return (
    <div className="space-y-2 text-sm" data-testid="run-estimate">
      <p>
        <span className="num">{fmtCount(estimate.sources)}</span> sources;{' '}
        {estimate.chanceRepeats > 0
          ? `${estimate.chanceRepeats} shifted repeats for chance links; `
          : 'no chance-link repeats; '}
        about <strong>{fmtSeconds(estimate.roughSeconds)}</strong> of work (
        <span className="num">{fmtCount(Math.round(estimate.workUnits))}</span> work units).
      </p>
      <table className="w-full text-xs" aria-label="Estimated candidates per catalog pair">
        <thead className="text-left text-ink-soft">
          <tr>
            <th className="py-1 font-medium">Pair</th>
            <th className="py-1 text-right font-medium">sources A</th>
            <th className="py-1 text-right font-medium">sources B</th>
            <th className="py-1 text-right font-medium">expected candidates</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-rule/60">
          {estimate.pairs.map((p) => (
            <tr key={`${p.catalogA}-${p.catalogB}`}>
              <td className="py-1">
                {name(p.catalogA)} × {name(p.catalogB)}
              </td>
              <td className="num py-1">{fmtCount(p.nA)}</td>
              <td className="num py-1">{fmtCount(p.nB)}</td>
              <td className="num py-1">{fmtCount(Math.round(p.expectedCandidates))}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function FormBody({
  projectId,
  ready,
  initial,
  note,
}: {
  projectId: string;
  ready: CatalogJson[];
  initial: Draft;
  note: string | null;
}) {
  const router = useRouter();
  const qc = useQueryClient();
  const [d, setD] = useState<Draft>(initial);
  const set = (patch: Partial<Draft>) => setD((old) => ({ ...old, ...patch }));
  const [showProblems, setShowProblems] = useState(false);
  const checked = useMemo(() => bodyOf(d), [d]);
  const bodyText = 'body' in checked ? JSON.stringify(checked.body) : null;
  const settled = useDebounced(bodyText, ESTIMATE_DEBOUNCE_MS);
  const byId = useMemo(() => new Map(ready.map((c) => [c.id, c])), [ready]);

  const estimate = useQuery({
    queryKey: ['link-run-estimate', projectId, settled],
    queryFn: () =>
      api<{ estimate: Estimate }>(`/api/projects/${projectId}/link-runs/estimate`, {
        method: 'POST',
        json: JSON.parse(settled!),
      }),
    enabled: settled !== null,
    staleTime: 60_000,
  });
  const start = useMutation({
    mutationFn: (body: RunParams) =>
      api<{ run: Pick<Run, 'id' | 'status'> }>(`/api/projects/${projectId}/link-runs`, {
        method: 'POST',
        json: body,
      }),
    onSuccess: ({ run }) => {
      void qc.invalidateQueries({ queryKey: runsKey(projectId) });
      router.push(`/projects/${projectId}/link-runs/${run.id}`);
    },
  });

  const toggle = (id: string) =>
    set({
      catalogIds: d.catalogIds.includes(id)
        ? d.catalogIds.filter((x) => x !== id)
        : [...d.catalogIds, id],
    });
  const stale = bodyText !== settled || estimate.isFetching;

  return (
    <form
      className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_22rem]"
      onSubmit={(e) => {
        e.preventDefault();
        setShowProblems(true);
        if ('body' in checked) start.mutate(checked.body);
      }}
    >
      <div className="space-y-5">
        {note && (
          <p className="rounded-md border border-rule bg-paper-deep/60 px-3 py-2 text-sm">{note}</p>
        )}
        <Panel title="Catalogs">
          <fieldset>
            <legend className="mb-2 text-sm text-ink-soft">
              Choose two or more ready catalogs to link.
            </legend>
            <ul className="grid gap-1.5 sm:grid-cols-2">
              {ready.map((c) => (
                <li key={c.id}>
                  <label className="flex items-center gap-2 rounded-md border border-rule bg-white px-3 py-2 text-sm">
                    <input
                      type="checkbox"
                      className="accent-accent"
                      checked={d.catalogIds.includes(c.id)}
                      onChange={() => toggle(c.id)}
                    />
                    <span className="min-w-0 flex-1 truncate">{c.name}</span>
                    <TracerBadge kind={c.kind} />
                    <span className="num text-xs text-ink-soft">{fmtCount(c.rowCount)}</span>
                  </label>
                </li>
              ))}
            </ul>
          </fieldset>
        </Panel>

        <Panel title="Match radius">
          <fieldset className="space-y-3">
            <legend className="sr-only">Match radius</legend>
            <Choice
              name="radiusMode"
              label="Fixed radius"
              explain="one angular radius for every pair of sources."
              checked={d.radiusMode === 'fixed'}
              onChange={() => set({ radiusMode: 'fixed' })}
            />
            <Choice
              name="radiusMode"
              label="Scaled by source sizes"
              explain="the two sources’ radii times a factor, with position errors added in quadrature, never below a floor."
              checked={d.radiusMode === 'scaled'}
              onChange={() => set({ radiusMode: 'scaled' })}
            />
            {d.radiusMode === 'fixed' ? (
              <div className="flex items-end gap-2">
                <div className="w-40">
                  <TextField
                    label="Radius"
                    inputMode="decimal"
                    value={d.radiusValue}
                    onChange={(e) => set({ radiusValue: e.target.value })}
                  />
                </div>
                <div className="w-36">
                  <SelectField
                    label="Radius unit"
                    value={d.radiusUnit}
                    onChange={(e) => set({ radiusUnit: e.target.value as Draft['radiusUnit'] })}
                  >
                    <option value="arcsec">arcsec (″)</option>
                    <option value="arcmin">arcmin (′)</option>
                  </SelectField>
                </div>
              </div>
            ) : (
              <div className="flex items-end gap-2">
                <div className="w-40">
                  <TextField
                    label="Size factor"
                    inputMode="decimal"
                    value={d.radiusFactor}
                    onChange={(e) => set({ radiusFactor: e.target.value })}
                  />
                </div>
                <div className="w-40">
                  <TextField
                    label="Smallest radius (″)"
                    inputMode="decimal"
                    value={d.radiusMinArcsec}
                    onChange={(e) => set({ radiusMinArcsec: e.target.value })}
                  />
                </div>
              </div>
            )}
          </fieldset>
        </Panel>

        <Panel title="Velocity window">
          <fieldset className="space-y-3">
            <legend className="sr-only">Velocity window</legend>
            <Choice
              name="velocityMode"
              label="Fixed window"
              explain="link when the LSR velocities differ by at most this much."
              checked={d.velocityMode === 'fixed'}
              onChange={() => set({ velocityMode: 'fixed' })}
            />
            <Choice
              name="velocityMode"
              label="Scaled by line widths"
              explain="the two line widths combined in quadrature, times a factor."
              checked={d.velocityMode === 'scaled'}
              onChange={() => set({ velocityMode: 'scaled' })}
            />
            <Choice
              name="velocityMode"
              label="Ignore velocity"
              explain="link by sky position alone."
              checked={d.velocityMode === 'ignore'}
              onChange={() => set({ velocityMode: 'ignore' })}
            />
            {d.velocityMode === 'fixed' && (
              <div className="w-48">
                <TextField
                  label="Window (km/s)"
                  inputMode="decimal"
                  value={d.velocityKms}
                  onChange={(e) => set({ velocityKms: e.target.value })}
                />
              </div>
            )}
            {d.velocityMode === 'scaled' && (
              <div className="w-48">
                <TextField
                  label="Line-width factor"
                  inputMode="decimal"
                  value={d.velocityFactor}
                  onChange={(e) => set({ velocityFactor: e.target.value })}
                />
              </div>
            )}
            {d.velocityMode !== 'ignore' && (
              <div className="w-72">
                <SelectField
                  label="Sources without velocity"
                  value={d.missingVelocity}
                  onChange={(e) => set({ missingVelocity: e.target.value as MissingVelocity })}
                >
                  <option value="exclude">leave them out</option>
                  <option value="position-only">link them by position only</option>
                </SelectField>
              </div>
            )}
          </fieldset>
        </Panel>

        <Panel title="Links and complexes">
          <fieldset className="space-y-2">
            <legend className="mb-1 text-sm text-ink-soft">
              Which pairs within both tolerances become links
            </legend>
            {(Object.keys(LINK_MODE_WORDS) as LinkMode[]).map((m) => (
              <Choice
                key={m}
                name="linkMode"
                label={LINK_MODE_WORDS[m].label}
                explain={LINK_MODE_WORDS[m].explain}
                checked={d.linkMode === m}
                onChange={() => set({ linkMode: m })}
              />
            ))}
          </fieldset>
          <div className="mt-4 flex flex-wrap gap-4">
            <div className="w-56">
              <TextField
                label="Chance-link repeats"
                type="number"
                min={0}
                max={10}
                step={1}
                hint="Shifted-catalog repeats that estimate false links; 0 turns it off."
                value={d.chanceTrials}
                onChange={(e) => set({ chanceTrials: e.target.value })}
              />
            </div>
            <div className="w-56">
              <TextField
                label="Complex size cap"
                type="number"
                min={2}
                max={100000}
                step={1}
                hint="Complexes above this many members are flagged for a closer look."
                value={d.complexCap}
                onChange={(e) => set({ complexCap: e.target.value })}
              />
            </div>
            <div className="min-w-64 flex-1">
              <TextField
                label="Run name (optional)"
                placeholder="e.g. CO × HII, 60″, ±5 km/s"
                maxLength={200}
                value={d.name}
                onChange={(e) => set({ name: e.target.value })}
              />
            </div>
          </div>
        </Panel>
      </div>

      <div className="space-y-4 xl:sticky xl:top-6 xl:self-start">
        <Panel title="Work estimate">
          {'problems' in checked ? (
            <p className="text-sm text-ink-soft">
              The estimate appears once the parameters are complete.
            </p>
          ) : estimate.error ? (
            <ErrorNote>Could not estimate the work: {estimate.error.message}</ErrorNote>
          ) : estimate.data ? (
            <div className={stale ? 'opacity-60' : ''}>
              <EstimateView estimate={estimate.data.estimate} catalogs={byId} />
            </div>
          ) : (
            <p className="text-sm text-ink-soft">Estimating…</p>
          )}
        </Panel>
        {showProblems && 'problems' in checked && (
          <ErrorNote>
            <span className="block font-medium">Please correct:</span>
            {checked.problems.map((p) => (
              <span key={p} className="block">
                {p}
              </span>
            ))}
          </ErrorNote>
        )}
        <ErrorNote>{start.error && `The run was not started: ${start.error.message}`}</ErrorNote>
        <div className="flex items-center gap-3">
          <Button type="submit" disabled={start.isPending || start.isSuccess}>
            {start.isPending || start.isSuccess ? 'Starting…' : 'Start link run'}
          </Button>
          <Link
            href={`/projects/${projectId}/link-runs`}
            className="text-sm text-ink-soft hover:text-ink"
          >
            Cancel
          </Link>
        </div>
      </div>
    </form>
  );
}

/**
 * The form that starts a link run: catalogs, match radius, velocity window, link mode and
 * chance-link repeats, with a live work estimate. With `fromRunId` it starts from that run's
 * parameters, for a re-run with edits.
 */
export function LinkRunForm({
  projectId,
  fromRunId,
}: {
  projectId: string;
  fromRunId: string | null;
}) {
  const catalogs = useQuery({
    queryKey: ['catalogs', projectId],
    queryFn: () => api<{ catalogs: CatalogJson[] }>(`/api/projects/${projectId}/catalogs`),
  });
  const from = useQuery({
    queryKey: ['link-run', fromRunId],
    queryFn: () => api<{ run: Run }>(`/api/link-runs/${fromRunId}`),
    enabled: fromRunId !== null,
  });
  if (catalogs.isError) {
    return <ErrorNote>Could not load the catalogs: {catalogs.error.message}</ErrorNote>;
  }
  if (from.isError) {
    return <ErrorNote>Could not load the run to start from: {from.error.message}</ErrorNote>;
  }
  if (catalogs.isPending || (fromRunId !== null && from.isPending)) {
    return <p className="text-sm text-ink-soft">Loading catalogs…</p>;
  }
  const ready = catalogs.data.catalogs.filter((c) => c.status === 'ready');
  if (ready.length < 2) {
    return (
      <EmptyState title="Two ready catalogs are needed">
        A link run links the tracers of two or more catalogs. This project has {ready.length} ready{' '}
        {ready.length === 1 ? 'catalog' : 'catalogs'};{' '}
        <Link href={`/projects/${projectId}/catalogs/new`} className="text-accent underline">
          upload another
        </Link>{' '}
        and come back when it is ready.
      </EmptyState>
    );
  }
  const source = from.data?.run;
  let initial = DEFAULT_DRAFT;
  let note: string | null = null;
  if (source) {
    initial = draftFrom(source.params, new Set(ready.map((c) => c.id)));
    const lost = source.params.catalogIds.length - initial.catalogIds.length;
    note =
      `Starting from the parameters of “${source.name}”. Change what you need; the earlier run stays as it was.` +
      (lost > 0
        ? ` ${lost} of its catalogs ${lost === 1 ? 'is' : 'are'} no longer ready and left out.`
        : '');
  }
  return (
    <FormBody
      key={source?.id ?? 'new'}
      projectId={projectId}
      ready={ready}
      initial={initial}
      note={note}
    />
  );
}
