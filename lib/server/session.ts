/** The actor for server components and pages, from the request's cookies. */
import { cookies } from 'next/headers';
import type { Actor } from './actor';
import { actorFromSessionToken, SESSION_COOKIES } from './actor';

export async function currentActor(): Promise<Actor | null> {
  const jar = await cookies();
  for (const name of SESSION_COOKIES) {
    const v = jar.get(name)?.value;
    if (v) return actorFromSessionToken(v);
  }
  return null;
}
