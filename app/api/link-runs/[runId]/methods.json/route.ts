import { requireProjectRole } from '@/lib/auth/access';
import { route } from '@/lib/http/handler';
import { runProject } from '@/lib/services/link-runs';
import { runMethods } from '@/lib/services/run-exports';

export const GET = route<{ runId: string }>(async (req, { runId }) => {
  await requireProjectRole(await runProject(runId), 'viewer', req);
  return new Response(JSON.stringify(await runMethods(runId), null, 2), {
    headers: {
      'content-type': 'application/json',
      'content-disposition': `attachment; filename="link-run-${runId.slice(0, 8)}-methods.json"`,
    },
  });
});
