import { health } from '@/lib/server/health';

export const dynamic = 'force-dynamic';

export async function GET() {
  const h = await health();
  return Response.json(h, { status: h.ok ? 200 : 503, headers: { 'Cache-Control': 'no-store' } });
}
