/**
 * Shapes of the ordering-analysis JSON API as the Arms & ordering page reads them (the contract
 * of `/api/projects/{id}/analyses`, `/api/analyses/{id}` and `/api/projects/{id}/arm-presets`).
 * Distances and offsets in kpc, angles in degrees, velocities LSR km/s, times ISO 8601. Offsets
 * are measured positive ahead of the arm ridge in the sense of Galactic rotation.
 */
import type { z } from 'zod';
import type { ArmSpec } from '@/lib/astro/arms';
import type { ToolCurveName } from '@/lib/calculators';
import type { OrderingResult } from '@/lib/ordering/types';
import type { AnalysisParams, analysisSchema, customArmSchema } from '@/lib/schemas/analyses';

export type AnalysisStatus = 'queued' | 'running' | 'done' | 'failed' | 'cancelled';

/** One arm as the API spells it in `arms.custom` (β in degrees, R_ref in kpc). */
export type CustomArmJson = z.infer<typeof customArmSchema>;

/** The body of `POST /api/projects/{id}/analyses`, before the schema fills in its defaults. */
export type AnalysisRequest = z.input<typeof analysisSchema>;

export type ArmsChoice = AnalysisParams['arms'];
export type CurveChoice = AnalysisParams['curve'];
export type NearFarRule = AnalysisParams['nearFar'];

/**
 * The project's ordering defaults as saved in `project.settings.ordering`: the analysis body
 * without the link run, resamples and seed. `patternSpeed` null: none is assumed.
 */
export type OrderingDefaults = Pick<
  AnalysisParams,
  | 'curve'
  | 'arms'
  | 'nearFar'
  | 'armWidthKpc'
  | 'sigmaStreamKms'
  | 'scaleHeightKpc'
  | 'velocityFrom'
> & { patternSpeed: number | null };

// The request and result shapes are the shared modules' own: one definition for the job that
// writes them and the page that reads them.
export type { AnalysisParams };
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
    youngMinusGasKpc: number | null;
    youngMinusGasCi95: [number, number] | null;
    patternSpeedKmsKpc: number | null;
    timescaleMyr: number | null;
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

/** A rotation-curve preset as a form offers it, with the published 1σ of its constants. */
export interface CurvePreset {
  name: ToolCurveName;
  label: string;
  source: string;
  R0Kpc: number;
  theta0Kms: number;
  R0ErrKpc: number | null;
  theta0ErrKms: number | null;
}

/** `GET /api/projects/{id}/arm-presets` (curves filtered to those the analysis accepts). */
export interface ArmPresets {
  presets: { key: string; label: string; source: string; R0Kpc: number; arms: ArmSpec[] }[];
  curves: CurvePreset[];
}
