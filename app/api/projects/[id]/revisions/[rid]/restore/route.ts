import { json, readJson, route, routeId } from '@/lib/server/http';
import { access } from '@/lib/server/authz';
import { restoreRevision, restoreSchema } from '@/lib/server/revisions';

type P = { id: string; rid: string };

/** A new revision that copies an old one; the old one stays as it was. Body {baseRevision, message?}: 409 with the newer head when baseRevision is stale. */
export const POST = route<P>(async (req, actor, p) => {
  const id = routeId(p.id);
  await access(actor, id, 'edit');
  const rev = await restoreRevision(actor, id, routeId(p.rid, 'revision'), await readJson(req, restoreSchema));
  return json(rev, 201, { location: `/api/projects/${id}/revisions/${rev.id}` });
});
