import { failAnalysis } from '@/lib/services/analyses';
import { EXTERNAL_ANALYSIS_JOB, executeExternalAnalysis } from '@/lib/services/external-analyses';
import { registerJobHandler } from './handlers';

const analysisIdOf = (payload: Record<string, unknown>) => String(payload.analysisId);

registerJobHandler(EXTERNAL_ANALYSIS_JOB, {
  run: ({ job, progress }) => executeExternalAnalysis(analysisIdOf(job.payload), progress),
  cleanup: (job, reason) => failAnalysis(analysisIdOf(job.payload), reason),
});
