'use client';

import { useQuery } from '@tanstack/react-query';
import { useMemo } from 'react';
import { fmtWhen } from '@/components/link-runs/format';
import { ANALYSIS_POLL_MS } from '@/components/ordering/analysis-view';
import { ANALYSIS_STATUS_WORDS, isFinalAnalysis } from '@/components/ordering/words';
import { ErrorNote, Panel, ProgressBar } from '@/components/ui/panel';
import { api } from '@/lib/api-client';
import { makeExternalRotationCurve } from '@/lib/external/rotation';
import type { ExternalGalaxy } from '@/lib/external/types';
import { DiscMap } from './disc-map';
import { DphiPlot } from './dphi-plot';
import { FitFacts, RingTable } from './result-panels';
import type { ExternalAnalysis } from './types';

/** One analysis, fetched again every second until it is final. */
function useExternalAnalysis(analysisId: string) {
  return useQuery({
    queryKey: ['analysis', analysisId],
    queryFn: () => api<{ analysis: ExternalAnalysis }>(`/api/analyses/${analysisId}`),
    refetchInterval: (q) =>
      q.state.data && isFinalAnalysis(q.state.data.analysis.status) ? false : ANALYSIS_POLL_MS,
  });
}

/**
 * An external-galaxy analysis: its progress while it runs, then the fit with its intervals, the
 * null test, the deprojected face-on map, Δφ(R) with the fitted curve, and the rings. The curve is
 * drawn on the rotation curve the analysis ran with (the result's galaxy; before a result, the
 * request's or the project's target).
 */
export function ExternalView({
  analysisId,
  targetGalaxy,
}: {
  analysisId: string;
  targetGalaxy: ExternalGalaxy;
}) {
  const { data, error } = useExternalAnalysis(analysisId);
  const analysis = data?.analysis;
  const galaxy = analysis?.result?.galaxy ?? analysis?.params.galaxy ?? targetGalaxy;
  const curve = useMemo(
    () => makeExternalRotationCurve(galaxy.rotationCurve),
    [galaxy.rotationCurve],
  );
  if (error) return <ErrorNote>Could not load the analysis: {error.message}</ErrorNote>;
  if (!analysis) return <p className="text-sm text-ink-soft">Loading the analysis…</p>;
  const result = analysis.result;
  const stem = `lanewise-external-${analysis.id}`;
  return (
    <div id="result" className="space-y-6">
      <Panel title={`External-galaxy analysis of ${fmtWhen(analysis.createdAt)}`}>
        <p className="flex items-center gap-3 text-sm">
          <span>Status:</span>
          <span
            data-testid="analysis-status"
            className={analysis.status === 'failed' ? 'font-medium text-danger' : ''}
          >
            {ANALYSIS_STATUS_WORDS[analysis.status]}
          </span>
          {!isFinalAnalysis(analysis.status) && (
            <ProgressBar value={analysis.progress} label="Progress of the analysis" />
          )}
        </p>
        {analysis.error && <ErrorNote>{analysis.error}</ErrorNote>}
        <p className="mt-2 text-xs text-ink-soft">
          m = {analysis.params.arms} arms, rings {analysis.params.rings.minKpc}–
          {analysis.params.rings.maxKpc} kpc by {analysis.params.rings.widthKpc} kpc,{' '}
          {analysis.params.resamples} resamples, seed {analysis.params.seed}. Long analyses can be
          left: the result is here when you come back.
        </p>
      </Panel>
      {result && (
        <>
          <Panel title="Pattern speed and timescale">
            <FitFacts result={result} />
          </Panel>
          <div className="grid gap-6 2xl:grid-cols-2">
            <Panel>
              <DiscMap result={result} rings={analysis.params.rings} fileStem={stem} />
            </Panel>
            <Panel>
              <DphiPlot result={result} curve={curve} fileStem={stem} />
            </Panel>
          </div>
          <Panel title="Rings">
            <RingTable result={result} />
          </Panel>
        </>
      )}
    </div>
  );
}
