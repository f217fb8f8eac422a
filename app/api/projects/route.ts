import { json, readJson, readQuery, requireActor, route } from '@/lib/server/http';
import { createProject, createProjectSchema, listProjects, projectListQuery } from '@/lib/server/projects';

export const GET = route(async (req, actor) => json(await listProjects(actor, readQuery(req, projectListQuery))));

export const POST = route(async (req, actor) => {
  const a = requireActor(actor);
  const project = await createProject(a, await readJson(req, createProjectSchema));
  return json(project, 201, { location: `/api/projects/${project.id}` });
});
