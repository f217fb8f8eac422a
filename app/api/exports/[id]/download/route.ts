import { attachmentHeaders, route, routeId } from '@/lib/server/http';
import { downloadExport } from '@/lib/server/exports';

type P = { id: string };

export const GET = route<P>(async (_req, actor, p) => {
  const { info, body } = await downloadExport(actor, routeId(p.id, 'export'));
  return new Response(body, {
    status: 200,
    headers: {
      ...attachmentHeaders(info.filename),
      'content-length': String(info.size),
      etag: `"${info.sha256}"`,
      'x-tauforge-sha256': info.sha256,
      'x-tauforge-params-hash': info.paramsHash,
      'x-tauforge-engine': info.engineVersion,
      'cache-control': 'private, no-cache',
    },
  });
});
