import { json, readJson, route, routeId } from '@/lib/server/http';
import { forkProject, forkSchema } from '@/lib/server/projects';

type P = { id: string };

export const POST = route<P>(async (req, actor, p) => {
  const project = await forkProject(actor, routeId(p.id), await readJson(req, forkSchema));
  return json(project, 201, { location: `/api/projects/${project.id}` });
});
