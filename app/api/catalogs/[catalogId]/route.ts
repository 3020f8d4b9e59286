import { requireProjectRole, requireUser } from '@/lib/auth/access';
import { json, jsonBody, route } from '@/lib/http/handler';
import { catalogPatchSchema } from '@/lib/schemas/catalogs';
import {
  catalogProject,
  deleteCatalog,
  getCatalogDetail,
  setCatalogArchived,
} from '@/lib/services/catalogs';

type P = { catalogId: string };

export const GET = route<P>(async (req, { catalogId }) => {
  await requireProjectRole(await catalogProject(catalogId), 'viewer', req);
  return json({ catalog: await getCatalogDetail(catalogId) });
});

/** `{ archived }`: hide a catalog from lists and new runs (its rows stay), or restore it. */
export const PATCH = route<P>(async (req, { catalogId }) => {
  await requireUser(req);
  const { user } = await requireProjectRole(
    await catalogProject(catalogId),
    'editor',
    req,
    'archive catalogs',
  );
  const { archived } = catalogPatchSchema.parse(await jsonBody(req));
  return json({ catalog: await setCatalogArchived(catalogId, user.id, archived) });
});

/** 204; 409 `catalog_in_use` with `details.runs` and `details.analyses` when anything reads it. */
export const DELETE = route<P>(async (req, { catalogId }) => {
  await requireUser(req);
  const { user } = await requireProjectRole(
    await catalogProject(catalogId),
    'editor',
    req,
    'delete catalogs',
  );
  await deleteCatalog(catalogId, user.id);
  return new Response(null, { status: 204 });
});
