/**
 * The plain-words side of an ordering result: how a distance was chosen, why a complex was left
 * out, which near/far rule ran, how a pattern speed was obtained, and number formats shared by
 * the tables. The headline sentences come written with the result and are shown as they are.
 */
import { fmt } from '@/components/link-runs/format';
import { EXCLUSION_WORDS } from '@/lib/ordering/exclusions';
import type { AnalysisStatus, Ci, DistanceChoice, NearFarRule, OrderingResult } from './types';

export const CHOICE_WORDS: Record<DistanceChoice, string> = {
  near: 'near root',
  far: 'far root',
  tangent: 'tangent point',
  single: 'single root, outside the solar circle',
  independent: 'independent distance of a member',
  override: 'distance set by an editor',
  unresolved: 'near/far unresolved',
};

/** Why a complex was left out, in the analysis's own words (`lib/ordering/exclusions`). */
export const exclusionWords = (key: string) =>
  (EXCLUSION_WORDS as Record<string, string>)[key] ?? key.replace(/-/g, ' ');

export const ANALYSIS_STATUS_WORDS: Record<AnalysisStatus, string> = {
  queued: 'waiting to start',
  running: 'computing',
  done: 'done',
  failed: 'failed',
  cancelled: 'cancelled',
};

export const isFinalAnalysis = (s: AnalysisStatus) =>
  s === 'done' || s === 'failed' || s === 'cancelled';

/**
 * Decimals that give the largest of `values` (ignoring nulls) `sig` significant digits, between
 * 0 and 4: a set of numbers shown together (a median and its interval) shares them.
 */
export function sharedDecimals(values: (number | null | undefined)[], sig = 2): number {
  const top = Math.max(0, ...values.map((v) => (v === null || v === undefined ? 0 : Math.abs(v))));
  if (!(top > 0) || !Number.isFinite(top)) return 0;
  return Math.min(4, Math.max(0, sig - 1 - Math.floor(Math.log10(top))));
}

/** An offset given in kpc, written in pc (with `decimals` places) and a true minus sign. */
export const pc = (kpc: number | null | undefined, decimals = 0) =>
  kpc === null || kpc === undefined ? '—' : fmt(kpc * 1000, decimals);

/** A p-value the way a paper prints it: three significant digits, or `< 0.001`. */
export function fmtP(p: number | null | undefined): string {
  if (p === null || p === undefined || !Number.isFinite(p)) return '—';
  if (p < 0.001) return '< 0.001';
  return p.toPrecision(2);
}

/** The near/far rules of the distance draws, as the settings form and the result name them. */
export const NEAR_FAR_WORDS: Record<NearFarRule, string> = {
  probabilistic: 'probabilistic (each draw takes a root by its likelihood)',
  near: 'near root always',
  far: 'far root always',
  latitude: 'latitude (near root when the far one is too high above the plane)',
  independent: 'independent distances only',
};

/** How the pattern speed behind an interpretation was obtained; the label the page prints. */
export function patternSpeedSourceWords(
  source: OrderingResult['interpretation']['source'],
): string {
  if (source === 'fitted') return 'fitted';
  if (source === 'assumed') return 'assumed';
  return 'none';
}

/** An interval of values in kpc written in pc, sharing `decimals`. */
export const pcCi = (c: Ci | null, decimals = 0) =>
  c ? `${pc(c[0], decimals)} to ${pc(c[1], decimals)}` : '—';

/** An interval written with `decimals` places. */
export const ci = (c: Ci | null, decimals: number) =>
  c ? `${fmt(c[0], decimals)} to ${fmt(c[1], decimals)}` : '—';

/** Why a source was left out of the l–v offsets (the keys of the result's `lvMasked`). */
export const LV_MASK_WORDS: Record<string, string> = {
  noVelocity: 'without a velocity',
  unreliableLongitude: 'at longitudes where velocity does not track distance',
  noBranch: 'with no arm locus within the velocity window',
  nearTangent: 'where the sight line grazes the arm (near a tangent)',
};
