/** The actor for server components and pages, from the request's cookies. */
import { cache } from 'react';
import { cookies } from 'next/headers';
import type { Actor } from './authz';
import { actorFromSessionToken, SESSION_COOKIES } from './actor';

/**
 * Cached for one request (React `cache`): the header's user menu, a layout and its page all ask who
 * is signing in, and the user row is read once.
 */
export const currentActor = cache(async (): Promise<Actor | null> => {
  const jar = await cookies();
  for (const name of SESSION_COOKIES) {
    const v = jar.get(name)?.value;
    if (v) return actorFromSessionToken(v);
  }
  return null;
});
