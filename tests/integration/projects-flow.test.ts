/**
 * Revision conflicts, fork lineage, invitation expiry and reuse, uploads that must store nothing.
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
    expect((await call(forkRoute, 'POST', `/api/projects/${p.id}/fork`, { params: { id: String(p.id) }, cookie: other.cookie, body: { revision: q.rev1 } })).status).toBe(404);
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
