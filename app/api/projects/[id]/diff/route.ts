import { json, readQuery, route, routeId } from '@/lib/server/http';
import { diffQuery, diffRevisions } from '@/lib/server/revisions';

type P = { id: string };

export const GET = route<P>(async (req, actor, p) => json(await diffRevisions(actor, routeId(p.id), readQuery(req, diffQuery))));
