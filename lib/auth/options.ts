import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { env } from '@/lib/env';
import { clientAddressOf } from '@/lib/http/client-address';
import { endAllSessions, verifyCredentials } from '@/lib/services/users';
import { safeNext } from './safe-next';

const secure = env().NEXTAUTH_URL.startsWith('https://');

/**
 * next-auth with e-mail and password. Sessions are JWTs in an httpOnly, SameSite=Lax cookie
 * (Secure behind HTTPS) that carry the user's session version (`sv`); the access check reloads
 * the user on each request and refuses a session whose version is no longer the user's, so
 * sign-out, a password reset and "sign out everywhere" end sessions at once, as do a removed
 * account or role.
 */
export const authOptions: NextAuthOptions = {
  secret: process.env.NEXTAUTH_SECRET,
  session: { strategy: 'jwt', maxAge: 30 * 24 * 3600 },
  pages: { signIn: '/signin' },
  useSecureCookies: secure,
  cookies: {
    sessionToken: {
      name: secure ? '__Secure-lanewise.session' : 'lanewise.session',
      options: { httpOnly: true, sameSite: 'lax', path: '/', secure },
    },
  },
  providers: [
    CredentialsProvider({
      name: 'E-mail and password',
      credentials: { email: { type: 'email' }, password: { type: 'password' } },
      async authorize(credentials, req) {
        if (!credentials?.email || !credentials.password) return null;
        const user = await verifyCredentials(
          credentials.email,
          credentials.password,
          clientAddressOf(req?.headers),
        );
        return user
          ? { id: user.id, email: user.email, name: user.name, sv: user.sessionVersion }
          : null;
      },
    }),
  ],
  callbacks: {
    jwt({ token, user }) {
      if (user) {
        token.sub = user.id;
        token.sv = (user as { sv?: number }).sv;
      }
      return token;
    },
    session({ session, token }) {
      if (session.user && token.sub) {
        Object.assign(session.user, { id: token.sub, sv: token.sv });
      }
      return session;
    },
    // Where next-auth sends the browser after signing in or out: only a path on this site.
    redirect({ url, baseUrl }) {
      const path = url.startsWith(`${baseUrl}/`) ? url.slice(baseUrl.length) : url;
      return `${baseUrl}${safeNext(path)}`;
    },
  },
  events: {
    // Signing out ends the session everywhere it was copied to, not only in this browser.
    async signOut({ token }) {
      if (token?.sub) await endAllSessions(token.sub);
    },
  },
};
