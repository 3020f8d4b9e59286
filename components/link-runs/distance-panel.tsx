'use client';

import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { api } from '@/lib/api-client';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
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
  const value = Number(dist);
  const valid = dist.trim() !== '' && Number.isFinite(value) && value > 0 && value <= 50;
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
            if (valid) save.mutate(value);
          }}
        >
          <TextField
            label="Distance (kpc)"
            name="overrideDistKpc"
            inputMode="decimal"
            value={dist}
            onChange={(e) => setDist(e.target.value)}
            hint="Between 0 and 50 kpc."
          />
          <TextField
            label="Why"
            name="overrideNote"
            value={note}
            onChange={(e) => setNote(e.target.value)}
            placeholder="e.g. maser parallax of the HII region"
          />
          <ErrorNote>
            {save.error?.message ??
              (dist.trim() !== '' && !valid
                ? `Distance ${dist} is not a number between 0 and 50 kpc.`
                : null)}
          </ErrorNote>
          <div className="flex gap-2">
            <Button type="submit" disabled={!valid || save.isPending}>
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
