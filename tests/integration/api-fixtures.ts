/**
 * Fixtures for the API tests: users in every role, a project with two revisions, an export, a
 * dataset, a pending invitation; session cookies minted with next-auth's own encode() (the same
 * JWE the sign-in flow sets) and personal API tokens made by the real service.
 */
import { encode } from 'next-auth/jwt';
import bcrypt from 'bcryptjs';
import { randomUUID } from 'node:crypto';
import { db } from '../../lib/server/db';
import { createToken } from '../../lib/server/tokens';
import { sha256Hex, signPayload } from '../../lib/server/crypto';
import type { Actor } from '../../lib/server/authz';

export const PASSWORD = 'correct horse battery';
let passwordHash: string | null = null;

export interface TestUser {
  id: number;
  email: string;
  actor: Actor;
  cookie: string;
}

export async function makeUser(label: string, opts: { siteRole?: 'admin' | 'member'; verified?: boolean } = {}): Promise<TestUser> {
  passwordHash ??= await bcrypt.hash(PASSWORD, 4);
  const email = `${label}-${randomUUID().slice(0, 8)}@lab.test`;
  const [id] = await db()('users').insert({
    email,
    name: `${label[0].toUpperCase()}${label.slice(1)} Tester`,
    password_hash: passwordHash,
    site_role: opts.siteRole ?? 'member',
    verified_at: opts.verified === false ? null : new Date(),
  });
  const token = await encode({ token: { uid: Number(id), email, sv: 0 }, secret: process.env.NEXTAUTH_SECRET! });
  const actor: Actor = { id: Number(id), email, name: label, siteRole: opts.siteRole ?? 'member', via: 'session' };
  return { id: Number(id), email, actor, cookie: `next-auth.session-token=${token}` };
}

export async function bearerFor(u: TestUser): Promise<string> {
  const r = await createToken(u.actor, { name: 'test' });
  return r.token;
}

export const FIB = { family: 'fibonacci', order: 5, approximant: true };
export const FIB2 = { family: 'fibonacci', order: 6, approximant: true };

export interface ProjectFixture {
  id: number;
  rev1: number;
  rev2: number;
  exportId: number;
  datasetId: number;
}

export async function makeProject(owner: TestUser, members: [TestUser, 'owner' | 'editor' | 'viewer'][], visibility: 'private' | 'unlisted' | 'public' = 'private'): Promise<ProjectFixture> {
  const k = db();
  const [id] = await k('projects').insert({ owner_id: owner.id, name: 'Matrix project', description: 'fixture', tags: JSON.stringify(['test']), visibility });
  await k('project_members').insert({ project_id: id, user_id: owner.id, role: 'owner' });
  for (const [u, role] of members) await k('project_members').insert({ project_id: id, user_id: u.id, role });
  const [rev1] = await k('revisions').insert({ project_id: id, number: 1, params: JSON.stringify(FIB), message: 'one', author_id: owner.id });
  const [rev2] = await k('revisions').insert({ project_id: id, number: 2, params: JSON.stringify(FIB2), message: 'two', author_id: owner.id });
  await k('projects').where({ id }).update({ head_revision: rev2 });
  const bytes = Buffer.from('1\nfixture\nX 0 0 0\n');
  const { ENGINE_VERSION } = await import('../../lib/version');
  const [exportId] = await k('exports').insert({ revision_id: rev2, format: 'xyz', bytes, sha256: sha256Hex(bytes), params_hash: sha256Hex('x'), engine_version: ENGINE_VERSION, size: bytes.length, created_by: owner.id });
  const ds = Buffer.from('2theta intensity\n10 1\n20 2\n');
  const [datasetId] = await k('datasets').insert({ project_id: id, kind: 'pattern', filename: 'p.xy', format: 'two-column', bytes: ds, sha256: sha256Hex(ds), size: ds.length, summary: JSON.stringify({ points: 2 }), uploaded_by: owner.id });
  return { id: Number(id), rev1: Number(rev1), rev2: Number(rev2), exportId: Number(exportId), datasetId: Number(datasetId) };
}

export async function makeInvitation(projectId: number, email: string, inviter: TestUser, expiresInMs = 86400_000): Promise<string> {
  const expires = new Date(Date.now() + expiresInMs);
  const [id] = await db()('invitations').insert({ project_id: projectId, email, role: 'viewer', token_hash: sha256Hex(randomUUID()), invited_by: inviter.id, expires_at: expires });
  const token = signPayload({ i: Number(id), x: expires.getTime() });
  await db()('invitations').where({ id }).update({ token_hash: sha256Hex(token) });
  return token;
}

export async function makeLink(userId: number, purpose: 'verify' | 'reset'): Promise<string> {
  const token = randomUUID() + randomUUID();
  await db()('auth_links').insert({ user_id: userId, purpose, token_hash: sha256Hex(token), expires_at: new Date(Date.now() + 3600_000) });
  return token;
}

type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;

/** Call a route handler directly, as Next.js would. */
export async function call(
  mod: Record<string, unknown>,
  method: string,
  url: string,
  opts: { params?: Record<string, string>; body?: unknown; form?: FormData; cookie?: string; bearer?: string; headers?: Record<string, string> } = {},
): Promise<Response> {
  const headers: Record<string, string> = { ...opts.headers };
  if (opts.cookie) headers.cookie = opts.cookie;
  // Our own pages send their origin; a cookie-authenticated change without it is refused (lib/server/http.ts).
  if (opts.cookie && method !== 'GET' && !('origin' in headers)) headers.origin = 'http://127.0.0.1';
  if (opts.bearer) headers.authorization = `Bearer ${opts.bearer}`;
  let body: BodyInit | undefined;
  if (opts.form) body = opts.form;
  else if (opts.body !== undefined) {
    headers['content-type'] = 'application/json';
    body = JSON.stringify(opts.body);
  }
  const req = new Request(`http://127.0.0.1${url}`, { method, headers, body });
  const fn = mod[method] as Handler | undefined;
  if (!fn) throw new Error(`${url} has no ${method} handler`);
  return fn(req, { params: Promise.resolve(opts.params ?? {}) });
}
