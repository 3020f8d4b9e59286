import { requireProjectRole } from '@/lib/auth/access';
import { json, jsonBody, route } from '@/lib/http/handler';
import { invite, inviteSchema, listMembers } from '@/lib/services/members';

type P = { projectId: string };

export const GET = route<P>(async (req, { projectId }) => {
  await requireProjectRole(projectId, 'viewer', req);
  return json(await listMembers(projectId));
});

export const POST = route<P>(async (req, { projectId }) => {
  const { user } = await requireProjectRole(projectId, 'owner', req, 'invite members');
  const input = inviteSchema.parse(await jsonBody(req));
  return json(await invite(projectId, user.id, input), 201);
});
