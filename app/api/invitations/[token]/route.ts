import { requireUser } from '@/lib/auth/access';
import { json, route } from '@/lib/http/handler';
import { acceptInvitation, describeInvitation } from '@/lib/services/members';

type P = { token: string };

/** Anyone holding the link may see what it offers; accepting needs the invited account. */
export const GET = route<P>(async (_req, { token }) =>
  json({ invitation: await describeInvitation(token) }),
);

export const POST = route<P>(async (req, { token }) => {
  const user = await requireUser(req);
  return json(await acceptInvitation(token, user));
});
