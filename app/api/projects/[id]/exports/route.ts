import { json, readJson, readQuery, route, routeId } from '@/lib/server/http';
import { createExport, createExportSchema, exportListQuery, listExports } from '@/lib/server/exports';

type P = { id: string };

export const GET = route<P>(async (req, actor, p) => json(await listExports(actor, routeId(p.id), readQuery(req, exportListQuery))));

/**
 * {revision, format}: 200 with the stored export when it exists; otherwise 202 with the export job
 * (Location: the job's URL; poll it, its result names the export).
 */
export const POST = route<P>(async (req, actor, p) => {
  const r = await createExport(actor, routeId(p.id), await readJson(req, createExportSchema));
  if ('export' in r) return json({ ...r.export, reused: true }, 200);
  return json({ job: r.job, coalesced: r.coalesced }, 202, { location: r.job.url });
});
