/** Loading data for server-rendered pages: service errors become Next.js 404s or sign-in redirects. */
import { notFound, redirect } from 'next/navigation';
import { ApiError } from './errors';
import { getProject, type ProjectDetail } from './projects';
import { currentActor } from './session';
import type { Actor } from './actor';
import { idSchema } from './http';

export async function requireSignedIn(back: string): Promise<Actor> {
  const actor = await currentActor();
  if (!actor) redirect(`/signin?callbackUrl=${encodeURIComponent(back)}`);
  return actor;
}

export async function projectForPage(rawId: string, back: string): Promise<{ actor: Actor | null; project: ProjectDetail }> {
  const actor = await currentActor();
  const id = idSchema.safeParse(rawId);
  if (!id.success) notFound();
  try {
    return { actor, project: await getProject(actor, id.data) };
  } catch (e) {
    if (e instanceof ApiError && e.code === 'not_found') {
      if (!actor) redirect(`/signin?callbackUrl=${encodeURIComponent(back)}`);
      notFound();
    }
    throw e;
  }
}
