import { requireProjectRole } from '@/lib/auth/access';
import { route } from '@/lib/http/handler';
import { revokeInvitation } from '@/lib/services/members';

type P = { projectId: string; invitationId: string };

export const DELETE = route<P>(async (req, { projectId, invitationId }) => {
  await requireProjectRole(projectId, 'owner', req, 'revoke invitations');
  await revokeInvitation(projectId, invitationId);
  return new Response(null, { status: 204 });
});
