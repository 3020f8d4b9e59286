'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useEffect, useMemo, useState } from 'react';
import { api } from '@/lib/api-client';
import { LINK_RUN_LIMITS, linkRunSchema } from '@/lib/schemas/link-run-request';
import { LimitedField } from './link-run/limited-field';
import { EstimateWarnings, type EstimateJson } from './link-run/estimate-warnings';
import type { CatalogJson } from '@/components/tables/catalog-list';
import { LINK_MODE_WORDS, fmtCount, fmtSeconds } from '@/components/link-runs/format';
import { runsKey } from '@/components/link-runs/run-list';
import type { LinkMode, MissingVelocity, Run, RunParams } from '@/components/link-runs/types';
import { Button } from '@/components/ui/button';
import { SelectField } from '@/components/ui/field';
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

const L = LINK_RUN_LIMITS;
const n = (x: number) => x.toLocaleString('en-GB').replace(/,/g, ' ');

/** The limit of each field in words, from the limits the API's request schema applies. */
function limitsOf(d: Draft) {
  const perUnit = d.radiusUnit === 'arcmin' ? 60 : 1;
  const unit = d.radiusUnit === 'arcmin' ? '′' : '″';
  return {
    catalogIds: `${L.catalogs.min} to ${L.catalogs.max} catalogs.`,
    radiusValue: `0 to ${n(L.radiusArcsec.max / perUnit)}${unit} (10°); 0 links only identical positions.`,
    radiusFactor: `Above 0, at most ${L.scaleFactor.max}.`,
    radiusMinArcsec: `0 to ${n(L.radiusArcsec.max)}″.`,
    velocityKms: `0 to ${n(L.velocityKms.max)} km/s.`,
    velocityFactor: `Above 0, at most ${L.scaleFactor.max}.`,
    chanceTrials: `Whole number, ${L.chanceTrials.min} to ${L.chanceTrials.max}.`,
    complexCap: `Whole number, ${L.complexCap.min} to ${n(L.complexCap.max)}.`,
    name: `At most ${L.name.max} characters, one line.`,
  };
}

type FieldKey = keyof ReturnType<typeof limitsOf>;

/** The request field (zod path) each draft field feeds. */
const FIELD_OF_PATH: Record<string, FieldKey> = {
  catalogIds: 'catalogIds',
  'radius.arcsec': 'radiusValue',
  'radius.factor': 'radiusFactor',
  'radius.minArcsec': 'radiusMinArcsec',
  'velocity.kms': 'velocityKms',
  'velocity.factor': 'velocityFactor',
  chanceTrials: 'chanceTrials',
  complexCap: 'complexCap',
  name: 'name',
};

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

/**
 * The request body of the draft, checked by the API's own schema, or the problem of each field:
 * text that is not a number, or a value outside the field's limit (stated beside the field).
 */
function bodyOf(d: Draft): { body: RunParams } | { problems: Partial<Record<FieldKey, string>> } {
  const problems: Partial<Record<FieldKey, string>> = {};
  const limits = limitsOf(d);
  const num = (key: FieldKey, text: string) => {
    const x = Number(text.trim());
    if (text.trim() === '' || !Number.isFinite(x)) {
      problems[key] = `“${text}” is not a number.`;
      return NaN;
    }
    return x;
  };
  const perUnit = d.radiusUnit === 'arcmin' ? 60 : 1;
  const body = {
    catalogIds: d.catalogIds,
    radius:
      d.radiusMode === 'fixed'
        ? { mode: 'fixed' as const, arcsec: num('radiusValue', d.radiusValue) * perUnit }
        : {
            mode: 'scaled' as const,
            factor: num('radiusFactor', d.radiusFactor),
            minArcsec: num('radiusMinArcsec', d.radiusMinArcsec),
          },
    velocity:
      d.velocityMode === 'fixed'
        ? { mode: 'fixed' as const, kms: num('velocityKms', d.velocityKms) }
        : d.velocityMode === 'scaled'
          ? { mode: 'scaled' as const, factor: num('velocityFactor', d.velocityFactor) }
          : { mode: 'ignore' as const },
    linkMode: d.linkMode,
    chanceTrials: num('chanceTrials', d.chanceTrials),
    missingVelocity: d.missingVelocity,
    complexCap: num('complexCap', d.complexCap),
    ...(d.name.trim() ? { name: d.name.trim() } : {}),
  };
  const parsed = linkRunSchema.safeParse(body);
  if (parsed.success && Object.keys(problems).length === 0) return { body: parsed.data };
  for (const issue of parsed.error?.issues ?? []) {
    const key = FIELD_OF_PATH[issue.path.join('.')];
    if (key && !problems[key]) {
      const shown = key === 'catalogIds' ? `${d.catalogIds.length} chosen` : 'Outside the limit';
      problems[key] =
        key === 'name' ? issue.message : `${shown}: ${limits[key].replace(/\.$/, '')}.`;
    }
  }
  return { problems };
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
  estimate: EstimateJson;
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
      <table className="w-full text-xs" aria-label="Expected links per catalog pair">
        <thead className="text-left text-ink-soft">
          <tr>
            <th className="py-1 font-medium">Pair</th>
            <th className="py-1 text-right font-medium">sources A</th>
            <th className="py-1 text-right font-medium">sources B</th>
            <th className="py-1 text-right font-medium">expected links</th>
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
              <td className="num py-1">{fmtCount(Math.round(p.expectedLinks))}</td>
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
  const limits = limitsOf(d);
  const problems = 'problems' in checked ? checked.problems : {};
  const bodyText = 'body' in checked ? JSON.stringify(checked.body) : null;
  const settled = useDebounced(bodyText, ESTIMATE_DEBOUNCE_MS);
  const byId = useMemo(() => new Map(ready.map((c) => [c.id, c])), [ready]);

  const estimate = useQuery({
    queryKey: ['link-run-estimate', projectId, settled],
    queryFn: () =>
      api<{ estimate: EstimateJson }>(`/api/projects/${projectId}/link-runs/estimate`, {
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
              Choose the ready catalogs to link: {limits.catalogIds}
            </legend>
            {problems.catalogIds && (
              <p role="alert" className="mb-2 text-xs text-danger">
                {problems.catalogIds}
              </p>
            )}
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
                  <LimitedField
                    id="run-radiusValue"
                    label="Radius"
                    limit={limits.radiusValue}
                    error={problems.radiusValue}
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
                  <LimitedField
                    id="run-radiusFactor"
                    label="Size factor"
                    limit={limits.radiusFactor}
                    error={problems.radiusFactor}
                    inputMode="decimal"
                    value={d.radiusFactor}
                    onChange={(e) => set({ radiusFactor: e.target.value })}
                  />
                </div>
                <div className="w-40">
                  <LimitedField
                    id="run-radiusMinArcsec"
                    label="Smallest radius (″)"
                    limit={limits.radiusMinArcsec}
                    error={problems.radiusMinArcsec}
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
                <LimitedField
                  id="run-velocityKms"
                  label="Window (km/s)"
                  limit={limits.velocityKms}
                  error={problems.velocityKms}
                  inputMode="decimal"
                  value={d.velocityKms}
                  onChange={(e) => set({ velocityKms: e.target.value })}
                />
              </div>
            )}
            {d.velocityMode === 'scaled' && (
              <div className="w-48">
                <LimitedField
                  id="run-velocityFactor"
                  label="Line-width factor"
                  limit={limits.velocityFactor}
                  error={problems.velocityFactor}
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
              <LimitedField
                id="run-chanceTrials"
                label="Chance-link repeats"
                limit={limits.chanceTrials}
                error={problems.chanceTrials}
                hint="Shifted-catalog repeats that estimate false links; 0 turns it off."
                value={d.chanceTrials}
                onChange={(e) => set({ chanceTrials: e.target.value })}
              />
            </div>
            <div className="w-56">
              <LimitedField
                id="run-complexCap"
                label="Complex size cap"
                limit={limits.complexCap}
                error={problems.complexCap}
                hint="Complexes above this many members are flagged for a closer look."
                value={d.complexCap}
                onChange={(e) => set({ complexCap: e.target.value })}
              />
            </div>
            <div className="min-w-64 flex-1">
              <LimitedField
                id="run-name"
                label="Run name (optional)"
                limit={limits.name}
                error={problems.name}
                placeholder="e.g. CO × HII, 60″, ±5 km/s"
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
              <EstimateWarnings warnings={estimate.data.estimate.warnings} />
            </div>
          ) : (
            <p className="text-sm text-ink-soft">Estimating…</p>
          )}
        </Panel>
        {showProblems && 'problems' in checked && (
          <ErrorNote>
            <span className="block font-medium">Please correct:</span>
            {Object.values(checked.problems).map((p) => (
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
