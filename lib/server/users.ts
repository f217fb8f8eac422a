/**
 * Accounts: sign-up with a verification link, sign-in check, password reset, and the admin's user
 * list. Answers to sign-up and reset requests are the same whether or not the address has an
 * account, so nobody can probe which addresses are registered.
 */
import bcrypt from 'bcryptjs';
import { z } from 'zod';
import type { Knex } from 'knex';
import { db } from './db';
import { contains } from './paging';
import { ApiError } from './errors';
import { randomToken, sha256Hex } from './crypto';
import { siteUrl } from './mail';
import { audit } from './audit';
import { consumeAttempt, mailBudget, signInFailed, signInSucceeded } from './ratelimit';
import { defineTask, enqueue, queueMail } from './outbox';
import { forgetUser } from './actor';
import type { Actor, SiteRole } from './authz';
import { acceptInvitationInTrx, checkInvitation } from './members';

export const BCRYPT_COST = 10;
const VERIFY_HOURS = 48;
const RESET_MINUTES = 60;

export const emailSchema = z
  .string({ message: 'enter your e-mail address' })
  .trim()
  .toLowerCase()
  .max(254, 'at most 254 characters')
  .pipe(z.email({ message: 'enter a valid e-mail address' }));

// bcrypt reads at most 72 bytes; longer passwords would be silently cut, so we refuse them.
export const passwordSchema = z
  .string({ message: 'enter a password' })
  .min(10, 'use at least 10 characters')
  .refine((p) => Buffer.byteLength(p, 'utf8') <= 72, 'use at most 72 bytes');

export const signUpSchema = z.strictObject({
  email: emailSchema,
  name: z.string().trim().min(1, 'enter your name').max(120, 'at most 120 characters'),
  password: passwordSchema,
  invite: z.string().max(2000).optional(),
});

export const resetRequestSchema = z.strictObject({ email: emailSchema });
export const resetSchema = z.strictObject({ token: z.string().min(10, 'the link is incomplete').max(200), password: passwordSchema });
export const verifySchema = z.strictObject({ token: z.string().min(10, 'the link is incomplete').max(200) });

export const SIGNUP_ANSWER = 'If the address can be used, a message with a confirmation link is on its way. Open it to finish signing up.';
export const RESET_ANSWER = 'If an account uses that address, a message with a reset link is on its way.';

async function issueLink(trx: Knex.Transaction, userId: number, purpose: 'verify' | 'reset', ms: number): Promise<string> {
  const token = randomToken(32);
  await trx('auth_links').insert({ user_id: userId, purpose, token_hash: sha256Hex(token), expires_at: new Date(Date.now() + ms) });
  return token;
}

export interface SignUpResult {
  message: string;
  /** True when an invitation link proved the address, so the account is ready to sign in. */
  verified: boolean;
}

export async function signUp(input: z.infer<typeof signUpSchema>, ip: string): Promise<SignUpResult> {
  await consumeAttempt('signup', input.email, ip);
  const invite = input.invite ? await checkInvitation(input.invite) : null;
  if (input.invite && !invite) throw new ApiError('unprocessable', 'This invitation link is not valid any more (expired, used or withdrawn).');
  const invitedHere = Boolean(invite && invite.email === input.email);
  // The hash costs the same for every address; everything that depends on whether the address already
  // has an account happens off the request path (lib/server/outbox.ts), so the answer cannot tell.
  const hash = await bcrypt.hash(input.password, BCRYPT_COST);
  if (!invitedHere) {
    await enqueue('account.signup', { email: input.email, name: input.name, hash, ip });
    return { message: SIGNUP_ANSWER, verified: false };
  }
  // An invitation to this very address proves the mailbox, so the account is ready at once.
  const verified = await db().transaction(async (trx) => {
    const existing = await trx('users').where({ email: input.email }).forUpdate().first('id', 'verified_at');
    if (existing?.verified_at) return false;
    let userId: number;
    if (existing) {
      // A pending account, and the invitation proves this caller holds the mailbox: the mailbox owner's
      // password wins over whatever the unconfirmed sign-up chose (which anyone could have typed).
      userId = Number(existing.id);
      await trx('users').where({ id: userId }).update({ name: input.name, password_hash: hash, verified_at: trx.fn.now(3), updated_at: trx.fn.now(3) });
    } else {
      [userId] = await trx('users').insert({ email: input.email, name: input.name, password_hash: hash, site_role: 'member', verified_at: trx.fn.now(3) });
    }
    await audit({ actorId: userId, action: 'user.signup', targetType: 'user', targetId: userId, ip, details: { invited: true } }, trx);
    await acceptInvitationInTrx(trx, invite!.id, userId);
    return true;
  });
  if (!verified) {
    await enqueue('account.signup', { email: input.email, name: input.name, hash, ip });
    return { message: SIGNUP_ANSWER, verified: false };
  }
  return { message: 'Your account is ready and you have joined the project. Sign in to continue.', verified: true };
}

/**
 * The part of a sign-up that depends on the address, run from the outbox:
 * - a confirmed account: its owner is told someone tried, nothing changes;
 * - an account waiting for confirmation: nothing changes either (not the name, never the password —
 *   otherwise a second sign-up would take over the first one's pending account); the owner gets a
 *   fresh confirmation link, and a reset link in case they did not start the first sign-up themselves;
 * - a new address: the account is created unconfirmed and the confirmation link goes out.
 * Each address receives at most MAIL_PER_ACCOUNT_PER_HOUR such messages an hour.
 */
defineTask('account.signup', async (p) => {
  const email = String(p.email);
  const name = String(p.name);
  const ip = String(p.ip);
  const mail = await db().transaction(async (trx): Promise<{ subject: string; text: string } | null> => {
    const existing = await trx('users').where({ email }).forUpdate().first('id', 'name', 'verified_at', 'disabled_at', 'created_at');
    if (existing?.verified_at) {
      return {
        subject: 'Someone tried to sign up to Tauforge with your address',
        text: `Someone (perhaps you) tried to create a Tauforge account for this address, which already has one.\n\nIf you forgot your password, reset it here:\n${siteUrl('/reset')}\n\nIf it was not you, you can ignore this message.`,
      };
    }
    if (existing) {
      const userId = Number(existing.id);
      if (existing.disabled_at) return null;
      await audit({ actorId: null, action: 'user.signup_repeat', targetType: 'user', targetId: userId, ip }, trx);
      const verify = await issueLink(trx, userId, 'verify', VERIFY_HOURS * 3600_000);
      const reset = await issueLink(trx, userId, 'reset', RESET_MINUTES * 60_000);
      return {
        subject: 'Confirm your Tauforge address',
        text: `Someone asked again to sign up to Tauforge with this address. An account for it has been waiting for confirmation since ${new Date(existing.created_at).toISOString().slice(0, 16).replace('T', ' ')} UTC; signing up again does not change its name or password.\n\nIf you started that sign-up, open this link within ${VERIFY_HOURS} hours to confirm it (the password is the one you chose then):\n${siteUrl(`/verify?token=${verify}`)}\n\nIf you did not, or you no longer know that password, choose a new password here within ${RESET_MINUTES} minutes instead; this also confirms the address:\n${siteUrl(`/reset?token=${reset}`)}\n\nIf you do not want an account, ignore this message.`,
      };
    }
    const [userId] = await trx('users').insert({ email, name, password_hash: String(p.hash), site_role: 'member' });
    await audit({ actorId: userId, action: 'user.signup', targetType: 'user', targetId: userId, ip, details: { invited: false } }, trx);
    const token = await issueLink(trx, userId, 'verify', VERIFY_HOURS * 3600_000);
    return {
      subject: 'Confirm your Tauforge address',
      text: `Welcome to Tauforge, ${name}.\n\nOpen this link within ${VERIFY_HOURS} hours to confirm your address and finish signing up:\n${siteUrl(`/verify?token=${token}`)}\n\nIf you did not sign up, ignore this message; the account stays unusable.`,
    };
  });
  if (mail && (await mailBudget('signup', email))) await queueMail(email, mail.subject, mail.text);
});

async function takeLink(trx: Knex.Transaction, token: string, purpose: 'verify' | 'reset'): Promise<number> {
  const row = await trx('auth_links').where({ token_hash: sha256Hex(token), purpose }).forUpdate().first();
  if (!row || row.used_at || new Date(row.expires_at).getTime() < Date.now()) {
    throw new ApiError('unprocessable', purpose === 'verify'
      ? 'This confirmation link is not valid any more (used or expired). Sign up again to get a new one.'
      : 'This reset link is not valid any more (used or expired). Ask for a new one.');
  }
  await trx('auth_links').where({ id: row.id }).update({ used_at: trx.fn.now(3) });
  return Number(row.user_id);
}

export async function verifyEmail(input: z.infer<typeof verifySchema>, ip: string): Promise<void> {
  await db().transaction(async (trx) => {
    const userId = await takeLink(trx, input.token, 'verify');
    await trx('users').where({ id: userId }).whereNull('verified_at').update({ verified_at: trx.fn.now(3) });
    await audit({ actorId: userId, action: 'user.verify', targetType: 'user', targetId: userId, ip }, trx);
  });
}

export async function requestReset(input: z.infer<typeof resetRequestSchema>, ip: string): Promise<string> {
  await consumeAttempt('reset', input.email, ip);
  // Whether the address has an account is decided off the request path, so both answers take as long.
  await enqueue('account.reset', { email: input.email, ip });
  return RESET_ANSWER;
}

defineTask('account.reset', async (p) => {
  const email = String(p.email);
  const user = await db()('users').where({ email }).whereNull('disabled_at').first('id', 'name');
  if (!user || !(await mailBudget('reset', email))) return;
  const token = await db().transaction((trx) => issueLink(trx, Number(user.id), 'reset', RESET_MINUTES * 60_000));
  await queueMail(
    email,
    'Reset your Tauforge password',
    `Someone asked to reset the password of the Tauforge account for this address.\n\nOpen this link within ${RESET_MINUTES} minutes to choose a new password:\n${siteUrl(`/reset?token=${token}`)}\n\nIf it was not you, ignore this message; your password stays as it is.`,
  );
});

export async function resetPassword(input: z.infer<typeof resetSchema>, ip: string): Promise<void> {
  const hash = await bcrypt.hash(input.password, BCRYPT_COST);
  await db().transaction(async (trx) => {
    const userId = await takeLink(trx, input.token, 'reset');
    // A reset link reaches the mailbox, so it also confirms the address.
    // A new password ends every session signed in with the old one (session_version, lib/server/actor.ts).
    await trx('users').where({ id: userId }).update({
      password_hash: hash,
      verified_at: trx.raw('COALESCE(verified_at, CURRENT_TIMESTAMP(3))'),
      session_version: trx.raw('session_version + 1'),
      updated_at: trx.fn.now(3),
    });
    await trx('auth_links').where({ user_id: userId }).whereNull('used_at').update({ used_at: trx.fn.now(3) });
    await audit({ actorId: userId, action: 'user.reset_password', targetType: 'user', targetId: userId, ip }, trx);
    return userId;
  }).then((userId) => forgetUser(userId));
}

export type SignInOutcome =
  | { ok: true; user: { id: number; email: string; name: string; siteRole: SiteRole; sessionVersion: number } }
  | { ok: false; reason: 'invalid' | 'unverified' | 'disabled' };

// A fixed hash to compare against when the address is unknown, so both paths cost one bcrypt.
const DUMMY_HASH = '$2b$10$6ohHKBhq3/ms2hBcN1PwaOOuBwJpthKgv01CV6GEtOIhxSkCTG.02';

/**
 * Check e-mail + password. Limited per client address and, for failures, per account + address with
 * growing delays (lib/server/ratelimit.ts), so a stranger's failures never delay the owner; the owner is
 * told by mail when the account collects many failures. Throws RateLimitedError.
 */
export async function checkCredentials(emailRaw: string, password: string, ip: string): Promise<SignInOutcome> {
  const email = emailRaw.trim().toLowerCase();
  await consumeAttempt('signin', email, ip);
  const u = await db()('users').where({ email }).first('id', 'email', 'name', 'site_role', 'password_hash', 'verified_at', 'disabled_at', 'session_version');
  const ok = await bcrypt.compare(password, u?.password_hash ?? DUMMY_HASH);
  if (!u || !u.password_hash || !ok) {
    const { warnOwner, failuresOnAccount } = signInFailed(email, ip);
    await audit({ actorId: null, action: 'auth.signin_failed', targetType: 'user', targetId: u ? Number(u.id) : null, ip });
    if (u && warnOwner && u.verified_at && (await mailBudget('warning', email))) {
      await queueMail(
        email,
        'Failed sign-ins to your Tauforge account',
        `Someone has tried to sign in to your Tauforge account and failed ${failuresOnAccount} times within the last hour (the latest from ${ip}).\n\nYou can still sign in as usual: these attempts slow down only the addresses they come from.\nIf it was not you, nothing is needed; if your password is weak or used elsewhere, change it:\n${siteUrl('/reset')}`,
      );
    }
    return { ok: false, reason: 'invalid' };
  }
  // Only someone who knows the password learns that the account is unverified or disabled.
  if (u.disabled_at) return { ok: false, reason: 'disabled' };
  if (!u.verified_at) return { ok: false, reason: 'unverified' };
  signInSucceeded(email, ip);
  await audit({ actorId: Number(u.id), action: 'auth.signin', targetType: 'user', targetId: Number(u.id), ip });
  return { ok: true, user: { id: Number(u.id), email: u.email, name: u.name, siteRole: u.site_role, sessionVersion: Number(u.session_version ?? 0) } };
}

/** End every session of this account (this one too): the session version moves on. */
export async function signOutEverywhere(actor: Actor, ip: string): Promise<void> {
  await db().transaction(async (trx) => {
    await trx('users').where({ id: actor.id }).update({ session_version: trx.raw('session_version + 1'), updated_at: trx.fn.now(3) });
    await audit({ actorId: actor.id, action: 'user.signout_all', targetType: 'user', targetId: actor.id, ip }, trx);
  });
  forgetUser(actor.id);
}

// ---- admin ---------------------------------------------------------------------------------

export const userListQuery = z.object({
  q: z.string().max(200).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
  sort: z.enum(['email', 'name', 'created_at', 'site_role']).default('created_at'),
  dir: z.enum(['asc', 'desc']).default('desc'),
});

export interface UserInfo {
  id: number;
  email: string;
  name: string;
  siteRole: SiteRole;
  verified: boolean;
  disabled: boolean;
  createdAt: string;
}

export function requireAdmin(actor: Actor | null): Actor {
  if (!actor) throw new ApiError('unauthenticated', 'Sign in to do this.');
  if (actor.siteRole !== 'admin') throw new ApiError('forbidden', 'Only site admins can do this.');
  return actor;
}

export async function listUsers(actor: Actor | null, q: z.infer<typeof userListQuery>): Promise<{ items: UserInfo[]; total: number }> {
  requireAdmin(actor);
  const base = db()('users');
  if (q.q) {
    const like = contains(q.q);
    base.where((w) => w.where('email', 'like', like).orWhere('name', 'like', like));
  }
  const [{ n }] = await base.clone().count<{ n: number }[]>({ n: '*' });
  const rows = await base.clone().orderBy(q.sort, q.dir).orderBy('id').limit(q.pageSize).offset((q.page - 1) * q.pageSize)
    .select('id', 'email', 'name', 'site_role', 'verified_at', 'disabled_at', 'created_at');
  return {
    total: Number(n),
    items: rows.map((r) => ({ id: Number(r.id), email: r.email, name: r.name, siteRole: r.site_role, verified: !!r.verified_at, disabled: !!r.disabled_at, createdAt: new Date(r.created_at).toISOString() })),
  };
}

export const updateUserSchema = z.strictObject({
  siteRole: z.enum(['admin', 'member']).optional(),
  disabled: z.boolean().optional(),
}).refine((v) => v.siteRole !== undefined || v.disabled !== undefined, 'send siteRole or disabled');

export async function updateUser(actor: Actor | null, id: number, input: z.infer<typeof updateUserSchema>, ip: string): Promise<void> {
  const admin = requireAdmin(actor);
  await db().transaction(async (trx) => {
    const u = await trx('users').where({ id }).forUpdate().first('id', 'site_role', 'disabled_at');
    if (!u) throw new ApiError('not_found', 'No such user.');
    const demoting = input.siteRole === 'member' && u.site_role === 'admin';
    const disabling = input.disabled === true && !u.disabled_at;
    if ((demoting || disabling) && u.site_role === 'admin') {
      const [{ n }] = await trx('users').where({ site_role: 'admin' }).whereNull('disabled_at').count<{ n: number }[]>({ n: '*' });
      if (Number(n) <= 1) throw new ApiError('conflict', 'This is the last active admin; make someone else admin first.');
    }
    const patch: Record<string, unknown> = { updated_at: trx.fn.now(3) };
    if (input.siteRole) patch.site_role = input.siteRole;
    if (input.disabled !== undefined) patch.disabled_at = input.disabled ? trx.fn.now(3) : null;
    // Disabling ends every session for good: enabling again does not bring the old cookies back.
    if (disabling) patch.session_version = trx.raw('session_version + 1');
    await trx('users').where({ id }).update(patch);
    if (input.siteRole && input.siteRole !== u.site_role) {
      await audit({ actorId: admin.id, action: 'user.role_change', targetType: 'user', targetId: id, ip, details: { from: u.site_role, to: input.siteRole } }, trx);
    }
    if (input.disabled !== undefined && input.disabled !== !!u.disabled_at) {
      await audit({ actorId: admin.id, action: input.disabled ? 'user.disable' : 'user.enable', targetType: 'user', targetId: id, ip }, trx);
    }
  });
  forgetUser(id);
}

export async function listMail(actor: Actor | null, q: { page: number; pageSize: number; to?: string }) {
  requireAdmin(actor);
  const base = db()('mail_messages');
  if (q.to) base.where('mail_to', 'like', contains(q.to));
  const [{ n }] = await base.clone().count<{ n: number }[]>({ n: '*' });
  const rows = await base.clone().orderBy('id', 'desc').limit(q.pageSize).offset((q.page - 1) * q.pageSize)
    .select('id', 'mail_from', 'mail_to', 'subject', 'body_text', 'received_at');
  return {
    total: Number(n),
    items: rows.map((r) => ({ id: Number(r.id), from: r.mail_from, to: r.mail_to, subject: r.subject, text: r.body_text, receivedAt: new Date(r.received_at).toISOString() })),
  };
}
