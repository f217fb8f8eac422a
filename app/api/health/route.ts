import { health } from '@/lib/server/health';
import { resolveActor } from '@/lib/server/actor';

export const dynamic = 'force-dynamic';

/** 200 when the database and the job queue answer, 503 when not; only a signed-in site admin sees error texts and queue counts. */
export async function GET(req?: Request) {
  let admin = false;
  if (req) {
    try {
      admin = (await resolveActor(req))?.siteRole === 'admin';
    } catch {
      admin = false; // no database, or a bad token: answer as to anyone
    }
  }
  const h = await health(admin);
  return Response.json(h, { status: h.ok ? 200 : 503, headers: { 'Cache-Control': 'no-store' } });
}
