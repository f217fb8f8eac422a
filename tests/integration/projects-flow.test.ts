/**
 * Revision conflicts, fork lineage and history, invitation expiry and reuse, uploads that must store nothing.
 * Status codes per RFC 9110 §15 (409 Conflict, 413 Content Too Large, 415 Unsupported Media Type,
 * 422 Unprocessable Content).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, db } from '../../lib/server/db';
import * as revisionsRoute from '../../app/api/projects/[id]/revisions/route';
import * as forkRoute from '../../app/api/projects/[id]/fork/route';
import * as projectRoute from '../../app/api/projects/[id]/route';
import * as invitationsRoute from '../../app/api/invitations/route';
import * as signupRoute from '../../app/api/account/signup/route';
import * as datasetsRoute from '../../app/api/projects/[id]/datasets/route';
import { resetRateLimits } from '../../lib/server/ratelimit';
import { call, FIB, makeInvitation, makeProject, makeUser, type TestUser } from './api-fixtures';
import { jsonDiff } from '../../lib/server/json-diff';
import { canonicalJson } from '../../lib/formats/canonical-json';
import { createHash } from 'node:crypto';

let owner: TestUser;
let editor: TestUser;
let other: TestUser;
beforeAll(async () => {
  owner = await makeUser('flow-owner');
  editor = await makeUser('flow-editor');
  other = await makeUser('flow-other');
});
afterAll(closeDb);

const count = async (table: string, where: Record<string, unknown>) => Number((await db()(table).where(where).count<{ n: number }[]>({ n: '*' }))[0].n);

describe('revisions', () => {
  it('answers a stale save with 409 and the newer head, and stores nothing', async () => {
    const p = await makeProject(owner, [[editor, 'editor']]);
    const save = (u: TestUser, order: number, base: number) =>
      call(revisionsRoute, 'POST', `/api/projects/${p.id}/revisions`, { params: { id: String(p.id) }, cookie: u.cookie, body: { params: { ...FIB, order }, message: `order ${order}`, baseRevision: base } });
    const first = await save(owner, 7, p.rev2);
    expect(first.status).toBe(201);
    const r3 = await first.json();
    expect(r3.number).toBe(3);
    const before = await count('revisions', { project_id: p.id });
    const stale = await save(editor, 8, p.rev2);
    expect(stale.status).toBe(409);
    const body = await stale.json();
    expect(body.error.code).toBe('conflict');
    expect(body.error.details.head.id).toBe(r3.id);
    expect(body.error.details.head.params.order).toBe(7);
    expect(await count('revisions', { project_id: p.id })).toBe(before);
    // Saving on top of the newer head works.
    expect((await save(editor, 8, r3.id)).status).toBe(201);
  });

  it('rejects params the model schema refuses, with field errors, and stores nothing', async () => {
    const p = await makeProject(owner, []);
    const before = await count('revisions', { project_id: p.id });
    const res = await call(revisionsRoute, 'POST', `/api/projects/${p.id}/revisions`, { params: { id: String(p.id) }, cookie: owner.cookie, body: { params: { family: 'fibonacci', order: -3 }, message: 'bad', baseRevision: p.rev2 } });
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(Object.keys(body.error.details.fields).join(' ')).toMatch(/params\.order/);
    expect(await count('revisions', { project_id: p.id })).toBe(before);
    const unknown = await call(revisionsRoute, 'POST', `/api/projects/${p.id}/revisions`, { params: { id: String(p.id) }, cookie: owner.cookie, body: { params: { family: 'hexagonal' }, message: 'bad', baseRevision: p.rev2 } });
    expect(unknown.status).toBe(400);
  });

  it('diffs params by JSON path (RFC 9535 notation) and canonical JSON sorts keys', () => {
    expect(jsonDiff({ a: 1, b: { c: [1, 2] }, d: 'x' }, { a: 1, b: { c: [1, 3, 4] }, e: true })).toEqual([
      { path: '$.b.c[1]', kind: 'changed', before: 2, after: 3 },
      { path: '$.b.c[2]', kind: 'added', after: 4 },
      { path: '$.d', kind: 'removed', before: 'x' },
      { path: '$.e', kind: 'added', after: true },
    ]);
    expect(canonicalJson({ b: 1, a: { d: [2, { y: 1, x: 0 }], c: null } })).toBe('{"a":{"c":null,"d":[2,{"x":0,"y":1}]},"b":1}');
  });
});

describe('fork lineage', () => {
  it('copies the chosen revision, records parent project and revision, and shows both sides', async () => {
    const p = await makeProject(owner, [], 'public');
    const res = await call(forkRoute, 'POST', `/api/projects/${p.id}/fork`, { params: { id: String(p.id) }, cookie: other.cookie, body: { revision: p.rev1 } });
    expect(res.status).toBe(201);
    const fork = await res.json();
    const row = await db()('projects').where({ id: fork.id }).first();
    expect(Number(row.forked_from_project)).toBe(p.id);
    expect(Number(row.forked_from_revision)).toBe(p.rev1);
    expect(Number(row.owner_id)).toBe(other.id);
    const head = await db()('revisions').where({ id: row.head_revision }).first();
    expect(head.params).toEqual(FIB);
    const child = await (await call(projectRoute, 'GET', `/api/projects/${fork.id}`, { params: { id: String(fork.id) }, cookie: other.cookie })).json();
    expect(child.parent).toMatchObject({ id: p.id, revision: p.rev1, revisionNumber: 1, visible: true });
    // The fork is private: its owner sees it named on the parent, the parent's owner sees a count.
    const parentForOther = await (await call(projectRoute, 'GET', `/api/projects/${p.id}`, { params: { id: String(p.id) }, cookie: other.cookie })).json();
    expect(parentForOther.forks.map((f: { id: number }) => f.id)).toContain(fork.id);
    const parentForOwner = await (await call(projectRoute, 'GET', `/api/projects/${p.id}`, { params: { id: String(p.id) }, cookie: owner.cookie })).json();
    expect(parentForOwner.forks).toEqual([]);
    expect(parentForOwner.hiddenForks).toBe(1);
    // A revision of another project cannot be forked through this one.
    const q = await makeProject(owner, [], 'public');
    const forksBefore = await count('projects', { owner_id: other.id });
    expect((await call(forkRoute, 'POST', `/api/projects/${p.id}/fork`, { params: { id: String(p.id) }, cookie: other.cookie, body: { revision: q.rev1 } })).status).toBe(404);
    expect(await count('projects', { owner_id: other.id })).toBe(forksBefore);
    // A malformed request names the field and stores nothing either.
    const bad = await call(forkRoute, 'POST', `/api/projects/${p.id}/fork`, { params: { id: String(p.id) }, cookie: other.cookie, body: { revision: 'latest', name: '' } });
    expect(bad.status).toBe(400);
    const fields = (await bad.json()).error.details.fields;
    expect(fields).toMatchObject({ revision: 'send the id of the revision to fork at', name: 'enter a name' });
    expect(await count('projects', { owner_id: other.id })).toBe(forksBefore);
  });

  // The params hash an export records (sha256 of the RFC 8785 canonical params).
  const paramsHash = (params: unknown) => createHash('sha256').update(canonicalJson(params)).digest('hex');
  const history = async (id: number, u: TestUser) => {
    const res = await call(revisionsRoute, 'GET', `/api/projects/${id}/revisions?sort=number&dir=asc&pageSize=100`, { params: { id: String(id) }, cookie: u.cookie });
    expect(res.status).toBe(200);
    return ((await res.json()) as { items: { id: number; number: number; message: string; authorName: string | null; createdAt: string; params: unknown }[] }).items;
  };
  const rawRows = (projectId: number) => db()('revisions').where({ project_id: projectId }).orderBy('number').select('id', 'number', 'params', 'message', 'author_id', 'created_at');
  const fork = async (id: number, u: TestUser, body: Record<string, unknown> = {}) => {
    const res = await call(forkRoute, 'POST', `/api/projects/${id}/fork`, { params: { id: String(id) }, cookie: u.cookie, body });
    expect(res.status).toBe(201);
    return (await res.json()) as { id: number; headRevision: number; headNumber: number; forkedAtNumber: number };
  };

  it('carries the parent’s history in order, with messages, authors, times and params as they were', async () => {
    const p = await makeProject(owner, [[editor, 'editor']], 'public');
    const r3 = await call(revisionsRoute, 'POST', `/api/projects/${p.id}/revisions`, { params: { id: String(p.id) }, cookie: editor.cookie, body: { params: { ...FIB, order: 9, offset: 0.25 }, message: 'order 9, shifted window', baseRevision: p.rev2 } });
    expect(r3.status).toBe(201);
    const parentRows = await rawRows(p.id);
    const parent = await history(p.id, owner);
    expect(parent.map((r) => r.number)).toEqual([1, 2, 3]);

    const f = await fork(p.id, other);
    expect(f.headNumber).toBe(3);
    expect(f.forkedAtNumber).toBe(3);
    const child = await history(f.id, other);
    expect(child.map((r) => r.number)).toEqual([1, 2, 3]);
    expect(child.map((r) => r.message)).toEqual(['one', 'two', 'order 9, shifted window']);
    expect(child.map((r) => r.authorName)).toEqual(parent.map((r) => r.authorName));
    expect(new Set(child.map((r) => r.authorName)).size).toBe(2);
    expect(child.map((r) => r.createdAt)).toEqual(parent.map((r) => r.createdAt));
    expect(child.map((r) => paramsHash(r.params))).toEqual(parent.map((r) => paramsHash(r.params)));
    // New rows, not shared ones; the fork's head is its own copy of the fork point.
    expect(child.some((r) => parent.some((q) => q.id === r.id))).toBe(false);
    expect(f.headRevision).toBe(child[2].id);
    const row = await db()('projects').where({ id: f.id }).first();
    expect(Number(row.forked_from_revision)).toBe((await r3.json()).id);

    // A save on the fork continues its numbering and leaves the parent as it was.
    const save = await call(revisionsRoute, 'POST', `/api/projects/${f.id}/revisions`, { params: { id: String(f.id) }, cookie: other.cookie, body: { params: { ...FIB, order: 11 }, message: 'my own idea', baseRevision: f.headRevision } });
    expect(save.status).toBe(201);
    expect((await save.json()).number).toBe(4);
    expect(await rawRows(p.id)).toEqual(parentRows);
    expect(Number((await db()('projects').where({ id: p.id }).first()).head_revision)).toBe(parent[2].id);
  });

  it('forked at an older revision, carries only that revision’s history', async () => {
    const p = await makeProject(owner, [], 'public');
    const f = await fork(p.id, other, { revision: p.rev1 });
    expect((await history(f.id, other)).map((r) => [r.number, r.message])).toEqual([[1, 'one']]);
    expect(f.forkedAtNumber).toBe(1);
    const save = await call(revisionsRoute, 'POST', `/api/projects/${f.id}/revisions`, { params: { id: String(f.id) }, cookie: other.cookie, body: { params: FIB, message: 'again', baseRevision: f.headRevision } });
    expect((await save.json()).number).toBe(2);
    expect(await count('revisions', { project_id: p.id })).toBe(2);
  });

  it('keeps its history and fork point when the parent is deleted', async () => {
    const p = await makeProject(owner, [], 'public');
    const f = await fork(p.id, other);
    const before = await history(f.id, other);
    expect(before.map((r) => r.number)).toEqual([1, 2]);
    expect((await call(projectRoute, 'DELETE', `/api/projects/${p.id}`, { params: { id: String(p.id) }, cookie: owner.cookie })).status).toBeLessThan(300);
    const child = await (await call(projectRoute, 'GET', `/api/projects/${f.id}`, { params: { id: String(f.id) }, cookie: other.cookie })).json();
    expect(child.parent).toBeNull();
    expect(child.forkedAtNumber).toBe(2);
    expect(await history(f.id, other)).toEqual(before);
  });
});

describe('invitations', () => {
  it('works once, for the invited address only', async () => {
    const p = await makeProject(owner, []);
    const token = await makeInvitation(p.id, other.email, owner);
    expect((await call(invitationsRoute, 'POST', '/api/invitations', { cookie: editor.cookie, body: { token } })).status).toBe(403);
    expect((await call(invitationsRoute, 'POST', '/api/invitations', { cookie: other.cookie, body: { token } })).status).toBe(200);
    expect(await db()('project_members').where({ project_id: p.id, user_id: other.id }).first()).toMatchObject({ role: 'viewer' });
    const again = await call(invitationsRoute, 'POST', '/api/invitations', { cookie: other.cookie, body: { token } });
    expect(again.status).toBe(422);
  });

  it('refuses an expired or tampered link', async () => {
    const p = await makeProject(owner, []);
    const expired = await makeInvitation(p.id, other.email, owner, -1000);
    expect((await call(invitationsRoute, 'POST', '/api/invitations', { cookie: other.cookie, body: { token: expired } })).status).toBe(422);
    const good = await makeInvitation(p.id, other.email, owner);
    const [body, sig] = good.split('.');
    const forged = `${Buffer.from(JSON.stringify({ i: 1, x: Date.now() + 1e9 })).toString('base64url')}.${sig}`;
    expect(body).not.toBe(forged.split('.')[0]);
    expect((await call(invitationsRoute, 'POST', '/api/invitations', { cookie: other.cookie, body: { token: forged } })).status).toBe(422);
    expect(await db()('project_members').where({ project_id: p.id, user_id: other.id }).first()).toBeUndefined();
  });

  it('lets an invitee without an account sign up through the link, verified and joined', async () => {
    resetRateLimits();
    const p = await makeProject(owner, []);
    const email = `invitee-${Date.now()}@lab.test`;
    const token = await makeInvitation(p.id, email, owner);
    const res = await call(signupRoute, 'POST', '/api/account/signup', { body: { email, name: 'Invitee', password: 'long enough secret', invite: token } });
    expect(res.status).toBe(202);
    expect((await res.json()).verified).toBe(true);
    const u = await db()('users').where({ email }).first();
    expect(u.verified_at).not.toBeNull();
    expect(await db()('project_members').where({ project_id: p.id, user_id: u.id }).first()).toMatchObject({ role: 'viewer' });
  });
});

describe('dataset uploads that store nothing', () => {
  const upload = async (projectId: number, name: string, bytes: Uint8Array | string, cookie = owner.cookie) => {
    const f = new FormData();
    f.set('file', new File([typeof bytes === 'string' ? bytes : new Uint8Array(bytes)], name));
    return call(datasetsRoute, 'POST', `/api/projects/${projectId}/datasets`, { params: { id: String(projectId) }, cookie, form: f });
  };

  it.each([
    ['empty', 'empty.xy', '', 422],
    ['blank', 'blank.xy', '   \n\n', 422],
    ['binary', 'image.xy', new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0, 0, 1, 2]), 415],
    ['malformed pattern', 'bad.xy', '10 1\n20 abc\n', 422],
    ['malformed XYZ', 'bad.xyz', '3\ncomment\nFe 0 0 0\n', 422],
    ['oversized', 'huge.xy', '1 1\n'.repeat(5_300_000), 413],
  ])('%s file → %i', async (_label, name, bytes, status) => {
    const p = await makeProject(owner, []);
    const before = await count('datasets', { project_id: p.id });
    const res = await upload(p.id, name, bytes);
    expect(res.status).toBe(status);
    expect((await res.json()).error.message.length).toBeGreaterThan(10);
    expect(await count('datasets', { project_id: p.id })).toBe(before);
  });

  it('stores a good pattern and a good XYZ with a summary', async () => {
    const p = await makeProject(owner, []);
    const a = await upload(p.id, 'scan.xy', '# Cu Ka\n2theta intensity\n20 10\n30 50\n40 20\n');
    expect(a.status).toBe(201);
    expect((await a.json()).summary).toMatchObject({ points: 3, axis: '2theta' });
    const b = await upload(p.id, 'model.xyz', '2\ntwo atoms\nAl 0 0 0\nMn 1.2 0 0\n');
    expect(b.status).toBe(201);
    expect((await b.json()).summary).toMatchObject({ atoms: 2, composition: { Al: 1, Mn: 1 } });
  });
});
