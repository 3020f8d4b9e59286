/**
 * The external-galaxy analysis as the browser reads it from `GET /api/analyses/{id}`: the result
 * of `runExternalAnalysis` (lib/external/analysis.ts) after JSON, where typed arrays arrive as
 * plain arrays (or as index-keyed objects, which {@link column} reads the same way). Angles in
 * degrees, disc radii in kpc, angular speeds in km/s/kpc, times in Myr; offsets young minus gas,
 * positive ahead in the sense of rotation.
 */
import type { ExternalAnalysisResult } from '@/lib/external/analysis';
import type { ArmsFit } from '@/lib/external/arms-fit';
import type { PatternFit } from '@/lib/ordering/pattern-fit';
import type { ExternalAnalysisParams } from '@/lib/schemas/analyses';
import type { AnalysisStatus, Person } from '@/components/ordering/types';

/** A numeric column after JSON: an array, or the object JSON makes of a typed array. */
export type JsonColumn = number[] | Record<string, number>;

export type ExternalFitJson = Omit<PatternFit, 'usedBins'> & { usedBins: JsonColumn };

export type ExternalResultJson = Omit<ExternalAnalysisResult, 'fit' | 'sources' | 'armsFit'> & {
  fit: ExternalFitJson | null;
  armsFit: ArmsFit | null;
  sources: { RKpc: JsonColumn; phiDeg: JsonColumn; classCode: JsonColumn };
};

/** `GET /api/analyses/{id}` → `analysis` for an external galaxy. */
export interface ExternalAnalysis {
  id: string;
  status: AnalysisStatus;
  progress: number;
  params: ExternalAnalysisParams;
  error: string | null;
  createdAt: string;
  createdBy: Person | string | null;
  result: ExternalResultJson | null;
}

/** One row of `GET /api/projects/{id}/analyses`, as far as the external view reads it. */
export interface ExternalAnalysisListItem {
  id: string;
  status: AnalysisStatus;
  progress: number;
  params: { kind?: string; catalogIds?: string[]; arms?: number; seed?: number };
  createdAt: string;
  summary: { patternSpeedKmsKpc?: number | null; timescaleMyr?: number | null } | null;
}

/** The values of a column in index order. */
export function column(c: JsonColumn): number[] {
  return Array.isArray(c) ? c : Object.values(c);
}
