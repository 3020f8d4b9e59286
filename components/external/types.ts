/**
 * The external-galaxy analysis as the browser reads it from `GET /api/analyses/{id}`: the result
 * of `runExternalAnalysis` (lib/external/analysis.ts) as the analysis job stores it, with typed
 * arrays as plain lists, each source's tracer kind, the galaxy it ran with and what went in.
 * Angles in degrees, disc radii in kpc, angular speeds in km/s/kpc, times in Myr; offsets young
 * minus gas, positive ahead in the sense of rotation.
 */
import type { ExternalAnalysisResult } from '@/lib/external/analysis';
import type { ArmsFit } from '@/lib/external/arms-fit';
import type { ExternalGalaxy } from '@/lib/external/types';
import type { PatternFit } from '@/lib/ordering/pattern-fit';
import type { ExternalAnalysisParams } from '@/lib/schemas/analyses';
import type { TracerKind } from '@/lib/tracers';
import type { AnalysisStatus, Person } from '@/components/ordering/types';

export type ExternalFitJson = Omit<PatternFit, 'usedBins'> & { usedBins: number[] };

export type ExternalResultJson = Omit<ExternalAnalysisResult, 'fit' | 'sources' | 'armsFit'> & {
  kind: 'external-galaxy';
  galaxy: ExternalGalaxy & { name: string | null };
  fit: ExternalFitJson | null;
  armsFit: ArmsFit | null;
  input: {
    catalogs: { id: string; name: string; kind: TracerKind; n: number }[];
    gasKinds: TracerKind[];
    youngKinds: TracerKind[];
  };
  sources: { RKpc: number[]; phiDeg: number[]; kind: TracerKind[] };
};

/** `GET /api/analyses/{id}` → `analysis` for an external galaxy. */
export interface ExternalAnalysis {
  id: string;
  kind: 'external-galaxy';
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
  kind: string;
  status: AnalysisStatus;
  progress: number;
  params: { arms?: number };
  createdAt: string;
  summary: {
    patternSpeedKmsKpc?: number | null;
    timescaleMyr?: number | null;
    nullTestPValue?: number | null;
  } | null;
}
