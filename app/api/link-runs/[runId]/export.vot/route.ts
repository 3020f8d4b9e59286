import { z } from 'zod';
import { requireProjectRole } from '@/lib/auth/access';
import { route } from '@/lib/http/handler';
import { textToByteStream } from '@/lib/export/stream';
import { runProject } from '@/lib/services/link-runs';
import { runVotable } from '@/lib/services/run-exports';

const shapeSchema = z.object({ shape: z.enum(['links', 'complexes', 'sources']).default('links') });

export const GET = route<{ runId: string }>(async (req, { runId }) => {
  const { shape } = shapeSchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  await requireProjectRole(await runProject(runId), 'viewer', req);
  return new Response(textToByteStream(await runVotable(runId, shape)), {
    headers: {
      'content-type': 'application/x-votable+xml',
      'content-disposition': `attachment; filename="link-run-${runId.slice(0, 8)}-${shape}.vot"`,
    },
  });
});
