import { clientAddressOf } from '@/lib/http/client-address';
import { json, jsonBody, route } from '@/lib/http/handler';
import { signUp } from '@/lib/services/users';

export const POST = route(async (req) => {
  const user = await signUp(await jsonBody(req), clientAddressOf(req.headers));
  return json({ user: { id: user.id, email: user.email, name: user.name } }, 201);
});
