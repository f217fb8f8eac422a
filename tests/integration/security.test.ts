/**
 * Issue 13: each attack of the security review, run against the route handlers and MariaDB. Every test
 * here failed (or could not be written) against the code before the fix; the comment above each says
 * what it would have caught. Outside references: RFC 6266 / RFC 8187 file names are decoded with
 * Python's standard library (email.utils.collapse_rfc2231_value via decode_params), the timing comparison
 * uses scipy.stats.mannwhitneyu, addresses are parsed by Node's own net module (common practice).
 */
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import bcrypt from 'bcryptjs';
import { join } from 'node:path';
import { encode } from 'next-auth/jwt';
import { closeDb, db } from '../../lib/server/db';
import { resetRateLimits, FREE_FAILURES, failureDelaySeconds, WARN_AFTER_FAILURES } from '../../lib/server/ratelimit';
import { checkCredentials } from '../../lib/server/users';
import { flushOutbox } from '../../lib/server/outbox';
import { parseTrustedProxies, resolveClientAddress, PEER_HEADER } from '../../lib/server/client-address';
import { forgetUser } from '../../lib/server/actor';
import { apiMethodTable } from '../../next.config.mjs';
import { allowedMethods } from '../../proxy';
import { runPython } from '../helpers/python';
import { bearerFor, call, FIB, makeLink, makeProject, makeUser, PASSWORD, type TestUser } from './api-fixtures';
import * as membersRoute from '../../app/api/projects/[id]/members/route';
import * as meRoute from '../../app/api/me/route';
import * as signupRoute from '../../app/api/account/signup/route';
import * as resetRoute from '../../app/api/account/reset/route';
import * as resetConfirmRoute from '../../app/api/account/reset/confirm/route';
import * as verifyRoute from '../../app/api/account/verify/route';
import * as sessionsRoute from '../../app/api/account/sessions/route';
import * as adminUserRoute from '../../app/api/admin/users/[id]/route';
import * as projectRoute from '../../app/api/projects/[id]/route';
import * as projectsRoute from '../../app/api/projects/route';
import * as revisionsRoute from '../../app/api/projects/[id]/revisions/route';
import * as restoreRoute from '../../app/api/projects/[id]/revisions/[rid]/restore/route';
import * as forkRoute from '../../app/api/projects/[id]/fork/route';
import * as datasetRoute from '../../app/api/projects/[id]/datasets/[did]/route';
import * as tokensRoute from '../../app/api/tokens/route';
import * as healthRoute from '../../app/api/health/route';
import * as restRoute from '../../app/api/[[...rest]]/route';

let owner: TestUser;
let stranger: TestUser;
let admin: TestUser;

const g = globalThis as unknown as { __tauforgePeerHeader?: boolean };

beforeAll(async () => {
  owner = await makeUser('sec-owner');
  stranger = await makeUser('sec-stranger');
  admin = await makeUser('sec-admin', { siteRole: 'admin' });
});
beforeEach(() => resetRateLimits());
afterAll(async () => {
  g.__tauforgePeerHeader = undefined;
  await flushOutbox();
  await closeDb();
});

async function mailsTo(email: string, subject?: RegExp, atLeast = 1): Promise<{ subject: string; body_text: string }[]> {
  await flushOutbox();
  // The mail fake stores what it receives; give it a moment.
  for (let i = 0; i < 100; i++) {
    const rows = (await db()('mail_messages').where('mail_to', 'like', `%${email}%`).orderBy('id')) as { subject: string; body_text: string }[];
    const hits = subject ? rows.filter((r) => subject.test(r.subject)) : rows;
    if (hits.length >= atLeast) return hits;
    await new Promise((r) => setTimeout(r, 50));
  }
  return [];
}

describe('1. cross-site requests with a session cookie', () => {
  // Before: a page on another port posted a text/plain or form body and created an owner invitation.
  const invite = () => ({ email: `csrf-${Math.random().toString(36).slice(2, 8)}@lab.test`, role: 'owner' });

  it('refuses a foreign Origin, a missing origin, and non-JSON bodies; allows our own pages and tokens', async () => {
    const p = await makeProject(owner, []);
    const url = `/api/projects/${p.id}/members`;
    const params = { id: String(p.id) };
    const post = (headers: Record<string, string>, body: string | undefined, contentType?: string) => {
      const h: Record<string, string> = { cookie: owner.cookie, ...headers };
      if (contentType) h['content-type'] = contentType;
      return membersRoute.POST(new Request(`http://127.0.0.1${url}`, { method: 'POST', headers: h, body }), { params: Promise.resolve(params) });
    };
    const body = JSON.stringify(invite());
    // Another port of the same host is another origin.
    const foreign = await post({ origin: 'http://127.0.0.1:4000' }, body, 'application/json');
    expect(foreign.status).toBe(403);
    expect((await foreign.json()).error.details.reason).toBe('cross_site');
    expect((await post({ origin: 'null' }, body, 'application/json')).status).toBe(403);
    expect((await post({}, body, 'application/json')).status).toBe(403);
    expect((await post({ 'sec-fetch-site': 'same-site' }, body, 'application/json')).status).toBe(403);
    // Same origin but a body an HTML form could send.
    expect((await post({ origin: 'http://127.0.0.1' }, body, 'text/plain')).status).toBe(415);
    expect((await post({ origin: 'http://127.0.0.1' }, 'email=x%40lab.test&role=owner', 'application/x-www-form-urlencoded')).status).toBe(415);
    expect((await post({ origin: 'http://127.0.0.1' }, body, undefined)).status).toBe(415);
    // Nothing was stored by the refused calls.
    expect(await db()('invitations').where({ project_id: p.id }).count({ n: '*' }).first()).toMatchObject({ n: 0 });
    // Our own pages: Origin, or Sec-Fetch-Site when a browser leaves Origin out.
    expect((await post({ origin: 'http://127.0.0.1' }, JSON.stringify(invite()), 'application/json')).status).toBe(201);
    expect((await post({ 'sec-fetch-site': 'same-origin' }, JSON.stringify(invite()), 'application/json')).status).toBe(201);
    // A token call needs neither (a browser never attaches a token by itself).
    const token = await bearerFor(owner);
    const viaToken = await call(membersRoute, 'POST', url, { params, body: invite(), bearer: token });
    expect(viaToken.status).toBe(201);
  });

  it('applies to DELETE and PATCH too', async () => {
    const p = await makeProject(owner, []);
    const del = await projectRoute.DELETE(new Request(`http://127.0.0.1/api/projects/${p.id}`, { method: 'DELETE', headers: { cookie: owner.cookie, origin: 'http://evil.example' } }), { params: Promise.resolve({ id: String(p.id) }) });
    expect(del.status).toBe(403);
    expect(await db()('projects').where({ id: p.id }).first('id')).toBeTruthy();
  });
});

describe('3. client addresses and sign-in lockouts', () => {
  it('believes X-Forwarded-For only through trusted proxies (rightmost untrusted hop)', () => {
    const none = parseTrustedProxies('');
    const lb = parseTrustedProxies('10.0.0.0/8, ::1, 127.0.0.1');
    expect(resolveClientAddress('203.0.113.9', '1.2.3.4', none)).toBe('203.0.113.9');
    expect(resolveClientAddress('::ffff:203.0.113.9', null, none)).toBe('203.0.113.9');
    expect(resolveClientAddress(null, '1.2.3.4', none)).toBe('unknown');
    // Through our proxy: the client is the hop the proxy saw; what the client wrote further left is ignored.
    expect(resolveClientAddress('10.1.2.3', '6.6.6.6, 198.51.100.7', lb)).toBe('198.51.100.7');
    expect(resolveClientAddress('10.1.2.3', '6.6.6.6, 198.51.100.7, 10.9.9.9', lb)).toBe('198.51.100.7');
    expect(resolveClientAddress('127.0.0.1', 'garbage', lb)).toBe('127.0.0.1');
    expect(resolveClientAddress('203.0.113.9', '10.0.0.1', lb)).toBe('203.0.113.9'); // an untrusted peer cannot claim anything
    expect(() => parseTrustedProxies('10.0.0.0/99')).toThrow(/prefix/);
    expect(() => parseTrustedProxies('proxy.example')).toThrow(/not an IP/);
  });

  it('writes the socket address into the audit log, whatever X-Forwarded-For says', async () => {
    g.__tauforgePeerHeader = true; // what scripts/peer-address.cjs does in the server
    try {
      const email = `audit-${Date.now()}@lab.test`;
      const res = await call(resetRoute, 'POST', '/api/account/reset', { body: { email: owner.email }, headers: { [PEER_HEADER]: '192.0.2.10', 'x-forwarded-for': '6.6.6.6' } });
      expect(res.status).toBe(202);
      await call(signupRoute, 'POST', '/api/account/signup', { body: { email, name: 'Audit', password: 'long enough secret' }, headers: { [PEER_HEADER]: '192.0.2.11', 'x-forwarded-for': '6.6.6.6' } });
      await flushOutbox();
      const row = await db()('audit_log').where({ action: 'user.signup' }).orderBy('id', 'desc').first('ip');
      expect(row.ip).toBe('192.0.2.11');
    } finally {
      g.__tauforgePeerHeader = undefined;
    }
  });

  it('slows the guessing address down, never the owner, and tells the owner by mail', async () => {
    const u = await makeUser('lockout');
    const attacker = '198.51.100.66';
    let limited = 0;
    for (let i = 0; i < WARN_AFTER_FAILURES + 2; i++) {
      try {
        const r = await checkCredentials(u.email, `wrong guess ${i}`, `${attacker.slice(0, -2)}${10 + i}`); // rotating addresses: each is slowed on its own
        expect(r.ok).toBe(false);
      } catch {
        limited++;
      }
    }
    expect(limited).toBe(0); // different addresses, each under its free failures
    // One address guessing: after the free failures it must wait, and the wait grows.
    for (let i = 0; i < FREE_FAILURES; i++) expect((await checkCredentials(u.email, 'nope', attacker)).ok).toBe(false);
    expect((await checkCredentials(u.email, 'nope', attacker)).ok).toBe(false); // the fifth failure starts the delay
    await expect(checkCredentials(u.email, PASSWORD, attacker)).rejects.toMatchObject({ status: 429 });
    expect(failureDelaySeconds(FREE_FAILURES + 1)).toBe(30);
    expect(failureDelaySeconds(FREE_FAILURES + 3)).toBe(120);
    expect(failureDelaySeconds(100)).toBe(3600);
    // The owner, from their own address, signs in at once.
    const mine = await checkCredentials(u.email, PASSWORD, '192.0.2.200');
    expect(mine.ok).toBe(true);
    const warned = await mailsTo(u.email, /Failed sign-ins/);
    expect(warned.length).toBe(1);
    expect(warned[0].body_text).toMatch(/You can still sign in/);
  });
});

describe('4. signing up again with a pending address', () => {
  // Before: the second sign-up overwrote name and password, and the first link activated the attacker's password.
  it('never changes the pending account; it re-sends the link (and a reset link)', async () => {
    const email = `pending-${Date.now()}@lab.test`;
    const first = await call(signupRoute, 'POST', '/api/account/signup', { body: { email, name: 'Victim', password: 'victim password 1' } });
    expect(first.status).toBe(202);
    const [welcome] = await mailsTo(email, /Confirm your Tauforge address/);
    const firstLink = /verify\?token=([A-Za-z0-9_-]+)/.exec(welcome.body_text)![1];
    const second = await call(signupRoute, 'POST', '/api/account/signup', { body: { email, name: 'Attacker', password: 'attacker password' } });
    expect(second.status).toBe(202);
    // The same answer as for a new address: the caller learns nothing.
    expect(await second.json()).toEqual(await first.json());
    const mails = await mailsTo(email, /Confirm your Tauforge address/, 2);
    expect(mails.length).toBe(2);
    expect(mails[1].body_text).toMatch(/does not change its name or password/);
    expect(mails[1].body_text).toMatch(/reset\?token=/);
    const row = await db()('users').where({ email }).first('name', 'password_hash');
    expect(row.name).toBe('Victim');
    expect(await bcrypt.compare('victim password 1', row.password_hash)).toBe(true);
    expect(await bcrypt.compare('attacker password', row.password_hash)).toBe(false);
    // The victim's first link still works and activates the victim's password only.
    expect((await call(verifyRoute, 'POST', '/api/account/verify', { body: { token: firstLink } })).status).toBe(200);
    expect((await checkCredentials(email, 'victim password 1', '192.0.2.1')).ok).toBe(true);
    expect((await checkCredentials(email, 'attacker password', '192.0.2.2')).ok).toBe(false);
  });
});

describe('5. sessions end on reset, sign-out everywhere and disabling', () => {
  async function cookieFor(u: TestUser, sv: number): Promise<string> {
    return `next-auth.session-token=${await encode({ token: { uid: u.id, email: u.email, sv }, secret: process.env.NEXTAUTH_SECRET! })}`;
  }
  const me = (cookie: string) => call(meRoute, 'GET', '/api/me', { cookie });

  it('sign out everywhere ends this and every other session', async () => {
    const u = await makeUser('sessions');
    const laptop = u.cookie;
    const phone = await cookieFor(u, 0);
    expect((await me(laptop)).status).toBe(200);
    expect((await me(phone)).status).toBe(200);
    const out = await call(sessionsRoute, 'DELETE', '/api/account/sessions', { cookie: phone });
    expect(out.status).toBe(204);
    expect(out.headers.get('set-cookie')).toMatch(/Max-Age=0/);
    expect((await me(laptop)).status).toBe(401);
    expect((await me(phone)).status).toBe(401);
    // A token cannot end the browser sessions.
    const token = await bearerFor(u);
    expect((await call(sessionsRoute, 'DELETE', '/api/account/sessions', { bearer: token })).status).toBe(403);
  });

  it('a password reset ends the sessions signed in with the old password', async () => {
    const u = await makeUser('reset-sessions');
    expect((await me(u.cookie)).status).toBe(200);
    const token = await makeLink(u.id, 'reset');
    expect((await call(resetConfirmRoute, 'POST', '/api/account/reset/confirm', { body: { token, password: 'a brand new secret' } })).status).toBe(200);
    expect((await me(u.cookie)).status).toBe(401);
    const { sv } = { sv: Number((await db()('users').where({ id: u.id }).first('session_version')).session_version) };
    expect((await me(await cookieFor(u, sv))).status).toBe(200); // a sign-in after the reset works
  });

  it('disabling ends every session, and enabling again does not bring them back', async () => {
    const u = await makeUser('disable-sessions');
    expect((await me(u.cookie)).status).toBe(200);
    const params = { id: String(u.id) };
    expect((await call(adminUserRoute, 'PATCH', `/api/admin/users/${u.id}`, { params, cookie: admin.cookie, body: { disabled: true } })).status).toBe(200);
    expect((await me(u.cookie)).status).toBe(401);
    expect((await call(adminUserRoute, 'PATCH', `/api/admin/users/${u.id}`, { params, cookie: admin.cookie, body: { disabled: false } })).status).toBe(200);
    expect((await me(u.cookie)).status).toBe(401);
  });
});

describe('6. revision races', () => {
  // Before: 10 simultaneous restores gave 8 × 500 "Duplicate entry", and some 409s came without the newer head.
  it('10 simultaneous restores on one base: one 201, nine 409s that each carry the winner as the head', async () => {
    const p = await makeProject(owner, []);
    const params = { id: String(p.id), rid: String(p.rev1) };
    const results = await Promise.all(
      Array.from({ length: 10 }, () => call(restoreRoute, 'POST', `/api/projects/${p.id}/revisions/${p.rev1}/restore`, { params, cookie: owner.cookie, body: { baseRevision: p.rev2 } })),
    );
    const statuses = results.map((r) => r.status).sort();
    expect(statuses).toEqual([201, 409, 409, 409, 409, 409, 409, 409, 409, 409]);
    const bodies = await Promise.all(results.map((r) => r.json()));
    const winner = bodies[results.findIndex((r) => r.status === 201)];
    expect(winner.number).toBe(3);
    for (const [i, b] of bodies.entries()) {
      if (results[i].status === 409) expect(b.error.details.head).toMatchObject({ id: winner.id, number: 3 });
    }
  });

  it('10 simultaneous saves on one base: one 201, nine 409s with the newer head, never a 500', async () => {
    const p = await makeProject(owner, []);
    const results = await Promise.all(
      Array.from({ length: 10 }, (_, i) => call(revisionsRoute, 'POST', `/api/projects/${p.id}/revisions`, { params: { id: String(p.id) }, cookie: owner.cookie, body: { params: FIB, message: `race ${i}`, baseRevision: p.rev2 } })),
    );
    expect(results.map((r) => r.status).sort()).toEqual([201, 409, 409, 409, 409, 409, 409, 409, 409, 409]);
    const bodies = await Promise.all(results.map((r) => r.json()));
    const winner = bodies[results.findIndex((r) => r.status === 201)];
    for (const [i, b] of bodies.entries()) if (results[i].status === 409) expect(b.error.details.head.id).toBe(winner.id);
    expect(await db()('revisions').where({ project_id: p.id }).count({ n: '*' }).first()).toMatchObject({ n: 3 });
  });

  it('a restore must name its base', async () => {
    const p = await makeProject(owner, []);
    const r = await call(restoreRoute, 'POST', `/api/projects/${p.id}/revisions/${p.rev1}/restore`, { params: { id: String(p.id), rid: String(p.rev1) }, cookie: owner.cookie, body: {} });
    expect(r.status).toBe(400);
    expect((await r.json()).error.details.fields.baseRevision).toMatch(/head revision/);
  });
});

describe('7. account discovery by timing', () => {
  // Before: a reset for a known address took ~160 ms (mail sent in the request), for an unknown one ~8 ms.
  it('answers a reset request for known and unknown addresses in times a rank test cannot tell apart', async () => {
    const known: number[] = [];
    const unknown: number[] = [];
    const time = async (email: string) => {
      resetRateLimits();
      await flushOutbox(); // the work queued by the previous request must not slow this one
      const t = performance.now();
      const res = await call(resetRoute, 'POST', '/api/account/reset', { body: { email } });
      const ms = performance.now() - t;
      expect(res.status).toBe(202);
      return ms;
    };
    for (let i = 0; i < 3; i++) await time(owner.email); // warm up
    for (let i = 0; i < 40; i++) {
      // Interleaved, so drifts of the machine's load fall on both samples alike.
      known.push(await time(owner.email));
      unknown.push(await time(`nobody-${i}-${Date.now()}@lab.test`));
    }
    await flushOutbox();
    // Mann–Whitney U (scipy.stats.mannwhitneyu, two-sided): the old code (a mail in the request) gives
    // p < 1e-10 on 40 + 40 samples; equal-time answers give p spread uniformly on (0, 1).
    const { p } = runPython<{ p: number }>(
      'import json,sys\nfrom scipy.stats import mannwhitneyu\nd=json.load(sys.stdin)\nprint(json.dumps({"p": float(mannwhitneyu(d["a"], d["b"], alternative="two-sided").pvalue)}))',
      JSON.stringify({ a: known, b: unknown }),
    );
    const median = (a: number[]) => [...a].sort((x, y) => x - y)[a.length >> 1];
    console.info(`reset timing: known median ${median(known).toFixed(2)} ms, unknown median ${median(unknown).toFixed(2)} ms, Mann-Whitney p = ${p.toFixed(3)}`);
    expect(p, `known ${JSON.stringify(known.map(Math.round))} unknown ${JSON.stringify(unknown.map(Math.round))}`).toBeGreaterThan(1e-4);
  });
});

describe('8. downloads', () => {
  it('serves a dataset as application/octet-stream with an RFC 6266 filename* that keeps a non-ASCII name', async () => {
    const p = await makeProject(owner, []);
    const name = 'Mößbauer φ-scan "a;b".xy';
    await db()('datasets').where({ id: p.datasetId }).update({ filename: name });
    const res = await call(datasetRoute, 'GET', `/api/projects/${p.id}/datasets/${p.datasetId}`, { params: { id: String(p.id), did: String(p.datasetId) }, cookie: owner.cookie });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('application/octet-stream');
    expect(res.headers.get('x-content-type-options')).toBe('nosniff');
    const cd = res.headers.get('content-disposition')!;
    const star = /filename\*=[^;]+$/.exec(cd)![0];
    const plain = cd.slice(0, cd.indexOf('; filename*'));
    // Python's own RFC 2231/8187 reader (email.message) recovers the exact name from filename*, and
    // reads the fallback filename as plain ASCII. (Python keeps the first of two filename parameters,
    // so each is handed over alone.)
    const got = runPython<{ name: string; ascii: string }>(
      'import json,sys\nfrom email.message import Message\nd=json.load(sys.stdin)\na=Message(); a["content-disposition"]="attachment; "+d["star"]\nb=Message(); b["content-disposition"]=d["plain"]\nprint(json.dumps({"name": a.get_filename(), "ascii": b.get_filename()}))',
      JSON.stringify({ star, plain }),
    );
    expect(got.name).toBe(name);
    expect(got.ascii).toMatch(/^[\x20-\x7e]+$/);
    expect(got.ascii).toMatch(/\.xy$/);
  });
});

describe('9. small leaks and inconsistencies', () => {
  it('a public fork of a private parent shows neither its id nor its revision', async () => {
    const p = await makeProject(owner, []);
    const fork = await call(forkRoute, 'POST', `/api/projects/${p.id}/fork`, { params: { id: String(p.id) }, cookie: owner.cookie, body: {} });
    const f = await fork.json();
    await db()('projects').where({ id: f.id }).update({ visibility: 'public' });
    for (const cookie of [undefined, stranger.cookie]) {
      const res = await call(projectRoute, 'GET', `/api/projects/${f.id}`, { params: { id: String(f.id) }, cookie });
      expect(res.status).toBe(200);
      const body = await res.json();
      expect(body.parent).toEqual({ id: null, name: 'a private project', ownerName: '', revision: null, revisionNumber: null, visible: false });
      expect(body.forkedFrom).toBeNull();
      const list = await (await call(projectsRoute, 'GET', '/api/projects?scope=public&pageSize=100', { cookie })).json();
      expect(list.items.find((x: { id: number }) => x.id === f.id).forkedFrom).toBeNull();
    }
    const mine = await (await call(projectRoute, 'GET', `/api/projects/${f.id}`, { params: { id: String(f.id) }, cookie: owner.cookie })).json();
    expect(mine.parent).toMatchObject({ id: p.id, revision: p.rev2, visible: true });
  });

  it('unknown /api paths answer a JSON 404; the 405 table matches every route module', async () => {
    const res = await restRoute.GET(new Request('http://127.0.0.1/api/nothing/here'));
    expect(res.status).toBe(404);
    expect((await res.json()).error).toMatchObject({ code: 'not_found', details: null });
    // The build-time table (next.config.mjs) against what each route module really exports.
    for (const [route, methods] of apiMethodTable()) {
      const mod = await import(/* @vite-ignore */ join(__dirname, '..', '..', 'app', 'api', route, 'route.ts'));
      const real = ['GET', 'HEAD', 'POST', 'PUT', 'PATCH', 'DELETE', 'OPTIONS'].filter((m) => typeof mod[m] === 'function');
      expect(methods, route).toEqual(real.sort());
    }
    process.env.TAUFORGE_API_METHODS = JSON.stringify(apiMethodTable());
    expect(allowedMethods('/api/projects/12/revisions')).toEqual(['GET', 'HEAD', 'OPTIONS', 'POST']);
    expect(allowedMethods('/api/tokens')).toEqual(['DELETE', 'GET', 'HEAD', 'OPTIONS', 'POST']);
    expect(allowedMethods('/api/health')).toEqual(['GET', 'HEAD', 'OPTIONS']);
    expect(allowedMethods('/api/no/such/thing')).toBeNull();
  });

  it('strict ids: 0x10, 1e1, " 16", 016 and 16.0 are not project 16', async () => {
    const p = await makeProject(owner, [], 'public');
    const ok = await call(projectRoute, 'GET', `/api/projects/${p.id}`, { params: { id: String(p.id) } });
    expect(ok.status).toBe(200);
    const hex = `0x${p.id.toString(16)}`;
    for (const raw of [hex, `${p.id}e0`, ` ${p.id}`, `0${p.id}`, `${p.id}.0`, `+${p.id}`]) {
      const r = await call(projectRoute, 'GET', `/api/projects/${encodeURIComponent(raw)}`, { params: { id: raw } });
      expect(r.status, raw).toBe(404);
    }
    const token = await bearerFor(owner);
    const r = await call(tokensRoute, 'DELETE', '/api/tokens?id=0x10', { bearer: token });
    expect(r.status).toBe(400);
  });

  it('health tells anonymous callers only "unreachable"; the API answers 503 while the database is down', async () => {
    await closeDb();
    const saved = process.env.TAUFORGE_DB_PORT;
    process.env.TAUFORGE_DB_PORT = '1';
    try {
      const h = await healthRoute.GET(new Request('http://127.0.0.1/api/health'));
      expect(h.status).toBe(503);
      const body = await h.json();
      expect(body.database).toEqual({ reachable: false, status: 'unreachable', latestMigration: null });
      const r = await call(projectRoute, 'GET', '/api/projects/1', { params: { id: '1' } });
      expect(r.status).toBe(503);
      expect(r.headers.get('retry-after')).toBe('30');
      expect((await r.json()).error.code).toBe('unavailable');
    } finally {
      await closeDb();
      process.env.TAUFORGE_DB_PORT = saved;
    }
  });

  it('personal tokens: an expired one is refused, a read-only one can read but not write', async () => {
    const u = await makeUser('tokens');
    const create = await call(tokensRoute, 'POST', '/api/tokens', { cookie: u.cookie, body: { name: 'reader', scope: 'read', expiresInDays: 30 } });
    expect(create.status).toBe(201);
    const made = await create.json();
    expect(made.scope).toBe('read');
    expect(Date.parse(made.expiresAt) - Date.now()).toBeGreaterThan(29 * 86_400_000);
    expect((await call(meRoute, 'GET', '/api/me', { bearer: made.token })).status).toBe(200);
    const write = await call(projectsRoute, 'POST', '/api/projects', { bearer: made.token, body: { name: 'nope', starter: 'fibonacci' } });
    expect(write.status).toBe(403);
    expect((await write.json()).error.details.reason).toBe('read_only_token');
    await db()('api_tokens').where({ id: made.id }).update({ expires_at: new Date(Date.now() - 1000) });
    expect((await call(meRoute, 'GET', '/api/me', { bearer: made.token })).status).toBe(401);
    expect((await call(tokensRoute, 'POST', '/api/tokens', { cookie: u.cookie, body: { name: 'x', expiresInDays: 1000 } })).status).toBe(400);
  });

  it('caps JSON bodies while reading, and authorises before reading any', async () => {
    const p = await makeProject(owner, []);
    const big = { params: FIB, message: 'x'.repeat(300 * 1024), baseRevision: p.rev2 };
    const mine = await call(revisionsRoute, 'POST', `/api/projects/${p.id}/revisions`, { params: { id: String(p.id) }, cookie: owner.cookie, body: big });
    expect(mine.status).toBe(413);
    // A stranger's body is never read: the hidden project answers 404 first.
    const theirs = await call(revisionsRoute, 'POST', `/api/projects/${p.id}/revisions`, { params: { id: String(p.id) }, cookie: stranger.cookie, body: big });
    expect(theirs.status).toBe(404);
    // A body without Content-Length, streamed, is cut off at the cap as well.
    const stream = new ReadableStream<Uint8Array>({
      pull(c) {
        c.enqueue(new Uint8Array(64 * 1024).fill(32));
      },
    });
    const req = new Request(`http://127.0.0.1/api/projects/${p.id}/revisions`, { method: 'POST', headers: { cookie: owner.cookie, origin: 'http://127.0.0.1', 'content-type': 'application/json' }, body: stream, duplex: 'half' } as RequestInit);
    const endless = await revisionsRoute.POST(req, { params: Promise.resolve({ id: String(p.id) }) });
    expect(endless.status).toBe(413);
  });
});

afterAll(() => forgetUser(owner?.id ?? 0));
