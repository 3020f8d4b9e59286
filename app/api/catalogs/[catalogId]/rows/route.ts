import { requireProjectRole } from '@/lib/auth/access';
import { json, route } from '@/lib/http/handler';
import { catalogProject } from '@/lib/services/catalogs';
import { catalogRowsPage, rowsQuerySchema } from '@/lib/services/catalog-rows';

export const GET = route<{ catalogId: string }>(async (req, { catalogId }) => {
  const query = rowsQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  await requireProjectRole(await catalogProject(catalogId), 'viewer', req);
  return json(await catalogRowsPage(catalogId, query));
});
