/**
 * Shapes of the ordering-analysis JSON API as the Arms & ordering page reads them (the contract
 * of `/api/projects/{id}/analyses`, `/api/analyses/{id}` and `/api/projects/{id}/arm-presets`).
 * Distances and offsets in kpc, angles in degrees, velocities LSR km/s, times ISO 8601. Offsets
 * are signed: positive ahead of the arm ridge in the sense of Galactic rotation.
 */
import type { ArmSpec } from '@/lib/astro/arms';
import type { ToolCurveName } from '@/lib/calculators';
import type { OrderingResult } from '@/lib/ordering/types';

export type AnalysisStatus = 'queued' | 'running' | 'done' | 'failed' | 'cancelled';

/** One arm as the API spells it in `arms.custom` (β in degrees, R_ref in kpc). */
export interface CustomArmJson {
  name: string;
  Rref: number;
  betaRefDeg: number;
  pitchDeg: number;
  betaMinDeg: number;
  betaMaxDeg: number;
}

export type ArmsChoice = { preset: string } | { custom: CustomArmJson[] };

export interface CurveChoice {
  name: ToolCurveName;
  R0?: number;
  theta0?: number;
}

/** The project's ordering defaults as saved in `project.settings.ordering`. */
export interface OrderingDefaults {
  curve: CurveChoice;
  arms: ArmsChoice;
  patternSpeed: number;
  armWidthKpc: number;
  sigmaStreamKms: number;
  scaleHeightKpc: number;
  velocityFrom: 'gas' | 'all';
}

/** The body of `POST /api/projects/{id}/analyses`, also kept as the analysis's `params`. */
export interface AnalysisParams extends Partial<Omit<OrderingDefaults, 'curve' | 'arms'>> {
  runId: string;
  curve: CurveChoice;
  arms: ArmsChoice;
  patternSpeed: number;
  resamples: number;
  seed: number;
}

// The result shapes are the pure module's own: one definition for the job that writes them
// and the page that reads them.
export type { Ci, ClassSummary, DistanceChoice, OrderingResult } from '@/lib/ordering/types';
export type ResultComplex = OrderingResult['complexes'][number];
export type ResultSource = OrderingResult['sources'][number];

export interface Person {
  id: string;
  name: string;
}

/** One row of `GET /api/projects/{id}/analyses`. */
export interface AnalysisListItem {
  id: string;
  runId: string;
  runName: string;
  status: AnalysisStatus;
  progress: number;
  params: AnalysisParams;
  createdAt: string;
  createdBy: Person | string | null;
  summary: {
    gasToStarsMedianKpc: number | null;
    pValue: number | null;
    delayMedianMyr: number | null;
  } | null;
}

/** `GET /api/analyses/{id}` → `analysis`. */
export interface Analysis {
  id: string;
  runId: string;
  status: AnalysisStatus;
  progress: number;
  params: AnalysisParams;
  error: string | null;
  createdAt: string;
  createdBy: Person | string | null;
  result: OrderingResult | null;
}

/** `GET /api/projects/{id}/arm-presets`. */
export interface ArmPresets {
  presets: { key: string; label: string; source: string; R0Kpc: number; arms: ArmSpec[] }[];
  curves: {
    name: ToolCurveName;
    label: string;
    source: string;
    R0Kpc: number;
    theta0Kms: number;
  }[];
}
