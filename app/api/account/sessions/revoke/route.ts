import { requireUser } from '@/lib/auth/access';
import { json, route } from '@/lib/http/handler';
import { endAllSessions } from '@/lib/services/users';

/** "Sign out everywhere": ends every session of the caller, this one too; API tokens stay. */
export const POST = route(async (req) => {
  const user = await requireUser(req);
  await endAllSessions(user.id);
  return json({ ok: true });
});
