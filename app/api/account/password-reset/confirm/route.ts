import { z } from 'zod';
import { json, jsonBody, route } from '@/lib/http/handler';
import { resetPassword } from '@/lib/services/users';

export const POST = route(async (req) => {
  const { token, password } = z
    .object({ token: z.string().min(1), password: z.string() })
    .parse(await jsonBody(req));
  await resetPassword(token, password);
  return json({ ok: true });
});
