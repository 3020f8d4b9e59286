'use client';

import { useQuery } from '@tanstack/react-query';
import { useMemo } from 'react';
import { fmt, fmtCount, fmtWhen } from '@/components/link-runs/format';
import { ErrorNote, Panel, ProgressBar } from '@/components/ui/panel';
import { api } from '@/lib/api-client';
import { FaceOnMap } from './face-on-map';
import { LvDiagram } from './lv-diagram';
import { OffsetHistograms } from './offset-histograms';
import { ArmTable, ClassTable, RadialTable } from './result-tables';
import { armsOfChoice, curveOfParams } from './settings-model';
import type { Analysis, ArmPresets, OrderingResult } from './types';
import {
  ANALYSIS_STATUS_WORDS,
  fmtP,
  headline,
  isFinalAnalysis,
  pc,
  sharedDecimals,
} from './words';

/** Polling interval while an analysis is queued or running, in milliseconds. */
export const ANALYSIS_POLL_MS = 1000;

/** One analysis, fetched again every second until it is done or failed. */
export function useAnalysis(analysisId: string) {
  return useQuery({
    queryKey: ['analysis', analysisId],
    queryFn: () => api<{ analysis: Analysis }>(`/api/analyses/${analysisId}`),
    refetchInterval: (q) =>
      q.state.data && isFinalAnalysis(q.state.data.analysis.status) ? false : ANALYSIS_POLL_MS,
  });
}

const personName = (p: Analysis['createdBy']) =>
  p === null ? 'a former member' : typeof p === 'string' ? p : p.name;

function Fact({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div>
      <dt className="text-xs uppercase tracking-wide text-ink-soft">{label}</dt>
      <dd className="mt-0.5">{children}</dd>
    </div>
  );
}

function Headline({ result, patternSpeed }: { result: OrderingResult; patternSpeed: number }) {
  const h = headline(result);
  const g = result.gasToStars;
  const d = result.delayMyr;
  const gd = sharedDecimals(
    [g.medianAcrossKpc, ...(g.ci95 ?? [])].map((x) => (x === null ? null : x * 1000)),
  );
  const dd = sharedDecimals([d.median, ...(d.ci95 ?? [])]);
  const tone =
    h.claim === 'downstream' || h.claim === 'upstream'
      ? 'border-accent/40 bg-accent-soft/40'
      : 'border-rule bg-paper-deep/50';
  return (
    <div className={`space-y-3 rounded-lg border px-4 py-3 ${tone}`}>
      <p className="text-base font-medium leading-relaxed" data-testid="ordering-headline">
        {h.text}
      </p>
      <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-2 lg:grid-cols-4">
        <Fact label="Median gas → stars (pc)">
          <span className="num" data-testid="headline-median">
            {pc(g.medianAcrossKpc, gd)}
          </span>{' '}
          <span className="text-ink-soft">
            [{g.ci95 ? `${pc(g.ci95[0], gd)} to ${pc(g.ci95[1], gd)}` : '—'}]
          </span>
        </Fact>
        <Fact label="p-value (one-sided)">
          <span className="num" data-testid="headline-p">
            {fmtP(g.pValue)}
          </span>
          <span className="block text-xs text-ink-soft">
            permutation test of “gas upstream of young stars”
          </span>
        </Fact>
        <Fact label="Delay (Myr)">
          <span className="num" data-testid="headline-delay">
            {fmt(d.median, dd)}
          </span>{' '}
          <span className="text-ink-soft">
            [{d.ci95 ? `${fmt(d.ci95[0], dd)} to ${fmt(d.ci95[1], dd)}` : '—'}]
          </span>
          <span className="block text-xs text-ink-soft">
            t = Δβ / (Ω − Ω_p) at Ω_p = {fmt(patternSpeed, 1)} km/s/kpc; n = {fmtCount(d.n)}
          </span>
        </Fact>
        <Fact label="KS test, gas vs young stars">
          {result.ks ? (
            <span className="num">
              D = {fmt(result.ks.d, 3)}, p = {fmtP(result.ks.pValue)}
            </span>
          ) : (
            '—'
          )}
        </Fact>
      </dl>
    </div>
  );
}

/** How many complexes were used, and the analysis's warnings (each exclusion reason with its count). */
function Warnings({ result }: { result: OrderingResult }) {
  const e = result.exclusions;
  return (
    <div className="space-y-2 text-sm" data-testid="ordering-warnings">
      <p>
        <strong className="num">{fmtCount(e.used)}</strong> of{' '}
        <strong className="num">{fmtCount(e.complexes)}</strong> complexes were used
        {e.used === e.complexes ? '; none was left out.' : '.'}
      </p>
      {result.warnings.length > 0 && (
        <ul className="space-y-1" aria-label="Warnings">
          {result.warnings.map((w, i) => (
            <li
              key={i}
              className="rounded-md border border-tracer-other/40 bg-tracer-other/10 px-3 py-1.5"
            >
              {w}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}

function Exports({ analysisId }: { analysisId: string }) {
  const base = `/api/analyses/${analysisId}`;
  const link =
    'rounded-md border border-rule bg-white px-2.5 py-1 text-sm text-accent hover:bg-paper-deep/60';
  const tables = [
    [
      'complexes',
      'Complexes',
      'one row per complex: distance and its choice, arm, offsets, used or why not',
    ],
    ['classes', 'Classes', 'one row per tracer class: n, median and mean offsets with intervals'],
    ['sources', 'Sources', 'one row per member placed at its complex’s distance, with its offset'],
  ] as const;
  return (
    <ul className="space-y-2 text-sm">
      {tables.map(([table, label, explain]) => (
        <li key={table} className="flex flex-wrap items-center gap-2">
          <span className="w-24 font-medium">{label}</span>
          <a
            className={link}
            href={`${base}/export.csv?table=${table}`}
            download
            aria-label={`${label} table as CSV`}
          >
            CSV
          </a>
          <span className="text-xs text-ink-soft">{explain}</span>
        </li>
      ))}
      <li className="flex flex-wrap items-center gap-2">
        <span className="w-24 font-medium">Methods</span>
        <a className={link} href={`${base}/methods.txt`} download aria-label="Methods as text">
          Text
        </a>
        <span className="text-xs text-ink-soft">
          every parameter and reference, for a methods section
        </span>
      </li>
    </ul>
  );
}

/**
 * One ordering analysis: its status and progress while it runs (the page may be left), then the
 * headline, what was left out and why, the class, arm and radial tables, the face-on map, the
 * longitude–velocity diagram, the offset histograms and the exports.
 */
export function AnalysisView({
  analysisId,
  runName,
  presets,
}: {
  analysisId: string;
  runName: string | null;
  presets: ArmPresets;
}) {
  const { data, error, isPending } = useAnalysis(analysisId);
  const params = data?.analysis.params;
  const arms = useMemo(() => (params ? armsOfChoice(params.arms, presets) : []), [params, presets]);
  const curve = useMemo(() => (params ? curveOfParams(params.curve) : null), [params]);
  if (error) return <ErrorNote>Could not load the ordering analysis: {error.message}</ErrorNote>;
  if (isPending) return <p className="text-sm text-ink-soft">Loading the ordering analysis…</p>;
  const a = data.analysis;
  const p = a.params;
  const result = a.result;
  const armsLabel =
    'preset' in p.arms
      ? (presets.presets.find((x) => x.key === (p.arms as { preset: string }).preset)?.label ??
        p.arms.preset)
      : `custom (${p.arms.custom.map((x) => x.name).join(', ')})`;
  const stem = `ordering-${a.id.slice(0, 8)}`;

  return (
    <div className="space-y-6" id="result">
      <Panel title={`Ordering analysis of ${runName ?? 'a link run'}`}>
        <div className="space-y-3">
          <div className="flex flex-wrap items-center gap-3 text-sm">
            <span
              data-testid="analysis-status"
              className={
                a.status === 'failed'
                  ? 'font-medium text-danger'
                  : a.status === 'done'
                    ? 'text-ok'
                    : 'text-ink-soft'
              }
            >
              {ANALYSIS_STATUS_WORDS[a.status]}
            </span>
            {!isFinalAnalysis(a.status) && (
              <>
                <ProgressBar value={a.progress} label="Progress of the ordering analysis" />
                <span className="text-ink-soft">
                  You can leave this page; the analysis goes on and its result will be here when you
                  come back.
                </span>
              </>
            )}
          </div>
          {a.status === 'failed' && (
            <ErrorNote>
              The analysis failed: {a.error ?? 'no reason was recorded'}. Check the settings and the
              link run, then start a new analysis.
            </ErrorNote>
          )}
          <dl className="grid gap-x-6 gap-y-3 text-sm sm:grid-cols-2 lg:grid-cols-4">
            <Fact label="Rotation curve">
              {curve?.label ?? p.curve.name}
              <span className="block text-xs text-ink-soft">
                R0 = {fmt(curve?.R0Kpc ?? p.curve.R0, 2)} kpc, Θ0 ={' '}
                {fmt(curve?.theta0Kms ?? p.curve.theta0, 1)} km/s
              </span>
            </Fact>
            <Fact label="Arm model">{armsLabel}</Fact>
            <Fact label="Pattern speed">{fmt(p.patternSpeed, 1)} km/s/kpc</Fact>
            <Fact label="Resamples, seed">
              {fmtCount(p.resamples)}, {p.seed}
            </Fact>
            <Fact label="Streaming σ, scale height">
              {p.sigmaStreamKms === undefined ? 'default' : `${fmt(p.sigmaStreamKms, 1)} km/s`},{' '}
              {p.scaleHeightKpc === undefined ? 'default' : `${fmt(p.scaleHeightKpc, 3)} kpc`}
            </Fact>
            <Fact label="Arm width">
              {p.armWidthKpc === undefined ? 'default' : `${fmt(p.armWidthKpc, 2)} kpc`}
            </Fact>
            <Fact label="Velocity from">
              {p.velocityFrom === 'all'
                ? 'all members'
                : p.velocityFrom === 'gas'
                  ? 'gas members'
                  : 'default'}
            </Fact>
            <Fact label="Started by">
              {personName(a.createdBy)}, {fmtWhen(a.createdAt)}
            </Fact>
          </dl>
        </div>
      </Panel>

      {a.status === 'done' && result && (
        <>
          <Panel title="What the data show">
            <div className="space-y-4">
              <Headline result={result} patternSpeed={p.patternSpeed} />
              <Warnings result={result} />
              <p className="text-xs text-ink-soft">{result.conventions}</p>
            </div>
          </Panel>
          <Panel title="Offsets by class">
            <div className="space-y-2">
              <p className="text-xs text-ink-soft">
                Downstream + : offsets signed along the flow through the arm, positive downstream of
                the ridge — ahead in the sense of rotation inside corotation, behind it outside —
                where density-wave theory puts young stars relative to gas.
              </p>
              <p className="text-xs text-ink-soft" data-testid="class-offset-caveat">
                Read with care: each complex sits at its kinematic distance, whose errors (streaming
                motions, near/far choice) move it across the arm by tens to hundreds of pc. Offsets
                of whole classes from the ridge are only as good as those distances; the gas →
                young-star offset within complexes above does not depend on them.
              </p>
              <ClassTable result={result} />
            </div>
          </Panel>
          <div className="grid gap-6">
            <Panel title="By arm">
              {result.perArm.length ? (
                <ArmTable result={result} />
              ) : (
                <p className="text-sm text-ink-soft">No complex lies on an arm.</p>
              )}
            </Panel>
            <Panel title="By radius">
              <div className="space-y-2">
                <p className="text-xs text-ink-soft">
                  {result.corotationKpc !== null
                    ? `Corotation at R = ${fmt(result.corotationKpc, 2)} kpc. These offsets are not signed along the flow (positive = ahead in rotation), so the order reverses outside corotation (shaded rows).`
                    : 'This pattern speed has no corotation radius within the Galaxy.'}
                </p>
                <RadialTable result={result} />
              </div>
            </Panel>
          </div>
          <Panel title="Views">
            <div className="space-y-8">
              {curve ? (
                <div className="grid gap-6 xl:grid-cols-[minmax(0,620px)_minmax(0,1fr)]">
                  <FaceOnMap
                    title="Face-on map of the complexes"
                    fileStem={`${stem}-face-on`}
                    arms={arms}
                    R0Kpc={curve.R0Kpc}
                    corotationKpc={result.corotationKpc}
                    complexes={result.complexes}
                    sources={result.sources}
                    testId="ordering-face-on"
                  />
                  <LvDiagram
                    arms={arms}
                    curve={curve}
                    complexes={result.complexes}
                    sources={result.sources}
                    fileStem={`${stem}-lv`}
                  />
                </div>
              ) : (
                <ErrorNote>
                  The rotation curve stored with this analysis ({p.curve.name}) could not be
                  rebuilt, so the map and the longitude–velocity diagram cannot be drawn.
                </ErrorNote>
              )}
              {curve && (
                <OffsetHistograms
                  result={result}
                  curve={curve}
                  patternSpeedKmsKpc={p.patternSpeed}
                  fileStem={stem}
                />
              )}
            </div>
          </Panel>
          <Panel title="Export">
            <Exports analysisId={a.id} />
          </Panel>
        </>
      )}
    </div>
  );
}
