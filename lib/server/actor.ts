/**
 * Who is asking: a personal API token (`Authorization: Bearer tfk_…`) or the next-auth session
 * cookie (a JWT encrypted with NEXTAUTH_SECRET). The session JWT carries the account's session
 * version (`sv`) from sign-in; each request compares it with users.session_version, which a password
 * reset, "sign out everywhere" and disabling the account move on — so those end every session at once.
 * The user row is cached for USER_CACHE_MS per process; the changes above clear it in this process,
 * so here they act at once, and in another process of a larger deployment within USER_CACHE_MS.
 */
import { decode } from 'next-auth/jwt';
import { db } from './db';
import { ApiError } from './errors';
import { lookupApiToken } from './tokens';
import type { Actor, SiteRole } from './authz';

export const SESSION_COOKIES = ['__Secure-next-auth.session-token', 'next-auth.session-token'];

interface UserRow {
  id: number;
  email: string;
  name: string;
  site_role: SiteRole;
  verified_at: Date | null;
  disabled_at: Date | null;
  session_version: number;
}

export const USER_CACHE_MS = 5_000;

const g = globalThis as unknown as { __tauforgeUsers?: Map<number, { row: UserRow | null; at: number }> };

async function userRow(id: number): Promise<UserRow | null> {
  g.__tauforgeUsers ??= new Map();
  const hit = g.__tauforgeUsers.get(id);
  if (hit && Date.now() - hit.at < USER_CACHE_MS) return hit.row;
  const row = ((await db()('users').where({ id }).first('id', 'email', 'name', 'site_role', 'verified_at', 'disabled_at', 'session_version')) as UserRow | undefined) ?? null;
  if (g.__tauforgeUsers.size > 10_000) g.__tauforgeUsers.clear();
  g.__tauforgeUsers.set(id, { row, at: Date.now() });
  return row;
}

/** Drop a cached user row (after a change to the account: password, sessions, disabled, role). */
export function forgetUser(id: number): void {
  g.__tauforgeUsers?.delete(id);
}

/**
 * The signed-in user, or null when the account is gone, disabled, unconfirmed, or its sessions were
 * ended after this one began (`sessionVersion` behind the account's).
 */
export async function activeUser(id: number, sessionVersion?: number): Promise<Actor | null> {
  const u = await userRow(id);
  if (!u || u.disabled_at || !u.verified_at) return null;
  if (sessionVersion !== undefined && sessionVersion !== Number(u.session_version ?? 0)) return null;
  return { id: Number(u.id), email: u.email, name: u.name, siteRole: u.site_role, via: 'session' };
}

export function parseCookies(header: string | null): Record<string, string> {
  const out: Record<string, string> = {};
  for (const part of (header ?? '').split(';')) {
    const i = part.indexOf('=');
    if (i < 0) continue;
    const k = part.slice(0, i).trim();
    if (k && !(k in out)) out[k] = decodeURIComponent(part.slice(i + 1).trim());
  }
  return out;
}

/** The user behind a session cookie value, or null when absent, expired, forged or disabled. */
export async function actorFromSessionToken(token: string | undefined): Promise<Actor | null> {
  if (!token || !process.env.NEXTAUTH_SECRET) return null;
  let payload: Record<string, unknown> | null;
  try {
    payload = (await decode({ token, secret: process.env.NEXTAUTH_SECRET })) as Record<string, unknown> | null;
  } catch {
    return null;
  }
  const uid = Number(payload?.uid);
  if (!Number.isInteger(uid) || uid <= 0) return null;
  // A cookie from before session versions existed counts as version 0 (the column's default).
  const sv = payload?.sv === undefined ? 0 : Number(payload.sv);
  if (!Number.isInteger(sv) || sv < 0) return null;
  return activeUser(uid, sv);
}

export async function actorFromCookieHeader(header: string | null): Promise<Actor | null> {
  const cookies = parseCookies(header);
  for (const name of SESSION_COOKIES) {
    if (cookies[name]) return actorFromSessionToken(cookies[name]);
  }
  return null;
}

export async function resolveActor(req: Request): Promise<Actor | null> {
  const auth = req.headers.get('authorization');
  if (auth) {
    const m = /^Bearer\s+(\S+)\s*$/i.exec(auth);
    if (!m) throw new ApiError('unauthenticated', 'The Authorization header must be "Bearer <token>".');
    const actor = await lookupApiToken(m[1]);
    if (!actor) throw new ApiError('unauthenticated', 'This API token is not valid (revoked, expired, mistyped, or its account is disabled).');
    return actor;
  }
  return actorFromCookieHeader(req.headers.get('cookie'));
}
