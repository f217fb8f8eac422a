import { attachmentHeaders, route, routeId } from '@/lib/server/http';
import { downloadExport } from '@/lib/server/exports';

type P = { id: string };

export const GET = route<P>(async (_req, actor, p) => {
  const { info, bytes } = await downloadExport(actor, routeId(p.id, 'export'));
  return new Response(new Uint8Array(bytes), {
    status: 200,
    headers: {
      ...attachmentHeaders(info.filename),
      'content-length': String(bytes.length),
      etag: `"${info.sha256}"`,
      'x-tauforge-sha256': info.sha256,
      'x-tauforge-params-hash': info.paramsHash,
      'x-tauforge-engine': info.engineVersion,
      'cache-control': 'private, no-cache',
    },
  });
});
