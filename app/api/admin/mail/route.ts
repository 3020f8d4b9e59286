import { requireSiteAdmin } from '@/lib/auth/access';
import { env } from '@/lib/env';
import { HttpError } from '@/lib/http/errors';
import { json, route } from '@/lib/http/handler';
import { listCaughtMail } from '@/lib/services/mailbox';

export const GET = route(async (req) => {
  await requireSiteAdmin(req);
  if (env().LANEWISE_MODE !== 'local')
    throw new HttpError(404, 'not_found', 'Caught mail exists only in local mode.');
  return json({ messages: await listCaughtMail() });
});
