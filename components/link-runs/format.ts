import type {
  LinkMode,
  MissingVelocity,
  RadiusParams,
  Review,
  RunStatus,
  VelocityParams,
} from './types';
import { formatDateTimeOrDash } from '@/lib/format/dates';

/** Polling interval while a run is queued or running, in milliseconds. */
export const RUN_POLL_MS = 1000;

/** True once a run will not change by itself any more. */
export const isFinalRun = (status: RunStatus) =>
  status === 'done' || status === 'failed' || status === 'cancelled';

export const STATUS_WORDS: Record<RunStatus, string> = {
  queued: 'waiting to start',
  running: 'linking',
  done: 'done',
  failed: 'failed',
  cancelled: 'cancelled',
};

/** One line per link mode, as the form and the run page explain it. */
export const LINK_MODE_WORDS: Record<LinkMode, { label: string; explain: string }> = {
  all: { label: 'All pairs', explain: 'every pair of sources within both tolerances is linked.' },
  nearest: {
    label: 'Nearest',
    explain: 'each source links only to its closest partner in each other catalog.',
  },
  mutual: {
    label: 'Mutual nearest',
    explain: 'a pair is linked only when each source is the other’s closest partner.',
  },
};

export const MISSING_VELOCITY_WORDS: Record<MissingVelocity, string> = {
  exclude: 'left out',
  'position-only': 'linked by position only',
};

export const REVIEW_WORDS: Record<Review | 'unreviewed', string> = {
  accepted: 'accepted',
  doubtful: 'doubtful',
  rejected: 'rejected',
  unreviewed: 'not reviewed',
};

/** Text colour class of each review state, the same in tables and on the complex page. */
export const REVIEW_TONE: Record<Review | 'unreviewed', string> = {
  accepted: 'text-ok',
  doubtful: 'text-tracer-other',
  rejected: 'text-danger',
  unreviewed: 'text-ink-soft',
};

/** A number with `decimals` places and a true minus sign; `—` for null or non-finite values. */
export function fmt(x: number | null | undefined, decimals: number): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '—';
  const s = x.toFixed(decimals);
  return Number(s) === 0 ? s.replace(/^-/, '') : s.replace(/^-/, '−');
}

/** An interval `lo–hi` with `decimals` places, or `—` when either end is missing. */
export function fmtRange(
  lo: number | null | undefined,
  hi: number | null | undefined,
  decimals: number,
): string {
  const a = fmt(lo, decimals);
  const b = fmt(hi, decimals);
  return a === '—' || b === '—' ? '—' : `${a}–${b}`;
}

/** Integers with grouping, the same in every table. */
export const fmtCount = (n: number) => n.toLocaleString('en-US');

/** A date and time in the reader's locale, or `—`. */
/** A time as every screen writes it: ISO 8601 in UTC (lib/format/dates.ts), or a dash. */
export const fmtWhen = (iso: string | null) => formatDateTimeOrDash(iso);

/** A duration given in seconds, in words (`0.4 s`, `12 s`, `3 min 05 s`). */
export function fmtSeconds(s: number): string {
  if (s < 10) return `${s.toFixed(1)} s`;
  if (s < 60) return `${Math.round(s)} s`;
  const m = Math.floor(s / 60);
  return `${m} min ${String(Math.round(s - 60 * m)).padStart(2, '0')} s`;
}

/** The match radius in words: `60″ fixed` or `1.0 × source size, at least 5″`. */
export function describeRadius(r: RadiusParams): string {
  return r.mode === 'fixed'
    ? `${fmt(r.arcsec, r.arcsec % 1 ? 1 : 0)}″ fixed`
    : `${fmt(r.factor, 2)} × size, ≥ ${fmt(r.minArcsec, 1)}″`;
}

/** The velocity window in words: `±5 km/s`, `2.0 × line width` or `ignored`. */
export function describeVelocity(v: VelocityParams): string {
  if (v.mode === 'fixed') return `±${fmt(v.kms, v.kms % 1 ? 1 : 0)} km/s`;
  if (v.mode === 'scaled') return `${fmt(v.factor, 2)} × line width`;
  return 'velocity ignored';
}
