'use client';

import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { api } from '@/lib/api-client';
import { BULK_REVIEW_LIMIT, type ReviewState } from '@/lib/schemas/complexes';
import { Button } from '@/components/ui/button';
import { ErrorNote } from '@/components/ui/panel';
import { REVIEW_WORDS, fmtCount } from './format';

/** What is selected: some complexes by id, or every complex matching the list's filters. */
export type Selection = { ids: Set<string>; all: boolean };

/**
 * One verdict and one note for the selected complexes (by id, or all matching the filters, up
 * to BULK_REVIEW_LIMIT), saved in one request; the server writes one audit row per complex
 * whose review changed.
 */
export function BulkReviewBar({
  runId,
  selection,
  total,
  filters,
  onDone,
}: {
  runId: string;
  selection: Selection;
  /** Complexes matching the filters. */
  total: number;
  filters: Record<string, string>;
  /** Called with a sentence saying how many changed. */
  onDone: (message: string) => void;
}) {
  const qc = useQueryClient();
  const [review, setReview] = useState<ReviewState | ''>('accepted');
  const [note, setNote] = useState('');
  const count = selection.all ? total : selection.ids.size;
  const save = useMutation({
    mutationFn: () =>
      api<{ matched: number; changed: number }>(`/api/link-runs/${runId}/complexes/review`, {
        method: 'POST',
        json: {
          ...(selection.all ? { filter: filters } : { complexIds: [...selection.ids].map(Number) }),
          review: review || null,
          note,
        },
      }),
    onSuccess: (r) => {
      void qc.invalidateQueries({ queryKey: ['complexes', runId] });
      onDone(
        `${fmtCount(r.changed)} of ${fmtCount(r.matched)} complexes changed${r.changed < r.matched ? ' (the others already had this verdict and note)' : ''}.`,
      );
    },
  });
  const tooMany = count > BULK_REVIEW_LIMIT;
  return (
    <form
      aria-label="Review the selected complexes"
      className="flex flex-wrap items-center gap-3 rounded-md border border-accent/40 bg-accent/5 px-3 py-2 text-sm"
      onSubmit={(e) => {
        e.preventDefault();
        save.mutate();
      }}
    >
      <span className="font-medium" data-testid="bulk-count">
        {fmtCount(count)} selected
      </span>
      <label className="flex items-center gap-1">
        <span>Verdict</span>
        <select
          aria-label="Verdict for the selected complexes"
          className="rounded border border-rule bg-white px-2 py-1"
          value={review}
          onChange={(e) => setReview(e.target.value as ReviewState | '')}
        >
          <option value="accepted">{REVIEW_WORDS.accepted}</option>
          <option value="doubtful">{REVIEW_WORDS.doubtful}</option>
          <option value="rejected">{REVIEW_WORDS.rejected}</option>
          <option value="">not reviewed (clears the verdict)</option>
        </select>
      </label>
      <input
        aria-label="Note for the selected complexes"
        placeholder="One note for all of them"
        maxLength={4000}
        className="w-72 rounded border border-rule bg-white px-2 py-1"
        value={note}
        onChange={(e) => setNote(e.target.value)}
      />
      <Button type="submit" className="px-2.5 py-1" disabled={save.isPending || tooMany}>
        Review {fmtCount(count)}
      </Button>
      <span className="text-xs text-ink-soft">
        at most {fmtCount(BULK_REVIEW_LIMIT)} at once
        {tooMany && ' — narrow the filters'}
      </span>
      <ErrorNote>{save.error && `The reviews were not saved: ${save.error.message}`}</ErrorNote>
    </form>
  );
}
