import { json, route, routeId } from '@/lib/server/http';
import { cancelJob, getJob } from '@/lib/server/queue/service';

type P = { id: string };

/** State, progress, timings and the result or error of one job. */
export const GET = route<P>(async (_req, actor, p) => json(await getJob(actor, routeId(p.id, 'job'))));

/** Cancel (the same as POST /api/jobs/{id}/cancel): 200 with the job, now cancelled. */
export const DELETE = route<P>(async (_req, actor, p) => json(await cancelJob(actor, routeId(p.id, 'job'))));
