import { requireProjectRole } from '@/lib/auth/access';
import { json, jsonBody, route } from '@/lib/http/handler';
import { linkRunSchema } from '@/lib/schemas/link-run-request';
import { estimateLinkRun } from '@/lib/services/link-run-estimate';

export const POST = route<{ projectId: string }>(async (req, { projectId }) => {
  await requireProjectRole(projectId, 'viewer', req);
  const params = linkRunSchema.parse(await jsonBody(req));
  return json(await estimateLinkRun(projectId, params));
});
