import { json, readJson, readQuery, route, routeId } from '@/lib/server/http';
import { changeRole, changeRoleSchema, invite, inviteSchema, listMembers, removeMember, removeMemberQuery, revokeInvitation } from '@/lib/server/members';

type P = { id: string };

export const GET = route<P>(async (_req, actor, p) => json(await listMembers(actor, routeId(p.id))));

/** Invite by e-mail: {email, role}. The link goes by mail; only its hash is kept. */
export const POST = route<P>(async (req, actor, p) => {
  const r = await invite(actor, routeId(p.id), await readJson(req, inviteSchema));
  return json({ invitation: r.invitation }, 201);
});

/** Change a member's role: {userId, role}. */
export const PATCH = route<P>(async (req, actor, p) => {
  const id = routeId(p.id);
  await changeRole(actor, id, await readJson(req, changeRoleSchema));
  return json(await listMembers(actor, id));
});

/** Remove a member (?userId=…, or yourself to leave) or withdraw an invitation (?invitation=…). */
export const DELETE = route<P>(async (req, actor, p) => {
  const id = routeId(p.id);
  const q = readQuery(req, removeMemberQuery);
  if (q.userId !== undefined) await removeMember(actor, id, q.userId);
  else await revokeInvitation(actor, id, q.invitation!);
  return new Response(null, { status: 204 });
});
