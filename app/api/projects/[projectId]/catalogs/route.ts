import { requireProjectRole } from '@/lib/auth/access';
import { archivedFilterFromUrl } from '@/lib/schemas/catalogs';
import { json, route } from '@/lib/http/handler';
import { createCatalog, listCatalogs } from '@/lib/services/catalogs';

type P = { projectId: string };

export const GET = route<P>(async (req, { projectId }) => {
  await requireProjectRole(projectId, 'viewer', req);
  return json({ catalogs: await listCatalogs(projectId, archivedFilterFromUrl(req.url)) });
});

/** Multipart upload: file, name, kind, optional mapping (JSON), policy and decimalComma → 202 with the queued catalog. */
export const POST = route<P>(async (req, { projectId }) => {
  const { user } = await requireProjectRole(projectId, 'editor', req, 'upload catalogs');
  return json({ catalog: await createCatalog(req, projectId, user.id) }, 202);
});
