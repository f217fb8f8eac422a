import { ApiError } from '@/lib/server/errors';
import { clientAddress, requireActor, route } from '@/lib/server/http';
import { SESSION_COOKIES } from '@/lib/server/actor';
import { signOutEverywhere } from '@/lib/server/users';

/**
 * Sign out everywhere: every session of the account ends (this one too), on every device. API tokens
 * are separate credentials and stay; revoke them on the tokens page.
 */
export const DELETE = route(async (req, actor) => {
  const a = requireActor(actor);
  if (a.via !== 'session') throw new ApiError('forbidden', 'Sign in with the browser to end your sessions; an API token cannot.');
  await signOutEverywhere(a, clientAddress(req));
  const headers = new Headers();
  for (const name of SESSION_COOKIES) {
    headers.append('set-cookie', `${name}=; Path=/; Max-Age=0; HttpOnly; SameSite=Lax${name.startsWith('__Secure-') ? '; Secure' : ''}`);
  }
  return new Response(null, { status: 204, headers });
});
