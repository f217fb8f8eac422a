import { json, requireActor, route } from '@/lib/server/http';

export const GET = route(async (_req, actor) => {
  const a = requireActor(actor);
  return json({ id: a.id, email: a.email, name: a.name, siteRole: a.siteRole, via: a.via });
});
