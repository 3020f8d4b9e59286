import { requireUser } from '@/lib/auth/access';
import { route } from '@/lib/http/handler';
import { revokeToken } from '@/lib/services/tokens';

export const DELETE = route<{ tokenId: string }>(async (req, { tokenId }) => {
  const user = await requireUser(req);
  await revokeToken(user.id, tokenId);
  return new Response(null, { status: 204 });
});
