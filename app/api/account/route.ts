import { requireUser } from '@/lib/auth/access';
import { json, jsonBody, route } from '@/lib/http/handler';
import { accountPatchSchema } from '@/lib/schemas/account';
import { getUser, setNotifyRunEmails } from '@/lib/services/users';

export const GET = route(async (req) => json({ user: await requireUser(req) }));

export const PATCH = route(async (req) => {
  const user = await requireUser(req);
  const input = accountPatchSchema.parse(await jsonBody(req));
  await setNotifyRunEmails(user.id, input.notifyRunEmails);
  return json({ user: await getUser(user.id) });
});
