import { requireProjectRole } from '@/lib/auth/access';
import { route } from '@/lib/http/handler';
import { runExportQuerySchema } from '@/lib/export/query';
import { textToByteStream } from '@/lib/export/stream';
import { runProject } from '@/lib/services/link-runs';
import { runVotable } from '@/lib/services/run-exports';

export const GET = route<{ runId: string }>(async (req, { runId }) => {
  await requireProjectRole(await runProject(runId), 'viewer', req);
  const { shape, columns } = runExportQuerySchema.parse(
    Object.fromEntries(new URL(req.url).searchParams),
  );
  return new Response(
    textToByteStream(await runVotable(runId, shape, { originalColumns: columns === 'original' })),
    {
      headers: {
        'content-type': 'application/x-votable+xml',
        'content-disposition': `attachment; filename="link-run-${runId.slice(0, 8)}-${shape}${columns === 'original' ? '-joined' : ''}.vot"`,
      },
    },
  );
});
