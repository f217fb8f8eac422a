/**
 * The authorization matrix: every API route × {anonymous, viewer, editor, owner, other member,
 * admin, bearer token} with the expected status, from one table. The first test walks
 * app/api/**\/route.ts and fails when a handler has no row here, so a new route cannot be forgotten.
 * Expected codes follow RFC 9110 §15: 200/201/202/204 success, 401 no credentials, 403 signed in
 * but not allowed, 404 for a private project the actor cannot see.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { closeDb, db } from '../../lib/server/db';
import { resetRateLimits } from '../../lib/server/ratelimit';
import { forgetUser } from '../../lib/server/actor';
import { closeQueue } from '../../lib/server/queue/connection';
import { bearerFor, call, FIB, makeInvitation, makeLink, makeProject, makeUser, type ProjectFixture, type TestUser } from './api-fixtures';

const ACTORS = ['anonymous', 'viewer', 'editor', 'owner', 'other', 'admin', 'bearer'] as const;
type ActorName = (typeof ACTORS)[number];
type Expect = [number, number, number, number, number, number, number];

interface Ctx {
  p: ProjectFixture;
  users: Record<'owner' | 'editor' | 'viewer' | 'viewer2' | 'other' | 'admin', TestUser>;
  self: TestUser | null;
}
interface Row {
  route: string;
  method: 'GET' | 'POST' | 'PATCH' | 'DELETE';
  visibility?: 'private' | 'public';
  /** URL, route params and body for this call. */
  make: (c: Ctx) => Promise<{ url: string; params?: Record<string, string>; body?: unknown; form?: FormData }> | { url: string; params?: Record<string, string>; body?: unknown; form?: FormData };
  expect: Expect; //         anon viewer editor owner other admin bearer(owner's token)
}

const READ: Expect = [404, 200, 200, 200, 404, 200, 200];
const EDIT = (ok: number): Expect => [404, 403, ok, ok, 404, 403, ok];
const MANAGE = (ok: number): Expect => [404, 403, 403, ok, 404, 403, ok];
const SIGNED_IN = (ok: number): Expect => [401, ok, ok, ok, ok, ok, ok];
const ANYONE = (ok: number): Expect => [ok, ok, ok, ok, ok, ok, ok];
const ADMIN_ONLY: Expect = [401, 403, 403, 403, 403, 200, 403];

const pid = (c: Ctx) => ({ id: String(c.p.id) });
const uniq = () => Math.random().toString(36).slice(2, 10);

function patternForm(): FormData {
  const f = new FormData();
  f.set('file', new File(['2theta intensity\n10.0 5\n20.0 7\n30.0 2\n'], 'measured.xy', { type: 'text/plain' }));
  return f;
}

/** A queued job of the project's owner, straight into the table (no worker needs to see it). */
async function queuedJob(c: Ctx): Promise<number> {
  const [id] = await db()('jobs').insert({ project_id: c.p.id, user_id: c.users.owner.id, kind: 'diffraction', input: JSON.stringify({ revision: c.p.rev2 }) });
  return Number(id);
}

/** A finished one-point sweep whose point holds the fixture's params. */
async function finishedSweep(c: Ctx): Promise<number> {
  const [id] = await db()('jobs').insert({ project_id: c.p.id, user_id: c.users.owner.id, kind: 'sweep', state: 'done', progress: 1, total: 1, done: 1, input: JSON.stringify({ revision: c.p.rev2 }) });
  await db()('sweep_points').insert({ job_id: id, idx: 0, params: JSON.stringify(FIB), rwp: 0.1, rp: 0.1, atoms: 8, runs: 1, finished_at: new Date() });
  return Number(id);
}

const jobCall = (id: number, tail: string) => ({ url: `/api/jobs/${id}${tail}`, params: { id: String(id) } });

const TABLE: Row[] = [
  { route: 'me', method: 'GET', make: () => ({ url: '/api/me' }), expect: SIGNED_IN(200) },
  { route: 'starters', method: 'GET', make: () => ({ url: '/api/starters' }), expect: ANYONE(200) },
  { route: 'openapi.json', method: 'GET', make: () => ({ url: '/api/openapi.json' }), expect: ANYONE(200) },
  { route: 'account/signup', method: 'POST', make: () => ({ url: '/api/account/signup', body: { email: `new-${uniq()}@lab.test`, name: 'New', password: 'a long enough secret' } }), expect: ANYONE(202) },
  { route: 'account/verify', method: 'POST', make: async (c) => ({ url: '/api/account/verify', body: { token: await makeLink(c.users.viewer2.id, 'verify') } }), expect: ANYONE(200) },
  { route: 'account/reset', method: 'POST', make: (c) => ({ url: '/api/account/reset', body: { email: c.users.viewer2.email } }), expect: ANYONE(202) },
  { route: 'account/reset/confirm', method: 'POST', make: async (c) => ({ url: '/api/account/reset/confirm', body: { token: await makeLink(c.users.viewer2.id, 'reset'), password: 'another long secret' } }), expect: ANYONE(200) },

  { route: 'projects', method: 'GET', make: () => ({ url: '/api/projects?scope=mine' }), expect: SIGNED_IN(200) },
  { route: 'projects', method: 'POST', make: () => ({ url: '/api/projects', body: { name: 'New model', starter: 'fibonacci' } }), expect: SIGNED_IN(201) },
  { route: 'projects/[id]', method: 'GET', make: (c) => ({ url: `/api/projects/${c.p.id}`, params: pid(c) }), expect: READ },
  { route: 'projects/[id]', method: 'GET', visibility: 'public', make: (c) => ({ url: `/api/projects/${c.p.id}`, params: pid(c) }), expect: ANYONE(200) },
  { route: 'projects/[id]', method: 'PATCH', make: (c) => ({ url: `/api/projects/${c.p.id}`, params: pid(c), body: { description: 'changed' } }), expect: MANAGE(200) },
  { route: 'projects/[id]', method: 'PATCH', visibility: 'public', make: (c) => ({ url: `/api/projects/${c.p.id}`, params: pid(c), body: { description: 'changed' } }), expect: [401, 403, 403, 200, 403, 403, 200] },
  { route: 'projects/[id]', method: 'DELETE', make: (c) => ({ url: `/api/projects/${c.p.id}`, params: pid(c) }), expect: [404, 403, 403, 204, 404, 204, 204] },
  { route: 'projects/[id]/revisions', method: 'GET', make: (c) => ({ url: `/api/projects/${c.p.id}/revisions`, params: pid(c) }), expect: READ },
  { route: 'projects/[id]/revisions', method: 'POST', make: (c) => ({ url: `/api/projects/${c.p.id}/revisions`, params: pid(c), body: { params: FIB, message: 'matrix save', baseRevision: c.p.rev2 } }), expect: EDIT(201) },
  { route: 'projects/[id]/revisions', method: 'POST', visibility: 'public', make: (c) => ({ url: `/api/projects/${c.p.id}/revisions`, params: pid(c), body: { params: FIB, message: 'matrix save', baseRevision: c.p.rev2 } }), expect: [401, 403, 201, 201, 403, 403, 201] },
  { route: 'projects/[id]/revisions/[rid]', method: 'GET', make: (c) => ({ url: `/api/projects/${c.p.id}/revisions/${c.p.rev1}`, params: { id: String(c.p.id), rid: String(c.p.rev1) } }), expect: READ },
  { route: 'projects/[id]/revisions/[rid]/restore', method: 'POST', make: (c) => ({ url: `/api/projects/${c.p.id}/revisions/${c.p.rev1}/restore`, params: { id: String(c.p.id), rid: String(c.p.rev1) }, body: { baseRevision: c.p.rev2 } }), expect: EDIT(201) },
  { route: 'projects/[id]/diff', method: 'GET', make: (c) => ({ url: `/api/projects/${c.p.id}/diff?from=${c.p.rev1}&to=${c.p.rev2}`, params: pid(c) }), expect: READ },
  { route: 'projects/[id]/fork', method: 'POST', make: (c) => ({ url: `/api/projects/${c.p.id}/fork`, params: pid(c), body: {} }), expect: [404, 201, 201, 201, 404, 201, 201] },
  { route: 'projects/[id]/fork', method: 'POST', visibility: 'public', make: (c) => ({ url: `/api/projects/${c.p.id}/fork`, params: pid(c), body: {} }), expect: SIGNED_IN(201) },
  { route: 'projects/[id]/members', method: 'GET', make: (c) => ({ url: `/api/projects/${c.p.id}/members`, params: pid(c) }), expect: [404, 200, 200, 200, 404, 200, 200] },
  { route: 'projects/[id]/members', method: 'GET', visibility: 'public', make: (c) => ({ url: `/api/projects/${c.p.id}/members`, params: pid(c) }), expect: [401, 200, 200, 200, 403, 200, 200] },
  { route: 'projects/[id]/members', method: 'POST', make: (c) => ({ url: `/api/projects/${c.p.id}/members`, params: pid(c), body: { email: `invitee-${uniq()}@lab.test`, role: 'viewer' } }), expect: MANAGE(201) },
  { route: 'projects/[id]/members', method: 'PATCH', make: (c) => ({ url: `/api/projects/${c.p.id}/members`, params: pid(c), body: { userId: c.users.viewer2.id, role: 'editor' } }), expect: MANAGE(200) },
  { route: 'projects/[id]/members', method: 'DELETE', make: (c) => ({ url: `/api/projects/${c.p.id}/members?userId=${c.users.viewer2.id}`, params: pid(c) }), expect: MANAGE(204) },
  { route: 'projects/[id]/exports', method: 'GET', make: (c) => ({ url: `/api/projects/${c.p.id}/exports`, params: pid(c) }), expect: READ },
  // The fixture already holds this export, so every allowed call reuses it (200).
  { route: 'projects/[id]/exports', method: 'POST', make: (c) => ({ url: `/api/projects/${c.p.id}/exports`, params: pid(c), body: { revision: c.p.rev2, format: 'xyz' } }), expect: READ },
  { route: 'projects/[id]/exports', method: 'POST', visibility: 'public', make: (c) => ({ url: `/api/projects/${c.p.id}/exports`, params: pid(c), body: { revision: c.p.rev2, format: 'xyz' } }), expect: SIGNED_IN(200) },
  { route: 'exports/[id]/download', method: 'GET', make: (c) => ({ url: `/api/exports/${c.p.exportId}/download`, params: { id: String(c.p.exportId) } }), expect: READ },
  { route: 'exports/[id]/download', method: 'GET', visibility: 'public', make: (c) => ({ url: `/api/exports/${c.p.exportId}/download`, params: { id: String(c.p.exportId) } }), expect: ANYONE(200) },
  { route: 'projects/[id]/check', method: 'POST', make: (c) => ({ url: `/api/projects/${c.p.id}/check`, params: pid(c), body: { revision: c.p.rev2 } }), expect: READ },
  { route: 'projects/[id]/check', method: 'POST', visibility: 'public', make: (c) => ({ url: `/api/projects/${c.p.id}/check`, params: pid(c), body: { structure: '1\nAl\nAl 0 0 0\n', filename: 'one.xyz' } }), expect: ANYONE(200) },
  { route: 'projects/[id]/datasets', method: 'GET', make: (c) => ({ url: `/api/projects/${c.p.id}/datasets`, params: pid(c) }), expect: READ },
  { route: 'projects/[id]/datasets', method: 'POST', make: (c) => ({ url: `/api/projects/${c.p.id}/datasets`, params: pid(c), form: patternForm() }), expect: EDIT(201) },
  { route: 'projects/[id]/datasets/[did]', method: 'GET', make: (c) => ({ url: `/api/projects/${c.p.id}/datasets/${c.p.datasetId}`, params: { id: String(c.p.id), did: String(c.p.datasetId) } }), expect: READ },
  { route: 'projects/[id]/datasets/[did]', method: 'DELETE', make: (c) => ({ url: `/api/projects/${c.p.id}/datasets/${c.p.datasetId}`, params: { id: String(c.p.id), did: String(c.p.datasetId) } }), expect: EDIT(204) },
  { route: 'projects/[id]/jobs', method: 'GET', make: (c) => ({ url: `/api/projects/${c.p.id}/jobs`, params: pid(c) }), expect: READ },
  // Indexing a measured pattern is a read-only job any signed-in reader may start (identical requests join one job).
  { route: 'projects/[id]/jobs', method: 'POST', make: (c) => ({ url: `/api/projects/${c.p.id}/jobs`, params: pid(c), body: { kind: 'index', dataset: c.p.datasetId } }), expect: [404, 202, 202, 202, 404, 202, 202] },
  { route: 'jobs/[id]', method: 'GET', make: async (c) => jobCall(await queuedJob(c), '') , expect: READ },
  // Cancel: the one who started it (the owner here) or an editor.
  { route: 'jobs/[id]', method: 'DELETE', make: async (c) => jobCall(await queuedJob(c), ''), expect: EDIT(200) },
  { route: 'jobs/[id]/cancel', method: 'POST', make: async (c) => ({ ...jobCall(await queuedJob(c), '/cancel'), body: {} }), expect: EDIT(200) },
  { route: 'jobs/[id]/points', method: 'GET', make: async (c) => jobCall(await finishedSweep(c), '/points'), expect: READ },
  { route: 'jobs/[id]/save', method: 'POST', make: async (c) => ({ ...jobCall(await finishedSweep(c), '/save'), body: {} }), expect: EDIT(201) },
  { route: 'invitations', method: 'GET', make: async (c) => ({ url: `/api/invitations?token=${encodeURIComponent(await makeInvitation(c.p.id, c.users.other.email, c.users.owner))}` }), expect: ANYONE(200) },
  // Sent to "other"'s address: only that account may accept it.
  { route: 'invitations', method: 'POST', make: async (c) => ({ url: '/api/invitations', body: { token: await makeInvitation(c.p.id, c.users.other.email, c.users.owner) } }), expect: [401, 403, 403, 403, 200, 403, 403] },
  { route: 'tokens', method: 'GET', make: () => ({ url: '/api/tokens' }), expect: SIGNED_IN(200) },
  { route: 'tokens', method: 'POST', make: () => ({ url: '/api/tokens', body: { name: 'script' } }), expect: SIGNED_IN(201) },
  { route: 'tokens', method: 'DELETE', make: async (c) => {
    const owner = c.self ?? c.users.owner;
    const [id] = await db()('api_tokens').insert({ user_id: owner.id, name: 'doomed', prefix: 'tfk_x', token_hash: uniq() + uniq() + uniq() });
    return { url: `/api/tokens?id=${id}` };
  }, expect: SIGNED_IN(204) },
  { route: 'admin/users', method: 'GET', make: () => ({ url: '/api/admin/users' }), expect: ADMIN_ONLY },
  { route: 'admin/users/[id]', method: 'PATCH', make: (c) => ({ url: `/api/admin/users/${c.users.viewer2.id}`, params: { id: String(c.users.viewer2.id) }, body: { siteRole: 'member' } }), expect: ADMIN_ONLY },
  { route: 'admin/mail', method: 'GET', make: () => ({ url: '/api/admin/mail' }), expect: ADMIN_ONLY },
];

/** Routes the table leaves out on purpose, with the reason. */
const EXEMPT: Record<string, string> = {
  health: 'foundation health check, tested in health.test.ts',
  'auth/[...nextauth]': 'next-auth’s own sign-in endpoints; exercised by the browser test',
  '[[...rest]]': 'the JSON 404 for unknown /api paths; tested in security.test.ts',
  'account/sessions': 'ends every session of the caller (its cookie would end mid-table); tested in security.test.ts',
};

const apiDir = join(__dirname, '..', '..', 'app', 'api');

function routeFiles(dir = apiDir): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) out.push(...routeFiles(p));
    else if (name === 'route.ts') out.push(relative(apiDir, dir));
  }
  return out.sort();
}

const modules = new Map<string, Record<string, unknown>>();
async function mod(route: string) {
  if (!modules.has(route)) modules.set(route, await import(join(apiDir, route, 'route.ts')));
  return modules.get(route)!;
}

let users: Ctx['users'];
let bearer: string;

beforeAll(async () => {
  users = {
    owner: await makeUser('owner'),
    editor: await makeUser('editor'),
    viewer: await makeUser('viewer'),
    viewer2: await makeUser('viewer2'),
    other: await makeUser('other'),
    admin: await makeUser('admin', { siteRole: 'admin' }),
  };
  bearer = await bearerFor(users.owner);
});
afterAll(async () => {
  await closeQueue();
  await closeDb();
});

describe('authorization matrix', () => {
  it('has a row for every handler of every route under app/api', async () => {
    const missing: string[] = [];
    for (const r of routeFiles()) {
      if (EXEMPT[r]) continue;
      const m = await mod(r);
      for (const method of ['GET', 'POST', 'PUT', 'PATCH', 'DELETE']) {
        if (typeof m[method] === 'function' && !TABLE.some((row) => row.route === r && row.method === method)) missing.push(`${method} ${r}`);
      }
    }
    expect(missing).toEqual([]);
    // and the table names no route that does not exist
    const files = new Set(routeFiles());
    expect(TABLE.map((r) => r.route).filter((r) => !files.has(r))).toEqual([]);
  });

  for (const row of TABLE) {
    it(`${row.method} /api/${row.route}${row.visibility === 'public' ? ' (public project)' : ''}`, async () => {
      const got: Record<string, number> = {};
      const want: Record<string, number> = {};
      for (const [i, who] of ACTORS.entries()) {
        resetRateLimits();
        const p = await makeProject(users.owner, [[users.editor, 'editor'], [users.viewer, 'viewer'], [users.viewer2, 'viewer']], row.visibility ?? 'private');
        const self = who === 'anonymous' ? null : who === 'bearer' ? users.owner : users[who as Exclude<ActorName, 'anonymous' | 'bearer'>];
        const c = await row.make({ p, users, self });
        const res = await call(await mod(row.route), row.method, c.url, {
          params: c.params,
          body: c.body,
          form: c.form,
          cookie: who === 'anonymous' || who === 'bearer' ? undefined : self!.cookie,
          bearer: who === 'bearer' ? bearer : undefined,
        });
        got[who] = res.status;
        want[who] = row.expect[i];
        if (res.status >= 400) {
          const body = await res.json();
          // one error shape everywhere
          expect(Object.keys(body.error).sort(), `${who}: ${JSON.stringify(body)}`).toEqual(['code', 'details', 'message']);
        }
      }
      expect(got).toEqual(want);
    });
  }

  it('refuses a revoked, malformed or unknown bearer token with 401', async () => {
    const m = await mod('me');
    const token = await bearerFor(users.editor);
    expect((await call(m, 'GET', '/api/me', { bearer: token })).status).toBe(200);
    await db()('api_tokens').where({ user_id: users.editor.id }).update({ revoked_at: new Date() });
    expect((await call(m, 'GET', '/api/me', { bearer: token })).status).toBe(401);
    expect((await call(m, 'GET', '/api/me', { bearer: 'tfk_' + 'a'.repeat(43) })).status).toBe(401);
    expect((await call(m, 'GET', '/api/me', { headers: { authorization: 'Basic abc' } })).status).toBe(401);
  });

  it('treats a forged or disabled-account session cookie as anonymous', async () => {
    const m = await mod('me');
    expect((await call(m, 'GET', '/api/me', { cookie: 'next-auth.session-token=not-a-jwe' })).status).toBe(401);
    const u = await makeUser('soon-disabled');
    expect((await call(m, 'GET', '/api/me', { cookie: u.cookie })).status).toBe(200);
    await db()('users').where({ id: u.id }).update({ disabled_at: new Date() });
    forgetUser(u.id); // a direct write skips the service, which clears the briefly cached user row itself
    expect((await call(m, 'GET', '/api/me', { cookie: u.cookie })).status).toBe(401);
  });
});
