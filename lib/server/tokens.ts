/**
 * Personal API tokens: shown once, stored as sha256, revocable. Format `tfk_` + 32 random bytes.
 * A token may expire (a date chosen at creation, at most a year ahead) and may be read-only: its
 * calls can only read (GET); route() in lib/server/http.ts refuses anything else with 403.
 */
import { z } from 'zod';
import { db } from './db';
import { ApiError } from './errors';
import { randomToken, sha256Hex } from './crypto';
import type { Actor } from './authz';
import { audit } from './audit';

export const MAX_TOKEN_DAYS = 366;

export const createTokenSchema = z.strictObject({
  name: z.string({ message: 'give the token a name' }).trim().min(1, 'give the token a name').max(80, 'at most 80 characters'),
  /** Days until the token stops working; none = until revoked. */
  expiresInDays: z.number({ message: 'the lifetime is a number of days' }).int('a whole number of days').min(1, 'at least 1 day').max(MAX_TOKEN_DAYS, `at most ${MAX_TOKEN_DAYS} days`).nullable().optional(),
  scope: z.enum(['read', 'write'], { message: 'scope is read or write' }).default('write'),
});

export type TokenScope = 'read' | 'write';

/** The actor behind a token, with what the token may do. */
export interface TokenActor extends Actor {
  via: 'token';
  scope: TokenScope;
}

export interface ApiTokenInfo {
  id: number;
  name: string;
  prefix: string;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
  expiresAt: string | null;
  /** True once expiresAt has passed (when the list was read). */
  expired: boolean;
  scope: TokenScope;
}

interface TokenRow {
  id: number;
  name: string;
  prefix: string;
  created_at: Date;
  last_used_at: Date | null;
  revoked_at: Date | null;
  expires_at: Date | null;
  scope: TokenScope;
}

const iso = (d: Date | null) => (d ? new Date(d).toISOString() : null);

function info(r: TokenRow): ApiTokenInfo {
  return { id: Number(r.id), name: r.name, prefix: r.prefix, createdAt: iso(r.created_at)!, lastUsedAt: iso(r.last_used_at), revokedAt: iso(r.revoked_at), expiresAt: iso(r.expires_at), expired: r.expires_at !== null && new Date(r.expires_at).getTime() <= Date.now(), scope: r.scope ?? 'write' };
}

export async function listTokens(actor: Actor): Promise<ApiTokenInfo[]> {
  const rows = (await db()('api_tokens').where({ user_id: actor.id }).orderBy('id', 'desc')) as TokenRow[];
  return rows.map(info);
}

export async function createToken(actor: Actor, input: z.input<typeof createTokenSchema>): Promise<{ token: string; info: ApiTokenInfo }> {
  const token = `tfk_${randomToken(32)}`;
  const prefix = token.slice(0, 10);
  const id = await db().transaction(async (trx) => {
    const expires = input.expiresInDays ? new Date(Date.now() + input.expiresInDays * 86_400_000) : null;
    const [id] = await trx('api_tokens').insert({ user_id: actor.id, name: input.name, prefix, token_hash: sha256Hex(token), expires_at: expires, scope: input.scope ?? 'write' });
    await audit({ actorId: actor.id, action: 'token.create', targetType: 'api_token', targetId: id, details: { name: input.name, scope: input.scope ?? 'write', expiresAt: expires?.toISOString() ?? null } }, trx);
    return id;
  });
  const row = (await db()('api_tokens').where({ id }).first()) as TokenRow;
  return { token, info: info(row) };
}

export async function revokeToken(actor: Actor, id: number): Promise<void> {
  await db().transaction(async (trx) => {
    const n = await trx('api_tokens').where({ id, user_id: actor.id }).whereNull('revoked_at').update({ revoked_at: trx.fn.now(3) });
    if (!n) throw new ApiError('not_found', 'No such active token.');
    await audit({ actorId: actor.id, action: 'token.revoke', targetType: 'api_token', targetId: id }, trx);
  });
}

export async function lookupApiToken(token: string): Promise<TokenActor | null> {
  if (!/^tfk_[A-Za-z0-9_-]{20,}$/.test(token)) return null;
  const row = await db()('api_tokens as t')
    .join('users as u', 'u.id', 't.user_id')
    .where('t.token_hash', sha256Hex(token))
    .whereNull('t.revoked_at')
    .where((w) => w.whereNull('t.expires_at').orWhere('t.expires_at', '>', db().fn.now(3)))
    .whereNull('u.disabled_at')
    .whereNotNull('u.verified_at')
    .first('t.id as tid', 't.scope', 'u.id', 'u.email', 'u.name', 'u.site_role');
  if (!row) return null;
  await db()('api_tokens').where({ id: row.tid }).update({ last_used_at: db().fn.now(3) });
  return { id: Number(row.id), email: row.email, name: row.name, siteRole: row.site_role, via: 'token', scope: row.scope === 'read' ? 'read' : 'write' };
}
