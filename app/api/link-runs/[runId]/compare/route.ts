import { z } from 'zod';
import { requireProjectRole } from '@/lib/auth/access';
import { json, route } from '@/lib/http/handler';
import { compareRuns, runProject } from '@/lib/services/link-runs';

export const GET = route<{ runId: string }>(async (req, { runId }) => {
  const { with: other } = z
    .object({ with: z.string().min(1) })
    .parse(Object.fromEntries(new URL(req.url).searchParams));
  await requireProjectRole(await runProject(runId), 'viewer', req);
  return json(await compareRuns(runId, other));
});
