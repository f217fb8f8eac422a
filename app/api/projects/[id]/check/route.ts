import { json, readJson, route, routeId } from '@/lib/server/http';
import { checkForProject, checkRequestSchema } from '@/lib/server/check';

type P = { id: string };

/** {revision} or {structure, filename?}: the Check step's report (nothing is stored). */
export const POST = route<P>(async (req, actor, p) => json(await checkForProject(actor, routeId(p.id), await readJson(req, checkRequestSchema))));
