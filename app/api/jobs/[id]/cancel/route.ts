import { json, route, routeId } from '@/lib/server/http';
import { cancelJob } from '@/lib/server/queue/service';

type P = { id: string };

export const POST = route<P>(async (_req, actor, p) => json(await cancelJob(actor, routeId(p.id, 'job'))));
