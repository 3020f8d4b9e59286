import { requireProjectRole } from '@/lib/auth/access';
import { route } from '@/lib/http/handler';
import { textToByteStream } from '@/lib/export/stream';
import { catalogProject, getCatalog } from '@/lib/services/catalogs';
import { catalogCsv } from '@/lib/services/catalog-rows';

export const GET = route<{ catalogId: string }>(async (req, { catalogId }) => {
  await requireProjectRole(await catalogProject(catalogId), 'viewer', req);
  const c = await getCatalog(catalogId);
  const lines = await catalogCsv(catalogId);
  const fileName = `${c.name.replace(/[^\w.\-]+/g, '_')}-normalised.csv`;
  return new Response(textToByteStream(lines), {
    headers: {
      'content-type': 'text/csv; charset=utf-8',
      'content-disposition': `attachment; filename="${fileName}"`,
    },
  });
});
