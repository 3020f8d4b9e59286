import { clientAddressOf } from '@/lib/http/client-address';
import { json, jsonBody, route } from '@/lib/http/handler';
import { resetPassword } from '@/lib/services/users';

/** Sets the new password; this also ends every session and revokes every API token. */
export const POST = route(async (req) => {
  await resetPassword(await jsonBody(req), clientAddressOf(req.headers));
  return json({ ok: true });
});
