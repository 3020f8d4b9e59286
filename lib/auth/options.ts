import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { env } from '@/lib/env';
import { verifyCredentials } from '@/lib/services/users';

const secure = env().NEXTAUTH_URL.startsWith('https://');

/**
 * next-auth with e-mail and password. Sessions are JWTs in an httpOnly, SameSite=Lax cookie
 * (Secure behind HTTPS); the access check reloads the user from the database on each request,
 * so a removed account or role takes effect at once.
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
      async authorize(credentials) {
        if (!credentials?.email || !credentials.password) return null;
        const user = await verifyCredentials(credentials.email, credentials.password);
        return user ? { id: user.id, email: user.email, name: user.name } : null;
      },
    }),
  ],
  callbacks: {
    jwt({ token, user }) {
      if (user) token.sub = user.id;
      return token;
    },
    session({ session, token }) {
      if (session.user && token.sub) (session.user as { id?: string }).id = token.sub;
      return session;
    },
  },
};
