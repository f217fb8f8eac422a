import NextAuth from 'next-auth';
import { authOptions } from '@/lib/auth/options';

// next-auth's own endpoints (sign-in form post, CSRF token, session, sign-out).
const handler = NextAuth(authOptions);
export { handler as GET, handler as POST };
