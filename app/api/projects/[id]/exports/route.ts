import { json, readJson, readQuery, route, routeId } from '@/lib/server/http';
import { createExport, createExportSchema, exportListQuery, listExports } from '@/lib/server/exports';

type P = { id: string };

export const GET = route<P>(async (req, actor, p) => json(await listExports(actor, routeId(p.id), readQuery(req, exportListQuery))));

/** {revision, format}: 201 with a new export, 200 with the stored one when it already exists. */
export const POST = route<P>(async (req, actor, p) => {
  const r = await createExport(actor, routeId(p.id), await readJson(req, createExportSchema));
  return json({ ...r.export, reused: r.reused }, r.reused ? 200 : 201);
});
