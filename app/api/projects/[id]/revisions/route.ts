import { json, readJson, readQuery, route, routeId } from '@/lib/server/http';
import { access } from '@/lib/server/authz';
import { listRevisions, revisionListQuery, saveRevision, saveRevisionSchema } from '@/lib/server/revisions';

type P = { id: string };

export const GET = route<P>(async (req, actor, p) => json(await listRevisions(actor, routeId(p.id), readQuery(req, revisionListQuery))));

/** Body {params, message, baseRevision}; 409 with the newer head when baseRevision is stale. */
export const POST = route<P>(async (req, actor, p) => {
  const id = routeId(p.id);
  // Authorise before reading the body: a stranger's body is never read.
  await access(actor, id, 'edit');
  const rev = await saveRevision(actor, id, await readJson(req, saveRevisionSchema));
  return json(rev, 201, { location: `/api/projects/${id}/revisions/${rev.id}` });
});
