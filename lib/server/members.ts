/**
 * Project members and invitations. An invitation link carries a token signed with the site secret
 * (invitation id + expiry, HMAC-SHA256); the database keeps only its sha256, so a link works once,
 * until it expires, and not after the owner withdraws it.
 */
import { z } from 'zod';
import type { Knex } from 'knex';
import { db } from './db';
import { ApiError } from './errors';
import { access, type Actor, type ProjectRole } from './authz';
import { audit } from './audit';
import { sha256Hex, signPayload, verifySigned } from './crypto';
import { siteUrl } from './mail';
import { queueMail } from './outbox';
import { queryId } from './http';
import { iso } from './paging';

export const INVITE_DAYS = 7;
const ROLES = ['owner', 'editor', 'viewer'] as const;

export const inviteSchema = z.strictObject({
  email: z.string().trim().toLowerCase().max(254).pipe(z.email({ message: 'enter a valid e-mail address' })),
  role: z.enum(ROLES, { message: 'role is owner, editor or viewer' }).default('viewer'),
});
export const changeRoleSchema = z.strictObject({
  userId: z.number({ message: 'send the member’s userId' }).int().positive(),
  role: z.enum(ROLES, { message: 'role is owner, editor or viewer' }),
});
export const removeMemberQuery = z.object({
  userId: queryId('userId').optional(),
  invitation: queryId('invitation').optional(),
}).refine((v) => (v.userId === undefined) !== (v.invitation === undefined), 'send userId (a member) or invitation (a pending invitation)');
export const acceptSchema = z.strictObject({ token: z.string().min(10).max(2000) });

export interface MemberInfo {
  userId: number;
  email: string;
  name: string;
  role: ProjectRole;
  since: string;
}
export interface InvitationInfo {
  id: number;
  email: string;
  role: ProjectRole;
  invitedBy: string | null;
  expiresAt: string;
  createdAt: string;
}

export async function listMembers(actor: Actor | null, projectId: number): Promise<{ members: MemberInfo[]; invitations: InvitationInfo[] }> {
  const a = await access(actor, projectId, 'members.read');
  const rows = await db()('project_members as m').join('users as u', 'u.id', 'm.user_id').where('m.project_id', projectId)
    .orderByRaw("FIELD(m.role, 'owner', 'editor', 'viewer')").orderBy('u.name').select('m.user_id', 'm.role', 'm.created_at', 'u.email', 'u.name');
  const invitations = a.role === 'owner'
    ? await db()('invitations as i').leftJoin('users as u', 'u.id', 'i.invited_by').where('i.project_id', projectId)
      .whereNull('i.accepted_at').whereNull('i.revoked_at').where('i.expires_at', '>', new Date()).orderBy('i.id', 'desc')
      .select('i.id', 'i.email', 'i.role', 'i.expires_at', 'i.created_at', 'u.name as invited_by')
    : [];
  return {
    members: rows.map((r) => ({ userId: Number(r.user_id), email: r.email, name: r.name, role: r.role, since: iso(r.created_at)! })),
    invitations: invitations.map((r) => ({ id: Number(r.id), email: r.email, role: r.role, invitedBy: r.invited_by, expiresAt: iso(r.expires_at)!, createdAt: iso(r.created_at)! })),
  };
}

export async function invite(actor: Actor | null, projectId: number, input: z.infer<typeof inviteSchema>, opts: { expiresInMs?: number } = {}): Promise<{ invitation: InvitationInfo; link: string }> {
  const expires = new Date(Date.now() + (opts.expiresInMs ?? INVITE_DAYS * 86400_000));
  let projectName = '';
  const { id, token } = await db().transaction(async (trx) => {
    await access(actor, projectId, 'manage', trx);
    const already = await trx('project_members as m').join('users as u', 'u.id', 'm.user_id').where({ 'm.project_id': projectId, 'u.email': input.email }).first('m.role');
    if (already) throw new ApiError('conflict', `${input.email} is already a member of this project (${already.role}).`);
    projectName = (await trx('projects').where({ id: projectId }).first('name')).name;
    // The row id goes into the signed token, so insert first with a placeholder hash, then set it.
    const [id] = await trx('invitations').insert({ project_id: projectId, email: input.email, role: input.role, token_hash: sha256Hex(`pending:${projectId}:${Date.now()}:${Math.random()}`), invited_by: actor!.id, expires_at: expires });
    const token = signPayload({ i: Number(id), x: expires.getTime() });
    await trx('invitations').where({ id }).update({ token_hash: sha256Hex(token) });
    await audit({ actorId: actor!.id, action: 'member.invite', targetType: 'project', targetId: projectId, details: { email: input.email, role: input.role } }, trx);
    return { id: Number(id), token };
  });
  const link = siteUrl(`/invite?token=${encodeURIComponent(token)}`);
  await queueMail(
    input.email,
    `${actor!.name || actor!.email} invited you to a Tauforge project`,
    `${actor!.name || actor!.email} invited you to join the project “${projectName}” on Tauforge as ${input.role}.\n\nOpen this link within ${Math.round((expires.getTime() - Date.now()) / 86400_000) || 1} days to accept (you can create an account on the way):\n${link}\n\nIf you do not know this person, ignore this message.`,
  );
  return { invitation: { id, email: input.email, role: input.role, invitedBy: actor!.name, expiresAt: expires.toISOString(), createdAt: new Date().toISOString() }, link };
}

export interface CheckedInvitation {
  id: number;
  projectId: number;
  projectName: string;
  email: string;
  role: ProjectRole;
  expiresAt: string;
}

/** A valid, unused, unexpired, not withdrawn invitation for this token, or null. */
export async function checkInvitation(token: string, trx: Knex | Knex.Transaction = db()): Promise<CheckedInvitation | null> {
  const payload = verifySigned(token);
  if (!payload || typeof payload.i !== 'number' || typeof payload.x !== 'number') return null;
  if (payload.x < Date.now()) return null;
  const r = await trx('invitations as i').join('projects as p', 'p.id', 'i.project_id').where({ 'i.id': payload.i, 'i.token_hash': sha256Hex(token) }).first('i.*', 'p.name as project_name');
  if (!r || r.accepted_at || r.revoked_at || new Date(r.expires_at).getTime() < Date.now()) return null;
  return { id: Number(r.id), projectId: Number(r.project_id), projectName: r.project_name, email: r.email, role: r.role, expiresAt: iso(r.expires_at)! };
}

export async function acceptInvitationInTrx(trx: Knex.Transaction, invitationId: number, userId: number): Promise<number> {
  const inv = await trx('invitations').where({ id: invitationId }).forUpdate().first();
  if (!inv || inv.accepted_at || inv.revoked_at) throw new ApiError('unprocessable', 'This invitation link is not valid any more (expired, used or withdrawn).');
  const existing = await trx('project_members').where({ project_id: inv.project_id, user_id: userId }).first('role');
  if (!existing) await trx('project_members').insert({ project_id: inv.project_id, user_id: userId, role: inv.role });
  await trx('invitations').where({ id: invitationId }).update({ accepted_at: trx.fn.now(3), accepted_by: userId });
  await audit({ actorId: userId, action: 'member.accept', targetType: 'project', targetId: Number(inv.project_id), details: { role: existing?.role ?? inv.role } }, trx);
  return Number(inv.project_id);
}

export async function acceptInvitation(actor: Actor, token: string): Promise<{ projectId: number }> {
  const projectId = await db().transaction(async (trx) => {
    const inv = await checkInvitation(token, trx);
    if (!inv) throw new ApiError('unprocessable', 'This invitation link is not valid any more (expired, used or withdrawn).');
    if (inv.email !== actor.email.toLowerCase()) {
      throw new ApiError('forbidden', `This invitation was sent to ${inv.email}; sign in with that address to accept it.`);
    }
    return acceptInvitationInTrx(trx, inv.id, actor.id);
  });
  return { projectId };
}

async function ownerCount(trx: Knex.Transaction, projectId: number): Promise<number> {
  const [{ n }] = await trx('project_members').where({ project_id: projectId, role: 'owner' }).count<{ n: number }[]>({ n: '*' });
  return Number(n);
}

export async function changeRole(actor: Actor | null, projectId: number, input: z.infer<typeof changeRoleSchema>): Promise<void> {
  await db().transaction(async (trx) => {
    await access(actor, projectId, 'manage', trx);
    await trx('projects').where({ id: projectId }).forUpdate().first('id');
    const m = await trx('project_members').where({ project_id: projectId, user_id: input.userId }).first('role');
    if (!m) throw new ApiError('not_found', 'No such member in this project.');
    if (m.role === 'owner' && input.role !== 'owner' && (await ownerCount(trx, projectId)) <= 1) {
      throw new ApiError('conflict', 'A project needs at least one owner; make someone else owner first.');
    }
    await trx('project_members').where({ project_id: projectId, user_id: input.userId }).update({ role: input.role });
    await audit({ actorId: actor!.id, action: 'member.role_change', targetType: 'project', targetId: projectId, details: { user: input.userId, from: m.role, to: input.role } }, trx);
  });
}

/** Owners remove anyone; any member may remove themselves (leave). The last owner stays. */
export async function removeMember(actor: Actor | null, projectId: number, userId: number): Promise<void> {
  await db().transaction(async (trx) => {
    const self = actor?.id === userId;
    const a = await access(actor, projectId, self ? 'read' : 'manage', trx);
    if (self && !a.role) throw new ApiError('not_found', 'You are not a member of this project.');
    await trx('projects').where({ id: projectId }).forUpdate().first('id');
    const m = await trx('project_members').where({ project_id: projectId, user_id: userId }).first('role');
    if (!m) throw new ApiError('not_found', 'No such member in this project.');
    if (m.role === 'owner' && (await ownerCount(trx, projectId)) <= 1) {
      throw new ApiError('conflict', self ? 'You are the last owner; make someone else owner before you leave.' : 'A project needs at least one owner.');
    }
    await trx('project_members').where({ project_id: projectId, user_id: userId }).delete();
    await audit({ actorId: actor!.id, action: self ? 'member.leave' : 'member.remove', targetType: 'project', targetId: projectId, details: { user: userId, role: m.role } }, trx);
  });
}

export async function revokeInvitation(actor: Actor | null, projectId: number, invitationId: number): Promise<void> {
  await db().transaction(async (trx) => {
    await access(actor, projectId, 'manage', trx);
    const n = await trx('invitations').where({ id: invitationId, project_id: projectId }).whereNull('accepted_at').whereNull('revoked_at').update({ revoked_at: trx.fn.now(3) });
    if (!n) throw new ApiError('not_found', 'No such pending invitation.');
    await audit({ actorId: actor!.id, action: 'member.invite_revoke', targetType: 'project', targetId: projectId, details: { invitation: invitationId } }, trx);
  });
}
