'use client';

import { useQuery } from '@tanstack/react-query';
import { useMemo } from 'react';
import { fmt, fmtCount, fmtWhen } from '@/components/link-runs/format';
import { ErrorNote, Panel, ProgressBar } from '@/components/ui/panel';
import { api } from '@/lib/api-client';
import { FaceOnMap } from './face-on-map';
import { LvDiagram } from './lv-diagram';
import { IntraComplexHistogram, OffsetHistograms } from './offset-histograms';
import { PhasePlot } from './phase-plot';
import {
  ArmTable,
  ClassTable,
  LvOffsetTable,
  RadialTable,
  TangentLongitudeTable,
  TangentOffsetTable,
} from './result-tables';
import { armsOfChoice, curveOfParams } from './settings-model';
import type { Analysis, ArmPresets, Ci, OrderingResult } from './types';
import {
  ANALYSIS_STATUS_WORDS,
  ci,
  fmtP,
  isFinalAnalysis,
  LV_MASK_WORDS,
  NEAR_FAR_WORDS,
  patternSpeedSourceWords,
  pc,
  pcCi,
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
      <dt className="text-xs text-ink-soft">{label}</dt>
      <dd className="mt-0.5">{children}</dd>
    </div>
  );
}

/** The result's own headline sentences, already reconciled by the analysis: shown as they are. */
function Headline({ result }: { result: OrderingResult }) {
  return (
    <div
      className="space-y-2 rounded-lg border border-accent/40 bg-accent-soft/40 px-4 py-3"
      data-testid="ordering-headline"
    >
      {result.headline.map((sentence, i) => (
        <p key={i} className={i === 0 ? 'text-base font-medium leading-relaxed' : 'text-sm'}>
          {sentence}
        </p>
      ))}
    </div>
  );
}

/**
 * The one place that reads the measurement as upstream or downstream: with the fitted pattern
 * speed, or the one the user assumed, labelled as such; with neither, no reading at all.
 */
function InterpretationLine({ result }: { result: OrderingResult }) {
  const it = result.interpretation;
  const label = patternSpeedSourceWords(it.source);
  let text: string;
  if (it.patternSpeedKmsKpc === null) {
    text =
      'No pattern speed was fitted or assumed, so the measured offsets are not read as upstream or downstream.';
  } else {
    const cr =
      it.corotationKpc !== null
        ? `corotation at R = ${fmt(it.corotationKpc, 2)} kpc`
        : 'no corotation radius within the Galaxy';
    const share =
      it.insideShare !== null
        ? `${fmt(100 * it.insideShare, 0)} % of the used complexes lie inside corotation`
        : 'no used complex has a radius';
    const reading =
      it.predictedSign === 1
        ? 'inside corotation the gas overtakes the arm and enters it from behind, so downstream is ahead in rotation and young stars formed there should lie ahead of their gas'
        : it.predictedSign === -1
          ? 'outside corotation the arm overtakes the gas, so downstream is behind in rotation and young stars formed there should lie behind their gas'
          : 'the complexes lie on both sides of corotation, where downstream points opposite ways, so no single sign is predicted for the whole field';
    text = `Ω_p = ${fmt(it.patternSpeedKmsKpc, 1)} km/s/kpc (${cr}): ${share}; ${reading}.`;
  }
  return (
    <p className="rounded-md border border-rule bg-paper-deep/50 px-3 py-2 text-sm">
      <span className="mr-2 font-medium">Interpretation</span>
      <span
        className={`mr-2 rounded-full border px-2 py-0.5 text-xs font-medium ${it.source === 'assumed' ? 'border-tracer-other/60 bg-tracer-other/10' : 'border-rule bg-white'}`}
        data-testid="interpretation-source"
      >
        pattern speed: {label}
      </span>
      <span data-testid="ordering-interpretation">{text}</span>
    </p>
  );
}

/** How the distances were drawn: draws, the near/far rule, σ_stream and the constants with their 1σ. */
function DistanceFacts({ result }: { result: OrderingResult }) {
  const d = result.distances;
  return (
    <dl
      className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-2 lg:grid-cols-3"
      data-testid="ordering-distances"
    >
      <Fact label="Distance draws per complex">{fmtCount(d.draws)}</Fact>
      <Fact label="Near/far rule">{NEAR_FAR_WORDS[d.nearFar] ?? d.nearFar}</Fact>
      <Fact label="Streaming σ">{fmt(d.sigmaStreamKms, 1)} km/s</Fact>
      <Fact label="R0">
        {fmt(d.R0Kpc, 2)} ± {fmt(d.R0ErrKpc, 2)} kpc
      </Fact>
      <Fact label="Θ0">
        {fmt(d.theta0Kms, 1)} ± {fmt(d.theta0ErrKms, 1)} km/s
      </Fact>
      <Fact label="Median width of the 68 % distance interval">
        {d.medianCi68WidthKpc === null ? '—' : `${fmt(d.medianCi68WidthKpc, 2)} kpc`}
      </Fact>
    </dl>
  );
}

/** The fitted pattern speed, timescale and corotation with their intervals, or why there are none. */
function PatternFitFacts({ result }: { result: OrderingResult }) {
  const f = result.patternFit;
  if (!f || (!f.constrained && f.timescaleMyr === null && f.patternSpeedKmsKpc === null))
    return (
      <p className="text-sm" data-testid="pattern-fit">
        Pattern speed and timescale: not constrained —{' '}
        {result.patternFitReason ?? f?.reason ?? 'no reason was recorded'}.
      </p>
    );
  const value = (x: number | null, c: Ci | null, unit: string) =>
    x === null ? (
      <span className="text-ink-soft">not constrained</span>
    ) : (
      <>
        <span className="num">
          {fmt(x, 1)} {unit}
        </span>{' '}
        <span className="text-ink-soft">[{ci(c, 1)}]</span>
      </>
    );
  return (
    <div className="space-y-2" data-testid="pattern-fit">
      <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-2 lg:grid-cols-4">
        <Fact label="Pattern speed Ω_p (fitted)">
          {value(f.patternSpeedKmsKpc, f.patternSpeedCi95, 'km/s/kpc')}
        </Fact>
        <Fact label="Timescale t (fitted)">{value(f.timescaleMyr, f.timescaleCi95, 'Myr')}</Fact>
        <Fact label="Corotation R">{value(f.corotationKpc, f.corotationCi95, 'kpc')}</Fact>
        <Fact label="Rings used">{fmtCount(f.binsUsed)}</Fact>
      </dl>
      {f.reason && <p className="text-sm text-ink-soft">{f.reason}</p>}
      {f.notes.length > 0 && (
        <ul className="list-disc space-y-0.5 pl-5 text-xs text-ink-soft">
          {f.notes.map((n, i) => (
            <li key={i}>{n}</li>
          ))}
        </ul>
      )}
    </div>
  );
}

/**
 * Young stars measured against the gas of their OWN complex: bounded by the link radius, so it
 * describes how they sit on their cloud, not the density wave; no delay is derived from it.
 */
function IntraComplexSection({ result, fileStem }: { result: OrderingResult; fileStem: string }) {
  const ic = result.intraComplex;
  const d = sharedDecimals(
    [ic.medianAcrossKpc, ...(ic.ci95 ?? [])].map((x) => (x === null ? null : x * 1000)),
  );
  return (
    <div className="space-y-3" data-testid="intra-complex">
      <p className="text-xs text-ink-soft">
        Each complex’s young stars minus its own gas, across the arm. A link joins sources no
        farther apart than the link radius, so these offsets cannot exceed it: they show how young
        stars sit on their own cloud, not where the density wave put them, and no delay follows from
        them.
      </p>
      <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-2 lg:grid-cols-5">
        <Fact label="Link radius">
          <span className="num" data-testid="intra-link-radius">
            {ic.linkRadiusPc
              ? `${fmt(ic.linkRadiusPc[0], 1)} to ${fmt(ic.linkRadiusPc[1], 1)} pc`
              : 'not known'}
          </span>
          <span className="block text-xs text-ink-soft">
            at the 5th and 95th percentile distance of these complexes
          </span>
        </Fact>
        <Fact label="Complexes">{fmtCount(ic.n)}</Fact>
        <Fact label="Median across (pc, ahead +)">
          <span className="num">{pc(ic.medianAcrossKpc, d)}</span>{' '}
          <span className="text-ink-soft">[{pcCi(ic.ci95, d)}]</span>
        </Fact>
        <Fact label="Median along the arm (pc)">
          <span className="num">{pc(ic.medianAlongKpc, d)}</span>
        </Fact>
        <Fact label="p-value (sign-flip, two-sided)">
          <span className="num">{fmtP(ic.pValue)}</span>
        </Fact>
      </dl>
      <IntraComplexHistogram result={result} fileStem={fileStem} />
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
    [
      'classes',
      'Classes',
      'one row per tracer class, overall and per arm: n, median offsets across and in azimuth with intervals',
    ],
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
 * headline sentences and the interpretation with its label, what was left out and why, the
 * distances, the class, arm, tangent, l–v and radial results with the pattern fit and the Δφ(R)
 * plot, the intra-complex offsets on their own, the face-on map, the longitude–velocity diagram,
 * the offset histograms and the exports.
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
  const assumed = p.patternSpeed ?? null;

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
            <Fact label="Pattern speed">
              {assumed === null ? (
                'none assumed (fitted from the data where they allow)'
              ) : (
                <span data-testid="assumed-pattern-speed">assumed: {fmt(assumed, 1)} km/s/kpc</span>
              )}
            </Fact>
            <Fact label="Resamples, seed">
              {fmtCount(p.resamples)}, {p.seed}
            </Fact>
            <Fact label="Near/far rule">
              {p.nearFar ? NEAR_FAR_WORDS[p.nearFar] : NEAR_FAR_WORDS.probabilistic}
            </Fact>
            <Fact label="Streaming σ, scale height">
              {fmt(p.sigmaStreamKms, 1)} km/s, {fmt(p.scaleHeightKpc, 3)} kpc
            </Fact>
            <Fact label="Arm width, velocity from">
              {fmt(p.armWidthKpc, 2)} kpc,{' '}
              {p.velocityFrom === 'all' ? 'all members' : 'gas members'}
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
              <Headline result={result} />
              <InterpretationLine result={result} />
              <Warnings result={result} />
              <p className="text-xs text-ink-soft">{result.conventions}</p>
            </div>
          </Panel>
          <Panel title="Distances">
            <DistanceFacts result={result} />
          </Panel>
          <Panel title="Offsets by class">
            <div className="space-y-2">
              <p className="text-xs text-ink-soft">
                Offsets as measured: positive ahead of the arm ridge in the sense of rotation,
                negative behind it. Each complex’s distance is a distribution (velocity error and
                streaming, R0 and Θ0 errors, near or far by probability), and the 95 % intervals
                resample complexes and distance draws together.
              </p>
              <ClassTable result={result} />
              {result.ks && (
                <p className="text-xs text-ink-soft">
                  Two-sample KS test of gas against young-star offsets: D = {fmt(result.ks.d, 3)}, p
                  = {fmtP(result.ks.pValue)}.
                </p>
              )}
            </div>
          </Panel>
          <Panel title="By arm">
            {result.perArm.length ? (
              <ArmTable result={result} />
            ) : (
              <p className="text-sm text-ink-soft">No complex lies on an arm.</p>
            )}
          </Panel>
          <Panel title="Tangent points">
            <div className="space-y-3" data-testid="ordering-tangents">
              <p className="text-xs text-ink-soft">
                Near each tangent of the arm model, each class’s tangent longitude from its
                longitude profile; the offsets between classes need no kinematic distance. Δn is
                positive when the second class lies ahead of the first in the sense of rotation; Δt
                needs a pattern speed and says which.
              </p>
              {result.tangents.length === 0 ? (
                <p className="text-sm text-ink-soft">
                  No tangent of the arm model lies in the data.
                </p>
              ) : (
                <>
                  <TangentLongitudeTable result={result} />
                  <TangentOffsetTable result={result} />
                </>
              )}
              {result.tangents.some((t) => t.notes.length > 0) && (
                <ul className="list-disc space-y-0.5 pl-5 text-xs text-ink-soft">
                  {result.tangents.flatMap((t) =>
                    t.notes.map((n, i) => (
                      <li key={`${t.arm}${t.modelTangentLDeg}${i}`}>
                        {t.arm}: {n}
                      </li>
                    )),
                  )}
                </ul>
              )}
            </div>
          </Panel>
          <Panel title="Longitude–velocity offsets">
            <div className="space-y-2">
              <p className="text-xs text-ink-soft">
                Each source’s velocity offset Δv from its arm’s locus at its own longitude,
                converted to an across-arm offset Δn with the model’s gradient; positive ahead in
                the sense of rotation.
              </p>
              <LvOffsetTable result={result} />
              {Object.values(result.lvMasked).some((n) => n > 0) && (
                <p className="text-xs text-ink-soft">
                  Left out:{' '}
                  {Object.entries(result.lvMasked)
                    .filter(([, n]) => n > 0)
                    .map(([k, n]) => `${fmtCount(n)} ${LV_MASK_WORDS[k] ?? k}`)
                    .join(', ')}
                  .
                </p>
              )}
            </div>
          </Panel>
          <Panel title="Pattern speed and timescale">
            <div className="space-y-4">
              <PatternFitFacts result={result} />
              {curve ? (
                <PhasePlot result={result} curve={curve} fileStem={stem} />
              ) : (
                <ErrorNote>
                  The rotation curve stored with this analysis ({p.curve.name}) could not be
                  rebuilt, so Δφ(R) cannot be drawn.
                </ErrorNote>
              )}
              <RadialTable result={result} />
            </div>
          </Panel>
          <Panel title="Within complexes (bounded by the link radius)">
            <IntraComplexSection result={result} fileStem={stem} />
          </Panel>
          <Panel title="Views">
            <div className="space-y-8">
              {curve ? (
                <div className="grid gap-6 xl:grid-cols-[minmax(0,620px)_minmax(0,1fr)]">
                  <FaceOnMap
                    title="Face-on map of the complexes"
                    fileStem={`${stem}-face-on`}
                    arms={arms}
                    R0Kpc={curve.R0Kpc}
                    corotationKpc={result.interpretation.corotationKpc}
                    corotationSource={result.interpretation.source}
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
              <OffsetHistograms result={result} fileStem={stem} />
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
