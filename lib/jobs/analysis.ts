import { executeAnalysis, failAnalysis } from '@/lib/services/analyses';
import { registerJobHandler } from './handlers';

const analysisIdOf = (payload: Record<string, unknown>) => String(payload.analysisId);

registerJobHandler('analysis', {
  run: ({ job, progress }) => executeAnalysis(analysisIdOf(job.payload), progress),
  cleanup: (job, reason) => failAnalysis(analysisIdOf(job.payload), reason),
});
