/** Loading data for server-rendered pages: service errors become Next.js 404s or sign-in redirects. */
import { cache } from 'react';
import { notFound, redirect } from 'next/navigation';
import { ApiError } from './errors';
import { getProject, type ProjectDetail } from './projects';
import { currentActor } from './session';
import type { Actor } from './authz';
import { idSchema } from './http';

export async function requireSignedIn(back: string): Promise<Actor> {
  const actor = await currentActor();
  if (!actor) redirect(`/signin?callbackUrl=${encodeURIComponent(back)}`);
  return actor;
}

/**
 * The project behind `/projects/[id]/…` as this request's actor sees it, or `project: null` when it
 * does not exist or is hidden from them. Cached for one request (React `cache`), so the layouts and
 * the page under them read the project once.
 */
const loadProject = cache(async (rawId: string): Promise<{ actor: Actor | null; project: ProjectDetail | null }> => {
  const actor = await currentActor();
  const id = idSchema.safeParse(rawId);
  if (!id.success) return { actor, project: null };
  try {
    return { actor, project: await getProject(actor, id.data) };
  } catch (e) {
    if (e instanceof ApiError && e.code === 'not_found') return { actor, project: null };
    throw e;
  }
});

/** loadProject for a page: a hidden project is a 404, or a sign-in that comes back to `back`. */
export async function projectForPage(rawId: string, back: string): Promise<{ actor: Actor | null; project: ProjectDetail }> {
  const { actor, project } = await loadProject(rawId);
  if (!project) {
    // Only a well-formed id can be a hidden project worth signing in for.
    if (!actor && idSchema.safeParse(rawId).success) redirect(`/signin?callbackUrl=${encodeURIComponent(back)}`);
    notFound();
  }
  return { actor, project };
}
