import { json, readQuery, route, routeId } from '@/lib/server/http';
import { pointListQuery, sweepPoints } from '@/lib/server/queue/service';

type P = { id: string };

/** A sweep's grid points ranked by R_wp (best first). */
export const GET = route<P>(async (req, actor, p) => json(await sweepPoints(actor, routeId(p.id, 'job'), readQuery(req, pointListQuery))));
