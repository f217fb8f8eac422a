import { z } from 'zod';
import { ApiError } from '@/lib/server/errors';
import { json, readJson, readQuery, requireActor, route } from '@/lib/server/http';
import { acceptInvitation, acceptSchema, checkInvitation } from '@/lib/server/members';

/** What an invitation link is for (project, role, address), without accepting it. */
export const GET = route(async (req) => {
  const { token } = readQuery(req, z.object({ token: z.string().min(10).max(2000) }));
  const inv = await checkInvitation(token);
  if (!inv) throw new ApiError('not_found', 'This invitation link is not valid any more (expired, used or withdrawn).');
  return json({ projectName: inv.projectName, email: inv.email, role: inv.role, expiresAt: inv.expiresAt });
});

/** Accept: {token}; the signed-in address must be the invited one. */
export const POST = route(async (req, actor) => {
  const a = requireActor(actor);
  const { token } = await readJson(req, acceptSchema);
  return json(await acceptInvitation(a, token));
});
