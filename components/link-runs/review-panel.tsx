'use client';

import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { api } from '@/lib/api-client';
import { Button } from '@/components/ui/button';
import { ErrorNote, Panel } from '@/components/ui/panel';
import { REVIEW_TONE, REVIEW_WORDS, fmtWhen } from './format';
import { VERDICT_KEYS, usePageKeys } from './review-keys';
import type { Complex, HistoryEntry, Review } from './types';

const CHOICES: { value: Review; explain: string }[] = [
  { value: 'accepted', explain: 'the members belong together' },
  { value: 'doubtful', explain: 'needs another look or more data' },
  { value: 'rejected', explain: 'a chance alignment or a chain of unrelated sources' },
];

/**
 * The review of a complex (accepted / doubtful / rejected, with a note) and its history. Editors
 * change it here or with the verdict keys (a, d, r); viewers see it read-only.
 */
export function ReviewPanel({
  runId,
  complex,
  history,
  canEdit,
}: {
  runId: string;
  complex: Complex;
  history: HistoryEntry[];
  canEdit: boolean;
}) {
  const qc = useQueryClient();
  const [review, setReview] = useState<Review | null>(complex.review);
  const [note, setNote] = useState(complex.reviewNote ?? '');
  const [saved, setSaved] = useState(false);
  const save = useMutation({
    mutationFn: (body: { review: Review | null; note: string }) =>
      api<{ complex: Complex }>(`/api/link-runs/${runId}/complexes/${complex.id}`, {
        method: 'PATCH',
        json: body,
      }),
    onSuccess: () => {
      setSaved(true);
      void qc.invalidateQueries({ queryKey: ['complex', runId, complex.id] });
      void qc.invalidateQueries({ queryKey: ['complexes', runId] });
    },
  });
  // A verdict key saves at once, with the note as it stands in the field.
  usePageKeys((key) => {
    const verdict = VERDICT_KEYS[key];
    if (!verdict) return false;
    setReview(verdict);
    setSaved(false);
    save.mutate({ review: verdict, note });
    return true;
  }, canEdit);
  const current = complex.review ?? 'unreviewed';
  const changed = review !== complex.review || note !== (complex.reviewNote ?? '');
  return (
    <Panel title="Review">
      <div className="space-y-4">
        <p className="text-sm">
          <span className={`font-medium ${REVIEW_TONE[current]}`} data-testid="review-state">
            {REVIEW_WORDS[current]}
          </span>
          {complex.reviewedBy && (
            <span className="text-ink-soft">
              {' '}
              by {complex.reviewedBy.name}, {fmtWhen(complex.reviewedAt)}
            </span>
          )}
          {!canEdit && complex.reviewNote && (
            <span className="mt-1 block whitespace-pre-wrap">{complex.reviewNote}</span>
          )}
        </p>
        {canEdit && (
          <form
            className="space-y-3"
            onSubmit={(e) => {
              e.preventDefault();
              setSaved(false);
              save.mutate({ review, note });
            }}
          >
            <fieldset className="space-y-1.5">
              <legend className="mb-1 text-sm font-medium">Verdict</legend>
              {CHOICES.map((c) => (
                <label key={c.value} className="flex items-start gap-2 text-sm">
                  <input
                    type="radio"
                    name="review"
                    className="mt-1 accent-accent"
                    checked={review === c.value}
                    onChange={() => {
                      setReview(c.value);
                      setSaved(false);
                    }}
                  />
                  <span>
                    <span className={`font-medium ${REVIEW_TONE[c.value]}`}>
                      {REVIEW_WORDS[c.value]}
                    </span>
                    <span className="text-ink-soft"> — {c.explain}</span>
                  </span>
                </label>
              ))}
              <label className="flex items-start gap-2 text-sm">
                <input
                  type="radio"
                  name="review"
                  className="mt-1 accent-accent"
                  checked={review === null}
                  onChange={() => {
                    setReview(null);
                    setSaved(false);
                  }}
                />
                <span className="text-ink-soft">not reviewed (clears the verdict)</span>
              </label>
            </fieldset>
            <label className="block space-y-1 text-sm">
              <span className="font-medium">Note</span>
              <textarea
                rows={3}
                maxLength={4000}
                className="w-full rounded-md border border-rule bg-white px-3 py-2 text-sm focus:border-accent focus:outline-none focus:ring-2 focus:ring-accent/20"
                value={note}
                onChange={(e) => {
                  setNote(e.target.value);
                  setSaved(false);
                }}
              />
            </label>
            <div className="flex items-center gap-3">
              <Button type="submit" disabled={save.isPending || !changed}>
                Save review
              </Button>
              {saved && !changed && <span className="text-sm text-ok">Saved.</span>}
            </div>
            <ErrorNote>{save.error && `The review was not saved: ${save.error.message}`}</ErrorNote>
          </form>
        )}
        <div>
          <h3 className="mb-1 text-xs font-semibold tracking-wide text-ink-soft">History</h3>
          {history.length === 0 ? (
            <p className="text-sm text-ink-soft">Not reviewed yet.</p>
          ) : (
            <ol className="divide-y divide-rule/60 text-sm" aria-label="Review history">
              {history.map((h, i) => {
                const r = h.review ?? 'unreviewed';
                return (
                  <li key={`${h.at}-${i}`} className="py-1.5">
                    <span className={`font-medium ${REVIEW_TONE[r]}`}>{REVIEW_WORDS[r]}</span>
                    <span className="text-ink-soft">
                      {' '}
                      — {h.by?.name ?? 'a former member'}, {fmtWhen(h.at)}
                    </span>
                    {h.note && <span className="block whitespace-pre-wrap text-ink">{h.note}</span>}
                  </li>
                );
              })}
            </ol>
          )}
        </div>
      </div>
    </Panel>
  );
}
