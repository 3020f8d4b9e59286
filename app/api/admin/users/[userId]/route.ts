import { z } from 'zod';
import { requireSiteAdmin } from '@/lib/auth/access';
import { json, jsonBody, route } from '@/lib/http/handler';
import { getUser, setSiteRole } from '@/lib/services/users';

export const PATCH = route<{ userId: string }>(async (req, { userId }) => {
  const { siteRole } = z
    .object({ siteRole: z.enum(['admin', 'member']) })
    .parse(await jsonBody(req));
  const admin = await requireSiteAdmin(req);
  await setSiteRole(userId, siteRole, admin.id);
  return json({ user: await getUser(userId) });
});
