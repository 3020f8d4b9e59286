/**
 * The plain-words side of an ordering result: how a distance was chosen, why a complex was left
 * out, and the headline sentence. The headline claims an ordering only when the 95 % interval of
 * the median gas-to-young-star offset excludes zero.
 */
import { fmt } from '@/components/link-runs/format';
import { EXCLUSION_WORDS } from '@/lib/ordering/exclusions';
import type { AnalysisStatus, DistanceChoice, OrderingResult } from './types';

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

/**
 * The headline: what the data say about the order of gas and young stars across the arms. The
 * statistics are signed downstream (positive: young stars downstream of their gas — ahead in
 * rotation inside corotation, behind outside), so a positive interval is the density-wave order.
 */
export function headline(r: OrderingResult): {
  claim: 'downstream' | 'upstream' | 'none' | 'too-few';
  text: string;
} {
  const g = r.gasToStars;
  if (g.medianAcrossKpc === null || g.ci95 === null) {
    return {
      claim: 'too-few',
      text: `Too few complexes have both gas and young-star members at a usable distance to measure an ordering (n = ${g.n}).`,
    };
  }
  const [lo, hi] = g.ci95;
  const d = sharedDecimals([g.medianAcrossKpc * 1000, lo * 1000, hi * 1000]);
  const interval = `95 % interval ${pc(lo, d)} to ${pc(hi, d)} pc, n = ${g.n} complexes`;
  const sense = 'ahead of it in the sense of rotation inside corotation, behind it outside';
  if (lo > 0) {
    return {
      claim: 'downstream',
      text: `Young stars lie ${pc(g.medianAcrossKpc, d)} pc ahead of their gas across the arms in the direction of the flow (${sense}; median, ${interval}): the gas is upstream of the young stars, as a density wave predicts.`,
    };
  }
  if (hi < 0) {
    return {
      claim: 'upstream',
      text: `Young stars lie ${pc(-g.medianAcrossKpc, d)} pc behind their gas across the arms against the direction of the flow (median, ${interval}): the reverse of the order a density wave predicts.`,
    };
  }
  return {
    claim: 'none',
    text: `The data do not show an ordering of gas and young stars across the arms: the median offset along the flow is ${pc(g.medianAcrossKpc, d)} pc, and its ${interval} includes zero.`,
  };
}
