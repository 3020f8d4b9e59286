import { requireProjectRole } from '@/lib/auth/access';
import { route } from '@/lib/http/handler';
import { runExportQuerySchema } from '@/lib/export/query';
import { textToByteStream } from '@/lib/export/stream';
import { runProject } from '@/lib/services/link-runs';
import { runCsv } from '@/lib/services/run-exports';

export const GET = route<{ runId: string }>(async (req, { runId }) => {
  await requireProjectRole(await runProject(runId), 'viewer', req);
  const { shape, columns } = runExportQuerySchema.parse(
    Object.fromEntries(new URL(req.url).searchParams),
  );
  const pieces = runCsv(runId, shape, { originalColumns: columns === 'original' });
  // Pull the header now so a run that is not done answers 409 instead of a broken download.
  const first = await pieces.next();
  async function* all() {
    if (!first.done) yield first.value;
    yield* pieces;
  }
  return new Response(textToByteStream(all()), {
    headers: {
      'content-type': 'text/csv; charset=utf-8',
      'content-disposition': `attachment; filename="link-run-${runId.slice(0, 8)}-${shape}${columns === 'original' ? '-joined' : ''}.csv"`,
    },
  });
});
