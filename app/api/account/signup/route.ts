import { json, jsonBody, route } from '@/lib/http/handler';
import { createUser, signUpSchema } from '@/lib/services/users';

export const POST = route(async (req) => {
  const input = signUpSchema.parse(await jsonBody(req));
  const user = await createUser(input);
  return json({ user: { id: user.id, email: user.email, name: user.name } }, 201);
});
