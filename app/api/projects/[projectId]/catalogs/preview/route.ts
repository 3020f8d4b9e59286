import { requireProjectRole } from '@/lib/auth/access';
import { json, route } from '@/lib/http/handler';
import { previewUpload } from '@/lib/services/uploads';

/** The start of a file → its parsed first rows and the suggested column mapping. Nothing is kept. */
export const POST = route<{ projectId: string }>(async (req, { projectId }) => {
  await requireProjectRole(projectId, 'editor', req, 'upload catalogs');
  return json(await previewUpload(req));
});
