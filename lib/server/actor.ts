/**
 * Who is asking: a personal API token (`Authorization: Bearer tfk_…`) or the next-auth session
 * cookie (a JWT encrypted with NEXTAUTH_SECRET). Either way the user row is read again, so a
 * disabled account loses access at once, whatever its cookie says.
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
}

export async function activeUser(id: number): Promise<Actor | null> {
  const u = (await db()('users').where({ id }).first('id', 'email', 'name', 'site_role', 'verified_at', 'disabled_at')) as UserRow | undefined;
  if (!u || u.disabled_at || !u.verified_at) return null;
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
  return activeUser(uid);
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
    if (!actor) throw new ApiError('unauthenticated', 'This API token is not valid (revoked, mistyped, or its account is disabled).');
    return actor;
  }
  return actorFromCookieHeader(req.headers.get('cookie'));
}
