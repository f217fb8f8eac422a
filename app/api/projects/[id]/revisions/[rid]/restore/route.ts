import { json, readJson, route, routeId } from '@/lib/server/http';
import { restoreRevision, restoreSchema } from '@/lib/server/revisions';

type P = { id: string; rid: string };

/** A new revision that copies an old one; the old one stays as it was. */
export const POST = route<P>(async (req, actor, p) => {
  const rev = await restoreRevision(actor, routeId(p.id), routeId(p.rid, 'revision'), await readJson(req, restoreSchema));
  return json(rev, 201);
});
