import { requireProjectRole } from '@/lib/auth/access';
import { json, route } from '@/lib/http/handler';
import { armPresets } from '@/lib/services/analyses';

export const GET = route<{ projectId: string }>(async (req, { projectId }) => {
  await requireProjectRole(projectId, 'viewer', req);
  return json(armPresets());
});
