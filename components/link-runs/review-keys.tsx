'use client';

import { useEffect, useRef } from 'react';
import type { ReviewState } from '@/lib/schemas/complexes';

/** The verdict keys: a accept, d reject (dismiss), r doubtful (needs another look). */
export const VERDICT_KEYS: Record<string, ReviewState> = {
  a: 'accepted',
  d: 'rejected',
  r: 'doubtful',
};

/** Keys the complexes pages answer to, for the legend. */
const LEGEND: { key: string; what: string; editOnly?: boolean }[] = [
  { key: 'a', what: 'accept', editOnly: true },
  { key: 'd', what: 'reject', editOnly: true },
  { key: 'r', what: 'doubtful — needs another look', editOnly: true },
  { key: 'n', what: 'next not reviewed' },
  { key: 'j', what: 'next in the list' },
  { key: 'k', what: 'previous in the list' },
];

/** True when a key press belongs to a field the user is typing in, not to the page. */
export function isTypingTarget(target: EventTarget | null): boolean {
  if (!(target instanceof HTMLElement)) return false;
  if (target.isContentEditable) return true;
  const tag = target.tagName;
  if (tag === 'TEXTAREA' || tag === 'SELECT') return true;
  if (tag !== 'INPUT') return false;
  const type = (target as HTMLInputElement).type;
  return !['checkbox', 'radio', 'button', 'submit', 'reset'].includes(type);
}

/**
 * Calls `onKey` with the plain key (one letter or Enter) of each page-level key press: not while
 * typing in a field, not with Ctrl, Alt or Meta (those belong to the browser). A handler that
 * returns true has used the key, and its default action is prevented.
 */
export function usePageKeys(onKey: (key: string) => boolean, enabled = true) {
  const latest = useRef(onKey);
  useEffect(() => {
    latest.current = onKey;
  });
  useEffect(() => {
    if (!enabled) return;
    const listener = (e: KeyboardEvent) => {
      if (e.ctrlKey || e.altKey || e.metaKey || e.repeat || isTypingTarget(e.target)) return;
      const key = e.key.length === 1 ? e.key.toLowerCase() : e.key;
      if (latest.current(key)) e.preventDefault();
    };
    window.addEventListener('keydown', listener);
    return () => window.removeEventListener('keydown', listener);
  }, [enabled]);
}

/** The keys of the review workflow, shown where they work. */
export function ReviewKeyLegend({ canEdit, extra }: { canEdit: boolean; extra?: string }) {
  return (
    <p
      className="flex flex-wrap items-center gap-x-3 gap-y-1 text-xs text-ink-soft"
      aria-label="Keys"
    >
      <span className="font-medium">Keys:</span>
      {LEGEND.filter((k) => canEdit || !k.editOnly).map((k) => (
        <span key={k.key}>
          <kbd className="rounded border border-rule bg-white px-1 font-mono text-ink">{k.key}</kbd>{' '}
          {k.what}
        </span>
      ))}
      {extra && <span>{extra}</span>}
      <span>(not while typing in a field)</span>
    </p>
  );
}
