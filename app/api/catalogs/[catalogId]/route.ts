import { requireProjectRole } from '@/lib/auth/access';
import { json, route } from '@/lib/http/handler';
import { catalogProject, deleteCatalog, getCatalogDetail } from '@/lib/services/catalogs';

type P = { catalogId: string };

export const GET = route<P>(async (req, { catalogId }) => {
  await requireProjectRole(await catalogProject(catalogId), 'viewer', req);
  return json({ catalog: await getCatalogDetail(catalogId) });
});

export const DELETE = route<P>(async (req, { catalogId }) => {
  await requireProjectRole(await catalogProject(catalogId), 'editor', req, 'delete catalogs');
  await deleteCatalog(catalogId);
  return new Response(null, { status: 204 });
});
