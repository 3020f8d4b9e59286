'use client';

import { useQuery } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import { ErrorNote } from '@/components/ui/panel';
import { api } from '@/lib/api-client';
import { ARM_MODEL_PRESETS } from '@/lib/astro/arms';
import { ROTATION_CURVE_PRESETS } from '@/lib/astro/rotation-curves';
import { TOOL_CURVES } from '@/lib/calculators';
import { AnalysesPanel, useAnalyses } from './analyses-panel';
import { AnalysisView } from './analysis-view';
import { SettingsPanel, projectKey } from './settings-panel';
import { checkDraft, draftFromDefaults, readDefaults, type SettingsDraft } from './settings-model';
import type { ArmPresets, CurvePreset, OrderingDefaults } from './types';

/** The curves an analysis accepts (the named published models), with their constants' 1σ. */
function analysisCurves(
  curves: ReadonlyArray<
    Omit<CurvePreset, 'name' | 'theta0Kms'> & { name: string; theta0Kms: number | null }
  >,
) {
  return curves.flatMap((c): CurvePreset[] =>
    (TOOL_CURVES as readonly string[]).includes(c.name) && c.theta0Kms !== null
      ? [
          {
            name: c.name as CurvePreset['name'],
            label: c.label,
            source: c.source,
            R0Kpc: c.R0Kpc,
            theta0Kms: c.theta0Kms,
            R0ErrKpc: c.R0ErrKpc,
            theta0ErrKms: c.theta0ErrKms,
          },
        ]
      : [],
  );
}

/**
 * The published arm models and rotation curves from the science modules, the same tables the
 * presets endpoint serves; used only if that endpoint cannot be reached.
 */
const MODULE_PRESETS: ArmPresets = {
  presets: Object.entries(ARM_MODEL_PRESETS).map(([key, p]) => ({ key, ...p })),
  curves: analysisCurves(ROTATION_CURVE_PRESETS),
};

function Workspace({
  projectId,
  defaults,
  presets,
  canEdit,
  isOwner,
  analysisId,
}: {
  projectId: string;
  defaults: OrderingDefaults;
  presets: ArmPresets;
  canEdit: boolean;
  isOwner: boolean;
  analysisId: string | null;
}) {
  const [draft, setDraft] = useState<SettingsDraft>(() => draftFromDefaults(defaults, presets));
  const checked = useMemo(() => checkDraft(draft, presets), [draft, presets]);
  const analyses = useAnalyses(projectId);
  const runName = analyses.data?.analyses.find((a) => a.id === analysisId)?.runName ?? null;
  return (
    <div className="space-y-6">
      <SettingsPanel
        projectId={projectId}
        draft={draft}
        setDraft={setDraft}
        checked={checked}
        presets={presets}
        canEdit={canEdit}
        isOwner={isOwner}
        onRestoreDefaults={() => setDraft(draftFromDefaults(defaults, presets))}
      />
      <AnalysesPanel
        projectId={projectId}
        checked={checked}
        canEdit={canEdit}
        selected={analysisId}
      />
      {analysisId && (
        <AnalysisView
          key={analysisId}
          analysisId={analysisId}
          runName={runName}
          presets={presets}
        />
      )}
    </div>
  );
}

/**
 * The Arms & ordering page body: loads the project's ordering defaults and the arm and curve
 * presets, then shows the settings, the run form with past analyses, and the chosen analysis.
 */
export function OrderingWorkspace({
  projectId,
  canEdit,
  isOwner,
  analysisId,
}: {
  projectId: string;
  canEdit: boolean;
  isOwner: boolean;
  analysisId: string | null;
}) {
  const project = useQuery({
    queryKey: projectKey(projectId),
    queryFn: () =>
      api<{ project: { settings: Record<string, unknown> } }>(`/api/projects/${projectId}`),
  });
  const presetsQuery = useQuery({
    queryKey: ['arm-presets', projectId],
    queryFn: () => api<ArmPresets>(`/api/projects/${projectId}/arm-presets`),
    staleTime: Infinity,
    retry: false,
  });
  const presets = useMemo<ArmPresets>(() => {
    const p = presetsQuery.data ?? MODULE_PRESETS;
    // Only the named published curves can be sent to the analyses endpoint.
    const curves = analysisCurves(p.curves);
    return { presets: p.presets, curves: curves.length ? curves : MODULE_PRESETS.curves };
  }, [presetsQuery.data]);
  if (project.error)
    return <ErrorNote>Could not load the project’s settings: {project.error.message}</ErrorNote>;
  if (project.isPending || presetsQuery.isPending)
    return <p className="text-sm text-ink-soft">Loading the ordering settings…</p>;
  const defaults = readDefaults(project.data.project.settings.ordering);
  return (
    <>
      {presetsQuery.error && (
        <p className="mb-4 text-xs text-ink-soft">
          The presets list of the server could not be read ({presetsQuery.error.message}); the
          published arm models and rotation curves built into the app are offered instead.
        </p>
      )}
      <Workspace
        projectId={projectId}
        defaults={defaults}
        presets={presets}
        canEdit={canEdit}
        isOwner={isOwner}
        analysisId={analysisId}
      />
    </>
  );
}
