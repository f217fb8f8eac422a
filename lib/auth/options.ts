/**
 * next-auth configuration: e-mail + password (credentials provider) with JWT sessions. The JWT
 * holds the user id and the account's session version at sign-in (`sv`); every request checks both
 * against the user row (lib/server/actor.ts), so disabling an account, a password reset and "sign out
 * everywhere" end every session at once. Sessions expire after 12 hours without use.
 */
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { checkCredentials } from '../server/users';
import { RateLimitedError } from '../server/ratelimit';
import { clientAddressOf } from '../server/client-address';
import { safeCallbackPath } from './callback';

export const SESSION_MAX_AGE = 12 * 60 * 60;


/** The client address of next-auth's request (its headers are a Headers object or a plain record). */
function ipOf(req: unknown): string {
  const h = (req as { headers?: unknown })?.headers;
  if (h && typeof (h as Headers).get === 'function') return clientAddressOf(h as Headers);
  const rec = (h ?? {}) as Record<string, string | string[] | undefined>;
  return clientAddressOf({
    get: (name: string) => {
      const v = rec[name.toLowerCase()];
      return v === undefined ? null : Array.isArray(v) ? v.join(', ') : v;
    },
  });
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
          if (r.ok) return { id: String(r.user.id), email: r.user.email, name: r.user.name, sv: r.user.sessionVersion };
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
    // next-auth's own redirects (sign-out, its error page) follow the same rule as the sign-in form.
    async redirect({ url, baseUrl }) {
      return new URL(safeCallbackPath(url, baseUrl, '/'), baseUrl).toString();
    },
    async jwt({ token, user }) {
      if (user) {
        token.uid = Number(user.id);
        token.sv = Number((user as { sv?: number }).sv ?? 0);
      }
      return token;
    },
    async session({ session, token }) {
      if (session.user) (session.user as { id?: number }).id = Number(token.uid);
      return session;
    },
  },
};
