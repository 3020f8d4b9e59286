import { after } from 'next/server';
import { clientAddressOf } from '@/lib/http/client-address';
import { json, jsonBody, route } from '@/lib/http/handler';
import { acceptPasswordResetRequest, sendPasswordReset } from '@/lib/services/users';

/**
 * Always 202, known address or not. The account lookup and the mail run after the answer has
 * been sent, so neither the answer nor its timing reveals who has an account.
 */
export const POST = route(async (req) => {
  const email = await acceptPasswordResetRequest(await jsonBody(req), clientAddressOf(req.headers));
  after(() =>
    sendPasswordReset(email).catch((e) =>
      console.error('[reset] mail not sent:', e instanceof Error ? e.message : e),
    ),
  );
  return json({ ok: true }, 202);
});
