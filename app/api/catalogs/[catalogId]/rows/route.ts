import { requireProjectRole } from '@/lib/auth/access';
import { json, route } from '@/lib/http/handler';
import { catalogProject } from '@/lib/services/catalogs';
import { catalogRowsPage, rowsQuerySchema } from '@/lib/services/catalog-rows';

export const GET = route<{ catalogId: string }>(async (req, { catalogId }) => {
  await requireProjectRole(await catalogProject(catalogId), 'viewer', req);
  const query = rowsQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  return json(await catalogRowsPage(catalogId, query));
});
