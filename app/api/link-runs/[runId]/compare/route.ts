import { z } from 'zod';
import { requireProjectRole } from '@/lib/auth/access';
import { notFound } from '@/lib/http/errors';
import { json, route } from '@/lib/http/handler';
import { compareRuns, runProject } from '@/lib/services/link-runs';

export const GET = route<{ runId: string }>(async (req, { runId }) => {
  const projectId = await runProject(runId);
  await requireProjectRole(projectId, 'viewer', req);
  const { with: other } = z
    .object({ with: z.string().min(1) })
    .parse(Object.fromEntries(new URL(req.url).searchParams));
  // A run of another project is "not found" whatever its state, before its state is read.
  if ((await runProject(other)) !== projectId) throw notFound('Link run');
  return json(await compareRuns(runId, other));
});
