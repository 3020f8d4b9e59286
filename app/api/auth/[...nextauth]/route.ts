import NextAuth from 'next-auth';
import { NextResponse } from 'next/server';
import { authOptions } from '@/lib/auth/options';
import { clientAddressOf } from '@/lib/http/client-address';
import { signInRefusal } from '@/lib/services/rate-limits';

const nextAuth = NextAuth(authOptions);

type Ctx = { params: Promise<{ nextauth: string[] }> };

export const GET = nextAuth;

const refuse = (status: number, code: string, message: string, headers?: HeadersInit) =>
  NextResponse.json({ error: { code, message } }, { status, headers });

/**
 * Every form next-auth reads is checked here first: it must be a URL-encoded form with each
 * field once (next-auth keeps the last of repeated fields, which would let a limit check read a
 * different address than the sign-in uses). A credentials sign-in past a limit answers 429
 * before any password is checked.
 */
export async function POST(req: Request, ctx: Ctx) {
  const type = req.headers.get('content-type') ?? '';
  if (!type.toLowerCase().startsWith('application/x-www-form-urlencoded')) {
    return refuse(
      415,
      'unsupported_media_type',
      'Send the sign-in form as application/x-www-form-urlencoded (csrfToken, email, password).',
    );
  }
  const form = new URLSearchParams(await req.clone().text());
  const keys = [...form.keys()];
  const repeated = keys.find((k, i) => keys.indexOf(k) !== i);
  if (repeated !== undefined) {
    return refuse(400, 'invalid_input', `${repeated}: this field is given more than once.`);
  }
  const { nextauth } = await ctx.params;
  if (nextauth.join('/') === 'callback/credentials') {
    const email = (form.get('email') ?? '').trim().toLowerCase();
    const refusal = email ? await signInRefusal(email, clientAddressOf(req.headers)) : null;
    if (refusal) {
      return refuse(429, 'rate_limited', refusal.message, {
        'Retry-After': String(refusal.retryAfterSeconds),
      });
    }
  }
  return nextAuth(req, ctx);
}
