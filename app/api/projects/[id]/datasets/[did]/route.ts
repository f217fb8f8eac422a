import { attachmentHeaders, route, routeId } from '@/lib/server/http';
import { datasetBytes, deleteDataset } from '@/lib/server/datasets';

type P = { id: string; did: string };

export const GET = route<P>(async (_req, actor, p) => {
  const { info, bytes } = await datasetBytes(actor, routeId(p.id), routeId(p.did, 'dataset'));
  return new Response(new Uint8Array(bytes), {
    headers: {
      ...attachmentHeaders(info.filename),
      'x-tauforge-sha256': info.sha256,
      'cache-control': 'private, no-cache',
    },
  });
});

export const DELETE = route<P>(async (_req, actor, p) => {
  await deleteDataset(actor, routeId(p.id), routeId(p.did, 'dataset'));
  return new Response(null, { status: 204 });
});
