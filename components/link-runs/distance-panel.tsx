'use client';

import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { api } from '@/lib/api-client';
import { Button } from '@/components/ui/button';
import { LimitedField } from '@/components/forms/link-run/limited-field';
import { TextField } from '@/components/ui/field';
import { distanceOverrideSchema, MAX_OVERRIDE_DIST_KPC } from '@/lib/schemas/distance-override';
import { ErrorNote, Panel } from '@/components/ui/panel';
import { fmtWhen } from './format';
import type { DistanceOverride } from './types';

/**
 * An editor's distance for a complex (e.g. from a maser parallax), used by later ordering
 * analyses instead of its kinematic distance; every change goes to the audit log.
 */
export function DistancePanel({
  runId,
  complexId,
  current,
  canEdit,
}: {
  runId: string;
  complexId: string;
  current: DistanceOverride | null;
  canEdit: boolean;
}) {
  const qc = useQueryClient();
  const [dist, setDist] = useState(current ? String(current.distKpc) : '');
  const [note, setNote] = useState(current?.note ?? '');
  const save = useMutation({
    mutationFn: (distKpc: number | null) =>
      api(`/api/link-runs/${runId}/complexes/${complexId}/distance`, {
        method: 'PUT',
        json: { distKpc, note },
      }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['complex', runId, complexId] }),
  });
  const [tried, setTried] = useState(false);
  const value = Number(dist);
  const checked = distanceOverrideSchema.safeParse({
    distKpc: dist.trim() === '' ? NaN : value,
    note,
  });
  const distIssue = checked.error?.issues.find((i) => i.path[0] === 'distKpc');
  const noteIssue = checked.error?.issues.find((i) => i.path[0] === 'note');
  // Told as soon as a typed distance breaks the limit; an empty one only once Save is pressed.
  const distError =
    distIssue && (tried || dist.trim() !== '')
      ? dist.trim() === '' || !Number.isFinite(value)
        ? `“${dist}” is not a number of kpc.`
        : `${dist} kpc is outside the limit: above 0, at most ${MAX_OVERRIDE_DIST_KPC} kpc.`
      : null;
  return (
    <Panel title="Distance">
      <p className="mb-3 text-sm text-ink-soft">
        {current
          ? `Set to ${current.distKpc} kpc by ${current.by}, ${fmtWhen(current.at)}${current.note ? ` — ${current.note}` : ''}. Ordering analyses use it instead of the kinematic distance.`
          : 'Ordering analyses give this complex a kinematic distance. An independent distance (e.g. a parallax) can replace it here.'}
      </p>
      {canEdit && (
        <form
          className="space-y-3"
          onSubmit={(e) => {
            e.preventDefault();
            setTried(true);
            if (checked.success) save.mutate(value);
          }}
        >
          <LimitedField
            id="overrideDistKpc"
            label="Distance (kpc)"
            name="overrideDistKpc"
            inputMode="decimal"
            value={dist}
            onChange={(e) => setDist(e.target.value)}
            limit={`Above 0, at most ${MAX_OVERRIDE_DIST_KPC} kpc.`}
            error={distError}
          />
          <TextField
            label="Why"
            name="overrideNote"
            value={note}
            onChange={(e) => setNote(e.target.value)}
            placeholder="e.g. maser parallax of the HII region"
          />
          <ErrorNote>
            {save.error?.message ?? (tried && noteIssue ? `Why: ${noteIssue.message}` : null)}
          </ErrorNote>
          <div className="flex gap-2">
            <Button type="submit" disabled={save.isPending}>
              Save distance
            </Button>
            {current && (
              <Button
                type="button"
                variant="quiet"
                onClick={() => {
                  setDist('');
                  save.mutate(null);
                }}
              >
                Use the kinematic distance
              </Button>
            )}
          </div>
        </form>
      )}
    </Panel>
  );
}
