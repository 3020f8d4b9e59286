import { requireSiteAdmin } from '@/lib/auth/access';
import { json, route } from '@/lib/http/handler';
import { listUsers } from '@/lib/services/users';

export const GET = route(async (req) => {
  await requireSiteAdmin(req);
  const users = await listUsers();
  return json({ users: users.map((u) => ({ ...u, createdAt: u.createdAt.toISOString() })) });
});
