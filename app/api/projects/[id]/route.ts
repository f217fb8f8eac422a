import { json, readJson, route, routeId } from '@/lib/server/http';
import { deleteProject, getProject, updateProject, updateProjectSchema } from '@/lib/server/projects';

type P = { id: string };

export const GET = route<P>(async (_req, actor, p) => json(await getProject(actor, routeId(p.id))));

export const PATCH = route<P>(async (req, actor, p) => {
  const id = routeId(p.id);
  const input = await readJson(req, updateProjectSchema);
  return json(await updateProject(actor, id, input));
});

export const DELETE = route<P>(async (_req, actor, p) => {
  await deleteProject(actor, routeId(p.id));
  return new Response(null, { status: 204 });
});
