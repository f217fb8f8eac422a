/**
 * The job queue against the real Redis and MariaDB that `npm test` starts: worker processes of the built
 * worker (dist/worker), on a queue of this file's own. Life cycle (202 → queued → running → done),
 * coalescing, chunked exports read back by gemmi, uploads parsed by a worker, cancel, limits (queue
 * length, time, memory), a sweep that survives a worker killed with SIGKILL (every point recorded
 * exactly once), and a worker on an external Redis named by REDIS_URL.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { closeDb, db } from '../../lib/server/db';
import { closeQueue } from '../../lib/server/queue/connection';
import { generate } from '../../lib/models';
import { runJob } from '../../lib/worker/engine';
import { runPython } from '../helpers/python';
import { syntheticPattern } from '../unit/diffraction/quasicrystal/synthetic';
import { call, makeProject, makeUser, type ProjectFixture, type TestUser } from './api-fixtures';
import { buildWorker, root, startWorker, until, type WorkerProc } from './queue-helpers';
import * as jobsRoute from '../../app/api/projects/[id]/jobs/route';
import * as jobRoute from '../../app/api/jobs/[id]/route';
import * as pointsRoute from '../../app/api/jobs/[id]/points/route';
import * as saveRoute from '../../app/api/jobs/[id]/save/route';
import * as exportsRoute from '../../app/api/projects/[id]/exports/route';
import * as downloadRoute from '../../app/api/exports/[id]/download/route';
import * as datasetsRoute from '../../app/api/projects/[id]/datasets/route';

const QUEUE = `test-queue-${process.pid}`;
process.env.TAUFORGE_QUEUE = QUEUE;
const ICO = (order: string, aR = 4.6) => ({ family: 'icosahedral', mode: 'approximant', order, aR, lattice: 'P', species: 'Al' });
const POWDER = { radiation: 'xray' as const, wavelength: 1.5406, twoThetaMin: 10, twoThetaMax: 60, step: 0.05, fwhm: 0.2 };
const WORKER_ENV = { TAUFORGE_QUEUE: QUEUE, TAUFORGE_JOB_LOCK_MS: '2000', TAUFORGE_EXPORT_CHUNK_BYTES: '1000' };

let main: string;
let owner: TestUser;
let p: ProjectFixture;
let ico11: number;
let ico32: number;
const workers: WorkerProc[] = [];

async function addRevision(params: unknown, number: number): Promise<number> {
  const [id] = await db()('revisions').insert({ project_id: p.id, number, params: JSON.stringify(params), message: 'queue test', author_id: owner.id });
  await db()('projects').where({ id: p.id }).update({ head_revision: id });
  return Number(id);
}

async function worker(env: Record<string, string> = {}): Promise<WorkerProc> {
  const w = await startWorker(main, { ...WORKER_ENV, ...env });
  workers.push(w);
  return w;
}

const startJob = (body: unknown) => call(jobsRoute, 'POST', `/api/projects/${p.id}/jobs`, { params: { id: String(p.id) }, body, cookie: owner.cookie });
const getJob = async (id: number) => (await call(jobRoute, 'GET', `/api/jobs/${id}`, { params: { id: String(id) }, cookie: owner.cookie })).json();
const finished = (id: number, ms = 60_000) => until(`job ${id}`, async () => {
  const j = await getJob(id);
  return ['done', 'failed', 'cancelled'].includes(j.state) ? j : null;
}, ms);

beforeAll(async () => {
  main = await buildWorker();
  owner = await makeUser('queue-owner');
  p = await makeProject(owner, []);
  ico11 = await addRevision(ICO('1/1'), 3);
  ico32 = await addRevision(ICO('3/2'), 4);
});

afterAll(async () => {
  await Promise.all(workers.map((w) => w.kill('SIGKILL')));
  await closeQueue();
  await closeDb();
});

describe('export jobs', () => {
  it('answer 202, coalesce identical requests, run on a worker, and store the file in chunks', async () => {
    const body = { revision: ico11, format: 'cif' };
    const r1 = await call(exportsRoute, 'POST', `/api/projects/${p.id}/exports`, { params: { id: String(p.id) }, body, cookie: owner.cookie });
    expect(r1.status).toBe(202);
    const b1 = await r1.json();
    expect(r1.headers.get('location')).toBe(`/api/jobs/${b1.job.id}`);
    expect(b1.job.state).toBe('queued');
    // No worker yet: the second request finds the first one pending and joins it.
    const b2 = await (await call(exportsRoute, 'POST', `/api/projects/${p.id}/exports`, { params: { id: String(p.id) }, body, cookie: owner.cookie })).json();
    expect(b2.job.id).toBe(b1.job.id);
    expect(b2.coalesced).toBe(true);

    await worker();
    const done = await finished(b1.job.id);
    expect(done.state).toBe('done');
    expect(done.startedAt).not.toBeNull();
    expect(done.finishedAt).not.toBeNull();
    const exportId = done.result.export;
    const chunks = await db()('export_chunks').where({ export_id: exportId }).count({ n: '*' });
    expect(Number(chunks[0].n)).toBeGreaterThan(1); // 1000-byte chunks in this test

    const again = await call(exportsRoute, 'POST', `/api/projects/${p.id}/exports`, { params: { id: String(p.id) }, body, cookie: owner.cookie });
    expect(again.status).toBe(200);
    const dl = await call(downloadRoute, 'GET', `/api/exports/${exportId}/download`, { params: { id: String(exportId) }, cookie: owner.cookie });
    const text = await dl.text();
    expect(Number(dl.headers.get('content-length'))).toBe(Buffer.byteLength(text));
    // Reference: gemmi (python3-gemmi) reads the reassembled CIF: a cubic cell (the P-lattice cubic
    // approximant) with one site per atom of the cut.
    const g = runPython<{ a: number; b: number; c: number; alpha: number; sites: number }>(
      'import sys, json, gemmi\nb = gemmi.cif.read_string(sys.stdin.read()).sole_block()\ns = gemmi.make_small_structure_from_block(b)\nprint(json.dumps({"a": s.cell.a, "b": s.cell.b, "c": s.cell.c, "alpha": s.cell.alpha, "sites": len(s.get_all_unit_cell_sites())}))',
      text,
    );
    expect(g.b).toBeCloseTo(g.a, 6);
    expect(g.c).toBeCloseTo(g.a, 6);
    expect(g.alpha).toBeCloseTo(90, 6);
    expect(g.sites).toBe(generate(ICO('1/1')).species.length);
  });
});

describe('uploads', () => {
  it('are parsed by a worker: 201 with the dataset, 422 and nothing stored for a bad file', async () => {
    const form = new FormData();
    form.set('file', new File(['2theta intensity\n10 5\n20 7\n30 2\n'], 'small.xy', { type: 'text/plain' }));
    const ok = await call(datasetsRoute, 'POST', `/api/projects/${p.id}/datasets`, { params: { id: String(p.id) }, form, cookie: owner.cookie });
    expect(ok.status).toBe(201);
    expect((await ok.json()).summary.points).toBe(3);
    const before = await db()('datasets').where({ project_id: p.id }).count({ n: '*' });
    const bad = new FormData();
    bad.set('file', new File(['data_x\n_cell_length_a 4\nloop_\n_atom_site_label\n'], 'broken.cif', { type: 'text/plain' }));
    const r = await call(datasetsRoute, 'POST', `/api/projects/${p.id}/datasets`, { params: { id: String(p.id) }, form: bad, cookie: owner.cookie });
    expect(r.status).toBe(422);
    const after = await db()('datasets').where({ project_id: p.id }).count({ n: '*' });
    expect(after[0].n).toBe(before[0].n);
  });
});

describe('cancel', () => {
  it('stops a running job; a second cancel answers 409', async () => {
    const r = await startJob({ kind: 'diffraction', revision: ico32, ...POWDER, twoThetaMax: 120, step: 0.01 });
    expect(r.status).toBe(202);
    const job = await r.json();
    await until('running', async () => (await getJob(job.id)).state === 'running');
    const c = await call(jobRoute, 'DELETE', `/api/jobs/${job.id}`, { params: { id: String(job.id) }, cookie: owner.cookie });
    expect(c.status).toBe(200);
    expect((await c.json()).state).toBe('cancelled');
    const again = await call(jobRoute, 'DELETE', `/api/jobs/${job.id}`, { params: { id: String(job.id) }, cookie: owner.cookie });
    expect(again.status).toBe(409);
    // The worker stopped the thread and took the next job: a quick export runs at once.
    const next = await (await startJob({ kind: 'export', revision: ico11, format: 'xyz' })).json();
    expect((await finished(next.id, 20_000)).state).toBe('done');
    expect((await getJob(job.id)).state).toBe('cancelled');
  });
});

describe('limits', () => {
  it('refuse a job beyond the queue length per user (429)', async () => {
    await Promise.all(workers.splice(0).map((w) => w.kill()));
    const saved = process.env.TAUFORGE_JOBS_MAX_QUEUED;
    process.env.TAUFORGE_JOBS_MAX_QUEUED = '2';
    try {
      const a = await (await startJob({ kind: 'diffraction', revision: ico11, ...POWDER, fwhm: 0.3 })).json();
      const b = await (await startJob({ kind: 'diffraction', revision: ico11, ...POWDER, fwhm: 0.4 })).json();
      const c = await startJob({ kind: 'diffraction', revision: ico11, ...POWDER, fwhm: 0.5 });
      expect(c.status).toBe(429);
      expect((await c.json()).error.message).toMatch(/limit is 2/);
      for (const j of [a, b]) await call(jobRoute, 'DELETE', `/api/jobs/${j.id}`, { params: { id: String(j.id) }, cookie: owner.cookie });
    } finally {
      process.env.TAUFORGE_JOBS_MAX_QUEUED = saved;
    }
  });

  it('run one user\'s jobs one at a time when the per-user running limit is 1, even with two idle workers', async () => {
    const ws = [await worker({ TAUFORGE_JOBS_MAX_RUNNING: '1' }), await worker({ TAUFORGE_JOBS_MAX_RUNNING: '1' })];
    const body = (fwhm: number) => ({ kind: 'diffraction', revision: ico32, ...POWDER, fwhm });
    const ids = [(await (await startJob(body(0.21))).json()).id, (await (await startJob(body(0.22))).json()).id];
    let both = 0;
    let seen = 0;
    await until('both jobs', async () => {
      const states = await Promise.all(ids.map(async (id) => (await getJob(id)).state));
      if (states.every((x) => x === 'running')) both += 1;
      if (states.some((x) => x === 'running')) seen += 1;
      return states.every((x) => x === 'done');
    }, 120_000, 50);
    expect(seen).toBeGreaterThan(0);
    expect(both).toBe(0);
    await Promise.all(ws.map((w) => w.kill()));
    workers.splice(0);
  });

  it('stop a job over its time limit and one over its memory limit, with errors that say so', async () => {
    // One limit per worker, so neither can trip the other (the fast structure-factor path of a 3/2 cell
    // needs more than 16 MB).
    // The slow job must take well over 1 s however fast the powder route gets: the 5/3 cell (2 440 atoms) with
    // Mo Kα1 to 2θ = 150° (about 10⁷ reflections, several seconds of one core).
    const wt = await worker({ TAUFORGE_JOB_TIME_DIFFRACTION: '1' });
    const ico53 = await addRevision(ICO('5/3'), 6);
    const slow = await (await startJob({ kind: 'diffraction', revision: ico53, ...POWDER, wavelength: 0.709317, twoThetaMax: 150, step: 0.005 })).json();
    const s = await finished(slow.id);
    expect(s.state).toBe('failed');
    expect(s.error.code).toBe('timed_out');
    expect(s.error.message).toMatch(/1 s limit/);
    await wt.kill();
    const w = await worker({ TAUFORGE_JOB_MEMORY_MB: '16' });
    const big = await addRevision(ICO('13/8'), 5);
    const huge = await (await startJob({ kind: 'export', revision: big, format: 'extxyz' })).json();
    const h = await finished(huge.id, 120_000);
    expect(h.state).toBe('failed');
    expect(h.error.code).toBe('out_of_memory');
    expect(h.error.message).toMatch(/16 MB memory limit/);
    await w.kill();
  });
});

describe('sweeps', () => {
  it('fan out over two workers, survive one being killed, record every point exactly once, save the best', async () => {
    // The "measured" pattern is the simulated one of aR = 4.6 Å plus a flat background of 1: the grid
    // point with aR = 4.6 must come out best with R_wp ≈ 0, every other one worse.
    const s = generate(ICO('1/1'));
    const curve = runJob({ kind: 'powder', structure: s, ...POWDER });
    const lines = ['2theta intensity', ...Array.from(curve.twoTheta, (t, i) => `${t.toFixed(4)} ${(curve.intensity[i] + 1).toPrecision(10)}`)];
    const form = new FormData();
    form.set('file', new File([lines.join('\n')], 'synthetic.xy', { type: 'text/plain' }));
    const wA = await worker();
    const wB = await worker();
    const up = await call(datasetsRoute, 'POST', `/api/projects/${p.id}/datasets`, { params: { id: String(p.id) }, form, cookie: owner.cookie });
    expect(up.status, await up.clone().text()).toBe(201);
    const dataset = (await up.json()).id;
    const aRs = [4.3, 4.4, 4.5, 4.55, 4.6, 4.65, 4.7, 4.8, 4.9, 5.0];
    const r = await startJob({ kind: 'sweep', revision: ico11, dataset, axes: [{ path: 'aR', values: aRs }, { path: 'species', values: ['Al', 'Cu', 'Pd'] }], ...POWDER });
    expect(r.status).toBe(202);
    const sweep = await r.json();
    expect(sweep.total).toBe(30);
    await until('a few points', async () => (await getJob(sweep.id)).done >= 4);
    await wA.kill('SIGKILL');
    const done = await finished(sweep.id, 120_000);
    expect(done.state).toBe('done');
    expect(done.done).toBe(30);
    const rows = await db()('sweep_points').where({ job_id: sweep.id }).orderBy('idx');
    expect(rows.map((x) => Number(x.idx))).toEqual(Array.from({ length: 30 }, (_, i) => i));
    expect(rows.every((x) => x.finished_at !== null && x.rwp !== null && Number(x.runs) >= 1)).toBe(true);
    const best = (await (await call(pointsRoute, 'GET', `/api/jobs/${sweep.id}/points?pageSize=3`, { params: { id: String(sweep.id) }, cookie: owner.cookie })).json()).items;
    expect(best[0].params.aR).toBe(4.6);
    expect(best[0].params.species).toBe('Al');
    expect(best[0].rwp).toBeLessThan(1e-6);
    expect(best[1].rwp).toBeGreaterThan(best[0].rwp);
    const saved = await call(saveRoute, 'POST', `/api/jobs/${sweep.id}/save`, { params: { id: String(sweep.id) }, body: {}, cookie: owner.cookie });
    expect(saved.status).toBe(201);
    expect((await saved.json()).params.aR).toBe(4.6);
    await wB.kill();
  });
});

describe('sweep cancel', () => {
  it('stops the batch a worker holds at once: no point of it is recorded and the worker takes the next job', async () => {
    const w = await worker();
    // A 1–2 s point: the 3/2 cell (576 atoms) with Mo Kα1 to 150°. With one live worker the first batch holds
    // 8 of the 40 points, so a worker that finished its batch would stay busy for many seconds after the cancel.
    const text = '2theta intensity\n' + Array.from({ length: 400 }, (_, i) => `${(10 + i * 0.25).toFixed(2)} ${1 + (i % 7)}`).join('\n') + '\n';
    const [dataset] = await db()('datasets').insert({ project_id: p.id, kind: 'pattern', filename: 'flat.xy', format: 'two-column', bytes: Buffer.from(text), sha256: '2'.repeat(64), size: text.length, summary: '{}', uploaded_by: owner.id });
    const aRs = Array.from({ length: 40 }, (_, i) => Number((4.5 + 0.005 * i).toFixed(3)));
    const r = await startJob({ kind: 'sweep', revision: ico32, dataset: Number(dataset), axes: [{ path: 'aR', values: aRs }], ...POWDER, wavelength: 0.70932, twoThetaMax: 150, step: 0.02 });
    expect(r.status).toBe(202);
    const sweep = await r.json();
    await until('the first batch running', async () => (await db()('jobs').where({ id: sweep.id }).first('total')).total === 40, 20_000);
    await new Promise((res) => setTimeout(res, 300));
    const c = await call(jobRoute, 'DELETE', `/api/jobs/${sweep.id}`, { params: { id: String(sweep.id) }, cookie: owner.cookie });
    expect(c.status).toBe(200);
    const doneAtCancel = Number((await getJob(sweep.id)).done);
    const t0 = Date.now();
    const nr = await startJob({ kind: 'export', revision: ico11, format: 'extxyz' });
    expect(nr.status, await nr.clone().text()).toBe(202);
    const next = await nr.json();
    expect((await finished(next.id, 20_000)).state).toBe('done');
    // The rest of an 8-point batch would take well over 8 s; the export ran right after the cancel.
    expect(Date.now() - t0).toBeLessThan(8000);
    const after = await getJob(sweep.id);
    expect(after.state).toBe('cancelled');
    expect(Number(after.done)).toBe(doneAtCancel);
    const [{ n }] = await db()('sweep_points').where({ job_id: sweep.id }).whereNotNull('finished_at').count({ n: '*' });
    expect(Number(n)).toBe(doneAtCancel);
    await w.kill();
  });
});

describe('index jobs', () => {
  async function storePattern(name: string, text: string): Promise<number> {
    const [id] = await db()('datasets').insert({ project_id: p.id, kind: 'pattern', filename: name, format: 'two-column', bytes: Buffer.from(text), sha256: '0'.repeat(64), size: text.length, summary: '{}', uploaded_by: owner.id });
    return Number(id);
  }

  it('index a measured icosahedral pattern on a worker: indexed peaks, aR ± σ and the zero shift', async () => {
    // The pattern is made by numpy outside lib/ (tests/unit/diffraction/quasicrystal/synthetic.ts: the six
    // five-fold axes of the icosahedron, Coxeter, Regular Polytopes §3.7; N and M of Cahn, Shechtman & Gratias,
    // J. Mater. Res. 1 (1986) 13) with aR = 4.56 Å and a zero shift of 0.037°; Cu Kα1 = 1.5405929 Å
    // (Hölzer et al., Phys. Rev. A 56 (1997) 4554).
    const s = syntheticPattern({ aR: 4.56, lattice: 'P', zero: 0.037, lambda: 1.5405929, fwhm: 0.08, seed: 11 });
    const dataset = await storePattern('icosahedral.xy', '2theta intensity\n' + s.x.map((x, i) => `${x.toFixed(3)} ${s.y[i]}`).join('\n') + '\n');
    const w = await worker();
    try {
      const r = await startJob({ kind: 'index', dataset, lattice: 'P', wavelength: 1.5405929 });
      expect(r.status).toBe(202);
      const j = await finished((await r.json()).id);
      expect(j.state, JSON.stringify(j.error)).toBe('done');
      const o = j.result;
      expect(Math.abs(o.aR / 4.56 - 1)).toBeLessThan(5e-4);
      expect(o.aRSigma).toBeGreaterThan(0);
      expect(o.aRSigma).toBeLessThan(0.01);
      expect(Math.abs(o.zeroShift - 0.037)).toBeLessThan(0.01);
      expect(o.zeroShiftSigma).toBeGreaterThan(0);
      expect(o.indexed).toBeGreaterThanOrEqual(6);
      // Every indexed peak carries its N, M; the strongest synthetic lines are among them with the numpy N, M.
      const indexed = o.peaks.filter((x: { N: number | null }) => x.N !== null);
      expect(indexed.length).toBe(o.indexed);
      const strong = [...s.lines].sort((a, b) => b.i - a.i).slice(0, 3);
      for (const line of strong) {
        const near = [...indexed].sort((a: { twoTheta: number }, b: { twoTheta: number }) => Math.abs(a.twoTheta - line.tt) - Math.abs(b.twoTheta - line.tt))[0];
        expect(Math.abs(near.twoTheta - line.tt - 0.037)).toBeLessThan(0.05);
        expect(near, `line N=${line.n} M=${line.m} at ${line.tt.toFixed(3)}°`).toBeDefined();
        expect([near.N, near.M]).toEqual([line.n, line.m]);
      }

      // A pattern without peaks: the job fails with the indexer's own reason.
      const flat = await storePattern('flat.xy', Array.from({ length: 100 }, (_, i) => `${20 + i * 0.5} 100`).join('\n'));
      const f = await finished((await (await startJob({ kind: 'index', dataset: flat })).json()).id);
      expect(f.state).toBe('failed');
      expect(f.error.code).toBe('unprocessable');
      expect(f.error.message).toMatch(/peaks found/);
      // Bad settings are refused before anything is queued.
      const bad = await startJob({ kind: 'index', dataset, lattice: 'Q' });
      expect(bad.status).toBe(400);
    } finally {
      await w.kill();
    }
  });
});

describe('an external Redis through REDIS_URL', () => {
  it('carries the jobs when the server and the worker are pointed at it', async () => {
    const { startRedis } = (await import(join(root, 'scripts', 'lib', 'redis.mjs'))) as { startRedis: (o: object) => Promise<{ url: string; port: number; stop: () => Promise<void> }> };
    const { freePort } = (await import(join(root, 'scripts', 'lib', 'proc.mjs'))) as { freePort: () => Promise<number> };
    const dir = join(root, '.data', `test-ext-redis-${process.pid}`);
    mkdirSync(dir, { recursive: true });
    const ext = await startRedis({ dataDir: dir, port: await freePort(), persist: false, fresh: true });
    const saved = process.env.REDIS_URL;
    try {
      await closeQueue();
      process.env.REDIS_URL = ext.url;
      const w = await worker({ REDIS_URL: ext.url });
      const j = await (await startJob({ kind: 'export', revision: ico11, format: 'json' })).json();
      expect((await finished(j.id)).state).toBe('done');
      expect(w.log.join('')).toContain(`Redis 127.0.0.1:${ext.port}`);
      await w.kill();
    } finally {
      await closeQueue();
      process.env.REDIS_URL = saved;
      await ext.stop();
      rmSync(dir, { recursive: true, force: true });
      rmSync(`${dir}-run`, { recursive: true, force: true });
    }
  });
});
