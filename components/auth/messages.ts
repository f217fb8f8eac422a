/** What the sign-in page says for each error code next-auth hands back (lib/auth/options.ts throws them). */
export const SIGNIN_ERRORS: Record<string, string> = {
  CredentialsSignin: 'That e-mail and password do not match an account that can sign in.',
  unverified: 'Confirm your address first: open the link in the message we sent when you signed up.',
  disabled: 'This account has been disabled. Ask a site admin if you think this is a mistake.',
  rate_limited: 'Too many sign-in attempts. Wait a few minutes and try again.',
  SessionRequired: 'Sign in to see that page.',
};

export function signinMessage(code: string | null | undefined): string | null {
  if (!code) return null;
  return SIGNIN_ERRORS[code] ?? 'Signing in did not work. Try again.';
}
