import { PROJECT_DELETE_JOB, purgeProject } from '@/lib/services/project-purge';
import { registerJobHandler } from './handlers';

const projectIdOf = (payload: Record<string, unknown>) => String(payload.projectId);

registerJobHandler(PROJECT_DELETE_JOB, {
  run: ({ job, progress }) => purgeProject(projectIdOf(job.payload), progress),
  // Nobody can ask again (the members are gone), so a job given up on gets one more pass; the
  // purge resumes wherever the last one stopped.
  cleanup: (job) => purgeProject(projectIdOf(job.payload), async () => undefined),
});
