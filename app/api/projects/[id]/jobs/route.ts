import { json, parseWith, readJson, readQuery, route, routeId } from '@/lib/server/http';
import { jobListQuery, listJobs, startJob } from '@/lib/server/queue/service';
import { startJobSchema } from '@/lib/server/queue/kinds';
import { createExport, createExportSchema } from '@/lib/server/exports';

type P = { id: string };

export const GET = route<P>(async (req, actor, p) => json(await listJobs(actor, routeId(p.id), readQuery(req, jobListQuery))));

/**
 * {kind: diffraction | index | sweep | export, …}: 202 with the queued job (Location: its URL), the same
 * pending job for an identical request. An export that is already stored answers 200 with it.
 */
export const POST = route<P>(async (req, actor, p) => {
  const id = routeId(p.id);
  const body = await readJson(req, startJobSchema);
  if (body.kind === 'export') {
    const { kind: _kind, ...rest } = body;
    void _kind;
    const r = await createExport(actor, id, parseWith(createExportSchema, rest));
    if ('export' in r) return json({ export: r.export, reused: true }, 200);
    return json({ ...r.job, coalesced: r.coalesced }, 202, { location: r.job.url });
  }
  const r = await startJob(actor, id, body);
  return json({ ...r.job, coalesced: r.coalesced }, 202, { location: r.job.url });
});
