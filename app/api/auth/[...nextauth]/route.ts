import NextAuth from 'next-auth';
import { NextResponse } from 'next/server';
import { authOptions } from '@/lib/auth/options';
import { signInBlocked } from '@/lib/services/users';

const nextAuth = NextAuth(authOptions);

type Ctx = { params: Promise<{ nextauth: string[] }> };

export const GET = nextAuth;

/** Sign-in attempts past the per-address limit answer 429 before any password is checked. */
export async function POST(req: Request, ctx: Ctx) {
  const { nextauth } = await ctx.params;
  if (nextauth.join('/') === 'callback/credentials') {
    const form = await req.clone().formData();
    const email = String(form.get('email') ?? '')
      .trim()
      .toLowerCase();
    if (email && (await signInBlocked(email))) {
      return NextResponse.json(
        {
          error: {
            code: 'rate_limited',
            message:
              'Too many sign-in attempts for this address; wait a few minutes and try again.',
          },
        },
        { status: 429, headers: { 'Retry-After': '300' } },
      );
    }
  }
  return nextAuth(req, ctx);
}
