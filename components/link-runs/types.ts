/**
 * Shapes of the link-run JSON API as the pages read them (the contract in the API docs). Angles
 * are degrees unless a name says otherwise; velocities are LSR km/s; times are ISO 8601.
 */

import type { ComplexAnalysisJson } from '@/lib/schemas/analyses';

export type RunStatus = 'queued' | 'running' | 'done' | 'failed' | 'cancelled';
export type Review = 'accepted' | 'doubtful' | 'rejected';
export type LinkMode = 'all' | 'nearest' | 'mutual';
export type MissingVelocity = 'exclude' | 'position-only';

export type RadiusParams =
  { mode: 'fixed'; arcsec: number } | { mode: 'scaled'; factor: number; minArcsec: number };
export type VelocityParams =
  { mode: 'fixed'; kms: number } | { mode: 'scaled'; factor: number } | { mode: 'ignore' };

/** The body of `POST …/link-runs` (and of the estimate), also kept as the run's `params`. */
export interface RunParams {
  catalogIds: string[];
  radius: RadiusParams;
  velocity: VelocityParams;
  linkMode: LinkMode;
  chanceTrials: number;
  missingVelocity?: MissingVelocity;
  complexCap?: number;
  name?: string;
}

export interface Histogram {
  edges: number[];
  counts: number[];
}

export interface PairSummary {
  catalogA: string;
  catalogB: string;
  links: number;
  expectedChance: number | null;
  chanceStdErr: number | null;
  reliability: number | null;
  excludedA: number;
  excludedB: number;
  positionOnlyA: number;
  positionOnlyB: number;
}

export interface RunSummary {
  links: number;
  complexes: number;
  sources: number;
  durationSeconds: number;
  pairs: PairSummary[];
  capped: { complexId: string; size: number }[];
  complexCap: number;
  histograms: { separationArcsec: Histogram; deltaVKms: Histogram };
  complexSizes: Histogram;
}

export interface Person {
  id: string;
  name: string;
}

export interface Run {
  id: string;
  projectId: string;
  name: string;
  status: RunStatus;
  progress: number;
  params: RunParams;
  catalogs: { id: string; name: string; kind: string }[];
  summary: RunSummary | null;
  error: string | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  createdBy: Person | null;
}

export interface Estimate {
  sources: number;
  pairs: {
    catalogA: string;
    catalogB: string;
    nA: number;
    nB: number;
    expectedCandidates: number;
  }[];
  chanceRepeats: number;
  workUnits: number;
  roughSeconds: number;
}

export type ClassCounts = Record<'hi' | 'co' | 'hii' | 'ob' | 'other', number>;

/** A complex as the run's latest done ordering analysis placed it (the API's shape). */
export type ComplexAnalysis = ComplexAnalysisJson;

export interface Complex {
  id: string;
  size: number;
  linkCount: number;
  counts: ClassCounts;
  classes: string[];
  l: number;
  b: number;
  v: number | null;
  maxSepArcsec: number;
  maxDvKms: number | null;
  reliability: number | null;
  overCap: boolean;
  name: string | null;
  review: Review | null;
  reviewNote: string | null;
  reviewedBy: Person | null;
  reviewedAt: string | null;
  analysis: ComplexAnalysis | null;
}

export interface ComplexPage {
  complexes: Complex[];
  total: number;
  page: number;
  pageSize: number;
}

export interface Member {
  catalogId: string;
  catalogName: string;
  kind: string;
  row: number;
  line: number;
  name: string | null;
  l: number;
  b: number;
  v: number | null;
  radiusArcsec: number | null;
  posErrArcsec: number | null;
  vErrKms: number | null;
  lineWidthKms: number | null;
  distKpc: number | null;
  distErrKpc: number | null;
  original: Record<string, string>;
}

export interface Link {
  catalogA: string;
  rowA: number;
  catalogB: string;
  rowB: number;
  sepArcsec: number;
  dvKms: number | null;
  reliability: number | null;
  radiusArcsec: number;
}

export interface HistoryEntry {
  action: string;
  review: Review | null;
  note: string | null;
  by: Person | null;
  at: string;
}

export type DistanceOverride = { distKpc: number; note: string; by: string; at: string };
export type ComplexDetail = Complex & {
  members: Member[];
  links: Link[];
  history: HistoryEntry[];
  distanceOverride: DistanceOverride | null;
};

export interface Comparison {
  a: { id: string; links: number; complexes: number };
  b: { id: string; links: number; complexes: number };
  common: number;
  gained: number;
  lost: number;
  /** Up to 20 links each; without the pair radius and reliability. */
  gainedSample: Omit<Link, 'radiusArcsec' | 'reliability'>[];
  lostSample: Omit<Link, 'radiusArcsec' | 'reliability'>[];
}
