'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { ErrorNote, Panel } from '@/components/ui/panel';
import { api } from '@/lib/api-client';
import { checkTargetDraft, draftFromTarget, TARGET_LABELS, type TargetDraft } from './target-draft';

const ROTATION_WORDS: Record<TargetDraft['rotation'], string> = {
  counterclockwise: 'counterclockwise (north up, east left)',
  clockwise: 'clockwise (north up, east left)',
  'trailing-arms': 'infer from trailing arms',
};

/**
 * The Target section of the project settings: the Milky Way, or one external galaxy with its
 * centre, distance, orientation, sense of rotation and rotation curve. Checked as typed with the
 * server's schema and saved with `PATCH /api/projects/{id}` `{ settings: { target } }`.
 */
export function TargetSettings({
  projectId,
  savedTarget,
  canEdit,
}: {
  projectId: string;
  savedTarget: unknown;
  canEdit: boolean;
}) {
  const router = useRouter();
  const [draft, setDraft] = useState<TargetDraft>(() => draftFromTarget(savedTarget));
  const [error, setError] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  const [tried, setTried] = useState(false);
  const checked = checkTargetDraft(draft);
  const set = (patch: Partial<TargetDraft>) => {
    setSaved(false);
    setDraft((d) => ({ ...d, ...patch }));
  };
  const text = (field: keyof typeof TARGET_LABELS & keyof TargetDraft, hint?: string) => (
    <TextField
      label={TARGET_LABELS[field]}
      name={field}
      hint={hint}
      disabled={!canEdit}
      value={draft[field]}
      onChange={(e) => set({ [field]: e.target.value })}
    />
  );
  const external = draft.kind === 'external-galaxy';
  return (
    <Panel title="Target">
      <form
        className="space-y-4"
        aria-label="Target"
        onSubmit={async (e) => {
          e.preventDefault();
          setTried(true);
          setError(null);
          if (!checked.ok) return;
          try {
            await api(`/api/projects/${projectId}`, {
              method: 'PATCH',
              json: { settings: { target: checked.value } },
            });
            setSaved(true);
            router.refresh();
          } catch (err) {
            setError(err instanceof Error ? err.message : String(err));
          }
        }}
      >
        <fieldset className="space-y-1 text-sm" disabled={!canEdit}>
          <legend className="mb-1 font-medium text-ink">What the project studies</legend>
          {(
            [
              ['milky-way', 'The Milky Way, from inside (l, b, v_LSR; kinematic distances)'],
              [
                'external-galaxy',
                'An external galaxy, seen from outside (RA/Dec; deprojected into its disc, kpc)',
              ],
            ] as const
          ).map(([kind, label]) => (
            <label key={kind} className="flex items-center gap-2">
              <input
                type="radio"
                name="target-kind"
                value={kind}
                checked={draft.kind === kind}
                onChange={() => set({ kind })}
              />
              {label}
            </label>
          ))}
        </fieldset>
        {external && (
          <div className="space-y-4" data-testid="target-galaxy">
            {text('name', 'optional, shown beside the project name')}
            <div className="grid gap-3 sm:grid-cols-2">
              {text('centerRa', 'degrees, or hours as 13:25:28.8')}
              {text('centerDec', 'degrees, or +22:51:00')}
              {text('distanceMpc')}
              {text('systemicVelocityKms')}
              {text('inclinationDeg', '0° face-on; at most 85°')}
              {text('positionAngleDeg')}
            </div>
            <SelectField
              label={TARGET_LABELS.rotation}
              name="rotation"
              disabled={!canEdit}
              value={draft.rotation}
              onChange={(e) => set({ rotation: e.target.value as TargetDraft['rotation'] })}
            >
              {Object.entries(ROTATION_WORDS).map(([value, label]) => (
                <option key={value} value={value}>
                  {label}
                </option>
              ))}
            </SelectField>
            <SelectField
              label="Rotation curve"
              name="curveKind"
              disabled={!canEdit}
              value={draft.curveKind}
              onChange={(e) => set({ curveKind: e.target.value as TargetDraft['curveKind'] })}
            >
              <option value="flat">flat: V(R) = V</option>
              <option value="table">table of (R, V), interpolated linearly</option>
            </SelectField>
            {draft.curveKind === 'flat' ? (
              text('vFlatKms')
            ) : (
              <label className="block space-y-1 text-sm">
                <span className="font-medium text-ink">{TARGET_LABELS.curveTable}</span>
                <textarea
                  name="curveTable"
                  rows={6}
                  disabled={!canEdit}
                  className="num w-full rounded-md border border-rule bg-white px-3 py-2 text-sm focus:border-accent focus:outline-none focus:ring-2 focus:ring-accent/20"
                  value={draft.curveTable}
                  onChange={(e) => set({ curveTable: e.target.value })}
                />
                <span className="block text-xs text-ink-soft">
                  Radii increasing; inside the first row V rises linearly from 0, beyond the last it
                  stays at the last V.
                </span>
              </label>
            )}
          </div>
        )}
        {tried && !checked.ok && checked.problems.map((p) => <ErrorNote key={p}>{p}</ErrorNote>)}
        <ErrorNote>{error && `The target was not saved: ${error}`}</ErrorNote>
        {canEdit && <Button type="submit">Save target</Button>}
        {saved && <span className="ml-3 text-sm text-ok">Saved.</span>}
      </form>
    </Panel>
  );
}
