'use client';

import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import { fmt } from '@/components/link-runs/format';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { ErrorNote, Panel } from '@/components/ui/panel';
import { api } from '@/lib/api-client';
import { corotationRadiusKpc } from '@/lib/astro/pattern-speed';
import { NEAR_FAR_RULES } from '@/lib/schemas/analyses';
import { ArmsEditor } from './arms-editor';
import { FaceOnMap } from './face-on-map';
import {
  armSpecToRow,
  presetErrors,
  roundKms,
  type CheckedSettings,
  type SettingsDraft,
} from './settings-model';
import type { ArmPresets, NearFarRule } from './types';
import { NEAR_FAR_WORDS } from './words';

/** Query key of the project (its settings hold the ordering defaults). */
export const projectKey = (projectId: string) => ['project', projectId];

/**
 * The ordering settings: rotation curve, its constants and their uncertainties, an optional
 * assumed pattern speed, the near/far rule, streaming dispersion, scale height, arm width, which
 * members give the velocity, and the arm model (a published
 * preset or custom arms in a table), with a face-on preview that follows every edit. Editors
 * change them for the next analysis; the owner can also save them as the project's defaults.
 */
export function SettingsPanel({
  projectId,
  draft,
  setDraft,
  checked,
  presets,
  canEdit,
  isOwner,
  onRestoreDefaults,
}: {
  projectId: string;
  draft: SettingsDraft;
  setDraft: (d: SettingsDraft) => void;
  checked: CheckedSettings;
  presets: ArmPresets;
  canEdit: boolean;
  isOwner: boolean;
  onRestoreDefaults: () => void;
}) {
  const qc = useQueryClient();
  const [saved, setSaved] = useState(false);
  const save = useMutation({
    mutationFn: () =>
      api(`/api/projects/${projectId}`, {
        method: 'PATCH',
        json: { settings: { ordering: checked.ok ? checked.value : null } },
      }),
    onSuccess: () => {
      setSaved(true);
      void qc.invalidateQueries({ queryKey: projectKey(projectId) });
    },
  });
  const edit = (patch: Partial<SettingsDraft>) => {
    setSaved(false);
    setDraft({ ...draft, ...patch });
  };
  const curvePreset = presets.curves.find((c) => c.name === draft.curveName);
  const armPreset = presets.presets.find((p) => p.key === draft.preset);
  const errors = checked.ok ? {} : checked.errors;
  const corotation = useMemo(() => {
    const ps = draft.patternSpeed.trim() === '' ? NaN : Number(draft.patternSpeed);
    return checked.ok && ps > 0 ? corotationRadiusKpc(checked.curve, ps) : null;
  }, [checked, draft.patternSpeed]);
  const kinked = armPreset?.arms.some((a) => a.betaKinkDeg !== undefined) ?? false;
  const R0 = Number(draft.R0);
  const readOnly = !canEdit;

  return (
    <Panel title="Settings">
      <div className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_minmax(0,460px)]">
        <div className="space-y-5">
          <fieldset className="space-y-3">
            <legend className="mb-1 text-xs font-semibold text-ink-soft">Rotation</legend>
            <SelectField
              label="Rotation curve"
              value={draft.curveName}
              disabled={readOnly}
              onChange={(e) => {
                const c = presets.curves.find((x) => x.name === e.target.value);
                if (c)
                  edit({
                    curveName: c.name,
                    R0: String(c.R0Kpc),
                    theta0: String(roundKms(c.theta0Kms)),
                    ...presetErrors(c),
                  });
              }}
            >
              {presets.curves.map((c) => (
                <option key={c.name} value={c.name}>
                  {c.label}
                </option>
              ))}
            </SelectField>
            {curvePreset && <p className="text-xs text-ink-soft">Source: {curvePreset.source}</p>}
            <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
              <TextField
                label="R0 (kpc)"
                inputMode="decimal"
                value={draft.R0}
                disabled={readOnly}
                onChange={(e) => edit({ R0: e.target.value })}
              />
              <TextField
                label="Θ0 (km/s)"
                hint="circular speed at the Sun, Θ(R0)"
                inputMode="decimal"
                value={draft.theta0}
                disabled={readOnly}
                onChange={(e) => edit({ theta0: e.target.value })}
              />
              <TextField
                label="R0 uncertainty, 1σ (kpc)"
                hint="drawn in the distance Monte Carlo"
                inputMode="decimal"
                value={draft.R0Err}
                disabled={readOnly}
                onChange={(e) => edit({ R0Err: e.target.value })}
              />
              <TextField
                label="Θ0 uncertainty, 1σ (km/s)"
                hint="drawn in the distance Monte Carlo"
                inputMode="decimal"
                value={draft.theta0Err}
                disabled={readOnly}
                onChange={(e) => edit({ theta0Err: e.target.value })}
              />
            </div>
            <TextField
              label="Assumed pattern speed (optional)"
              hint={`km/s/kpc. An assumption, labelled so in the result; leave empty to assume none (Ω_p is then only fitted from the data).${corotation !== null ? ` Corotation at R = ${fmt(corotation, 2)} kpc.` : ''}`}
              inputMode="decimal"
              placeholder="none"
              value={draft.patternSpeed}
              disabled={readOnly}
              onChange={(e) => edit({ patternSpeed: e.target.value })}
            />
            {curvePreset && canEdit && (
              <Button
                type="button"
                variant="quiet"
                className="px-2.5 py-1 text-xs"
                onClick={() =>
                  edit({
                    R0: String(curvePreset.R0Kpc),
                    theta0: String(roundKms(curvePreset.theta0Kms)),
                    ...presetErrors(curvePreset),
                  })
                }
              >
                Use the preset’s R0, Θ0 and their uncertainties
              </Button>
            )}
          </fieldset>

          <fieldset className="space-y-3">
            <legend className="mb-1 text-xs font-semibold text-ink-soft">Distances and arms</legend>
            <SelectField
              label="Near/far rule"
              value={draft.nearFar}
              disabled={readOnly}
              onChange={(e) => edit({ nearFar: e.target.value as NearFarRule })}
            >
              {NEAR_FAR_RULES.map((r) => (
                <option key={r} value={r}>
                  {NEAR_FAR_WORDS[r]}
                </option>
              ))}
            </SelectField>
            <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
              <TextField
                label="Streaming σ (km/s)"
                hint="added to velocity errors"
                inputMode="decimal"
                value={draft.sigmaStreamKms}
                disabled={readOnly}
                onChange={(e) => edit({ sigmaStreamKms: e.target.value })}
              />
              <TextField
                label="Scale height (kpc)"
                hint="latitude rule: near root beyond ~2.5 of these"
                inputMode="decimal"
                value={draft.scaleHeightKpc}
                disabled={readOnly}
                onChange={(e) => edit({ scaleHeightKpc: e.target.value })}
              />
              <TextField
                label="Arm width (kpc)"
                hint="farther from every ridge: off-arm"
                inputMode="decimal"
                value={draft.armWidthKpc}
                disabled={readOnly}
                onChange={(e) => edit({ armWidthKpc: e.target.value })}
              />
              <SelectField
                label="Velocity from"
                value={draft.velocityFrom}
                disabled={readOnly}
                onChange={(e) => edit({ velocityFrom: e.target.value === 'all' ? 'all' : 'gas' })}
              >
                <option value="gas">gas members (HI, CO)</option>
                <option value="all">all members</option>
              </SelectField>
            </div>
          </fieldset>

          <fieldset className="space-y-3">
            <legend className="mb-1 text-xs font-semibold text-ink-soft">Arm model</legend>
            <div className="flex flex-wrap gap-4 text-sm" role="radiogroup" aria-label="Arm model">
              {(
                [
                  ['preset', 'Published preset'],
                  ['custom', 'Custom arms'],
                ] as const
              ).map(([mode, label]) => (
                <label key={mode} className="flex items-center gap-2">
                  <input
                    type="radio"
                    name="arms-mode"
                    checked={draft.armsMode === mode}
                    disabled={readOnly}
                    onChange={() => edit({ armsMode: mode })}
                  />
                  {label}
                </label>
              ))}
            </div>
            {draft.armsMode === 'preset' ? (
              <div className="space-y-2">
                <SelectField
                  label="Preset"
                  value={draft.preset}
                  disabled={readOnly}
                  onChange={(e) => edit({ preset: e.target.value })}
                >
                  {presets.presets.map((p) => (
                    <option key={p.key} value={p.key}>
                      {p.label}
                    </option>
                  ))}
                </SelectField>
                {armPreset && (
                  <p className="text-xs text-ink-soft">
                    {armPreset.arms.length} arms ({armPreset.arms.map((a) => a.name).join(', ')}),
                    fitted with R0 = {fmt(armPreset.R0Kpc, 2)} kpc. Source: {armPreset.source}
                  </p>
                )}
                {armPreset && canEdit && (
                  <Button
                    type="button"
                    variant="quiet"
                    className="px-2.5 py-1 text-xs"
                    disabled={kinked}
                    title={
                      kinked
                        ? 'This preset has kinked arms (two pitch angles), which the custom table cannot hold.'
                        : undefined
                    }
                    onClick={() =>
                      edit({ armsMode: 'custom', customArms: armPreset.arms.map(armSpecToRow) })
                    }
                  >
                    Copy into custom arms
                  </Button>
                )}
              </div>
            ) : (
              <ArmsEditor
                rows={draft.customArms}
                errors={errors}
                disabled={readOnly}
                onChange={(rows) => edit({ customArms: rows })}
              />
            )}
          </fieldset>

          {!checked.ok && (
            <ul className="space-y-1" aria-label="Problems with the settings">
              {Object.entries(errors).map(([k, m]) => (
                <li key={k}>
                  <ErrorNote>{m}</ErrorNote>
                </li>
              ))}
            </ul>
          )}
          <div className="flex flex-wrap items-center gap-3">
            {isOwner && (
              <Button
                type="button"
                disabled={!checked.ok || save.isPending}
                onClick={() => save.mutate()}
              >
                Save as project defaults
              </Button>
            )}
            {canEdit && (
              <Button type="button" variant="quiet" onClick={onRestoreDefaults}>
                Back to the project defaults
              </Button>
            )}
            {saved && <span className="text-sm text-ok">Saved as the project’s defaults.</span>}
            {save.error && <ErrorNote>The defaults were not saved: {save.error.message}</ErrorNote>}
          </div>
          <p className="text-xs text-ink-soft">
            {isOwner
              ? 'These settings apply to the next analysis you start; saving makes them the defaults every member starts from.'
              : canEdit
                ? 'These settings apply to the next analysis you start. Only the project owner can save them as the defaults.'
                : 'The project’s defaults, as its owner saved them.'}
          </p>
        </div>
        <div>
          <FaceOnMap
            title="Arm model preview"
            fileStem="arm-model-preview"
            arms={checked.arms}
            R0Kpc={
              checked.ok
                ? checked.curve.R0Kpc
                : R0 > 0
                  ? R0
                  : (curvePreset?.R0Kpc ?? presets.curves[0].R0Kpc)
            }
            corotationKpc={corotation}
            corotationSource="assumed"
            size={460}
            testId="arm-preview"
          />
        </div>
      </div>
    </Panel>
  );
}
