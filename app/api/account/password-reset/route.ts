import { z } from 'zod';
import { json, jsonBody, route } from '@/lib/http/handler';
import { requestPasswordReset } from '@/lib/services/users';

/** Always 202, known address or not, so the answer does not reveal who has an account. */
export const POST = route(async (req) => {
  const { email } = z.object({ email: z.string() }).parse(await jsonBody(req));
  await requestPasswordReset(email);
  return json({ ok: true }, 202);
});
