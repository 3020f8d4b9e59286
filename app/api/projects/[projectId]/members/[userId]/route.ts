import { requireProjectRole } from '@/lib/auth/access';
import { json, jsonBody, route } from '@/lib/http/handler';
import { changeRole, changeRoleSchema, removeMember } from '@/lib/services/members';

type P = { projectId: string; userId: string };

export const PATCH = route<P>(async (req, { projectId, userId }) => {
  const { user } = await requireProjectRole(projectId, 'owner', req, 'change roles');
  const { role } = changeRoleSchema.parse(await jsonBody(req));
  await changeRole(projectId, user.id, userId, role);
  return json({ member: { userId, role } });
});

/** Owners remove anyone; any member may remove themselves (leave). */
export const DELETE = route<P>(async (req, { projectId, userId }) => {
  const self = await requireProjectRole(projectId, 'viewer', req);
  if (self.user.id !== userId) await requireProjectRole(projectId, 'owner', req, 'remove members');
  await removeMember(projectId, self.user.id, userId);
  return new Response(null, { status: 204 });
});
