/**
 * next-auth configuration: e-mail + password (credentials provider) with JWT sessions. The JWT
 * holds only the user id; every request re-reads the user (lib/server/actor.ts), so disabling an
 * account takes effect at once. Sessions expire after 12 hours without use.
 */
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { checkCredentials } from '../server/users';
import { RateLimitedError } from '../server/ratelimit';

export const SESSION_MAX_AGE = 12 * 60 * 60;


function ipOf(req: unknown): string {
  const h = (req as { headers?: Record<string, string | string[] | undefined> })?.headers ?? {};
  const f = h['x-forwarded-for'];
  return (Array.isArray(f) ? f[0] : f)?.split(',')[0]?.trim() || 'local';
}

export const authOptions: NextAuthOptions = {
  secret: process.env.NEXTAUTH_SECRET,
  session: { strategy: 'jwt', maxAge: SESSION_MAX_AGE, updateAge: 60 * 60 },
  jwt: { maxAge: SESSION_MAX_AGE },
  pages: { signIn: '/signin', error: '/signin' },
  providers: [
    CredentialsProvider({
      name: 'E-mail and password',
      credentials: { email: { label: 'E-mail', type: 'email' }, password: { label: 'Password', type: 'password' } },
      async authorize(credentials, req) {
        const email = String(credentials?.email ?? '');
        const password = String(credentials?.password ?? '');
        if (!email || !password || email.length > 254 || password.length > 1000) return null;
        try {
          const r = await checkCredentials(email, password, ipOf(req));
          if (r.ok) return { id: String(r.user.id), email: r.user.email, name: r.user.name };
          if (r.reason === 'invalid') return null;
          throw new Error(r.reason);
        } catch (e) {
          if (e instanceof RateLimitedError) throw new Error('rate_limited');
          throw e;
        }
      },
    }),
  ],
  callbacks: {
    async jwt({ token, user }) {
      if (user) token.uid = Number(user.id);
      return token;
    },
    async session({ session, token }) {
      if (session.user) (session.user as { id?: number }).id = Number(token.uid);
      return session;
    },
  },
};
