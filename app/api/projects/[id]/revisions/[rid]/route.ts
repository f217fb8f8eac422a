import { json, route, routeId } from '@/lib/server/http';
import { getRevision } from '@/lib/server/revisions';

type P = { id: string; rid: string };

export const GET = route<P>(async (_req, actor, p) => json(await getRevision(actor, routeId(p.id), routeId(p.rid, 'revision'))));
