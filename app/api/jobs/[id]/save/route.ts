import { json, readJson, route, routeId } from '@/lib/server/http';
import { savePointSchema, saveSweepPoint } from '@/lib/server/queue/service';

type P = { id: string };

/** {point?, message?}: save a sweep point (the best unless named) as a new revision: 201 with it. */
export const POST = route<P>(async (req, actor, p) => json(await saveSweepPoint(actor, routeId(p.id, 'job'), await readJson(req, savePointSchema)), 201));
