import { requireUser } from '@/lib/auth/access';
import { json, jsonBody, route } from '@/lib/http/handler';
import { createToken, createTokenSchema, listTokens } from '@/lib/services/tokens';

export const GET = route(async (req) => {
  const user = await requireUser(req);
  return json({ tokens: await listTokens(user.id) });
});

export const POST = route(async (req) => {
  const user = await requireUser(req);
  const { name } = createTokenSchema.parse(await jsonBody(req));
  const created = await createToken(user.id, name);
  return json(
    { token: created.token, id: created.id, name: created.name, prefix: created.prefix },
    201,
  );
});
