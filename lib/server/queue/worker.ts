/**
 * A queue worker process (`npm run worker`, built to dist/worker/main.mjs). It takes jobs from Redis one
 * at a time, runs each heavy part in a task thread with time and memory limits (runner.ts), and writes
 * the durable record in MariaDB. Needs only REDIS_URL and the TAUFORGE_DB_* settings, so any machine
 * that reaches both can add workers. Start one per core.
 */
import { DelayedError, Worker, type Job } from 'bullmq';
import { db } from '../db';
import { audit } from '../audit';
import { paramsHash, sha256Hex } from '../crypto';
import { ENGINE_VERSION } from '../../version';
import { cancelChannel, pointsId, queueName, queue, redis } from './connection';
import { limits, timeLimitMs } from './limits';
import { TaskError, TaskThread } from './runner';
import { gridPoint, gridSize, type Axis } from './grid';
import { guidedBatches } from './batches';
import type { JobKind, PowderSettings, SweepJob } from './kinds';
import { indexJobSchema, NEED_MEASURED } from './kinds';
import type { Parsed } from '../datasets';

/** Exports are stored in pieces of this size: far below max_allowed_packet even hex-escaped (tests set it small). */
const CHUNK_BYTES = Number(process.env.TAUFORGE_EXPORT_CHUNK_BYTES) > 0 ? Number(process.env.TAUFORGE_EXPORT_CHUNK_BYTES) : 4 * 1024 * 1024;

interface PointResult {
  idx: number;
  rwp: number | null;
  rp: number | null;
  atoms: number | null;
  error: string | null;
}

const parseJson = (v: unknown) => (typeof v === 'string' ? JSON.parse(v) : v);
const now = () => db().fn.now(3);

function errJson(code: string, message: string, details: unknown = null): string {
  return JSON.stringify({ code, message, details });
}

async function finish(id: number, result: unknown): Promise<void> {
  await db()('jobs').where({ id, state: 'running' }).update({ state: 'done', progress: 1, stage: null, result: JSON.stringify(result), active_key: null, finished_at: now() });
}

async function failJob(id: number, code: string, message: string, details: unknown = null): Promise<void> {
  await db()('jobs').where({ id }).whereIn('state', ['queued', 'running']).update({ state: 'failed', stage: null, error: errJson(code, message, details), active_key: null, finished_at: now() });
}

function settingsOf(input: Record<string, unknown>): PowderSettings {
  const { radiation, wavelength, twoThetaMin, twoThetaMax, step, fwhm } = input as unknown as PowderSettings;
  return { radiation, wavelength, twoThetaMin, twoThetaMax, step, fwhm };
}

export interface WorkerHandle {
  worker: Worker;
  close(): Promise<void>;
}

export async function startWorker(threadFile: URL, o: { log?: (m: string) => void } = {}): Promise<WorkerHandle> {
  const log = o.log ?? ((m: string) => console.log(`[worker ${process.pid}] ${m}`));
  const L = limits();
  const thread = new TaskThread(threadFile, L.memoryMb);
  thread.warm(); // load the task thread's code now, not when the first job arrives
  /** Which job row the thread works for now (a sweep's id while it runs one of its points). */
  let running: number | null = null;
  const measuredCache = new Map<number, string>();
  /** Sweeps cancelled while this worker holds a batch of their points: the batch stops at its next point. */
  const cancelled = new Set<number>();

  const sub = redis();
  await sub.subscribe(cancelChannel());
  sub.on('message', (_ch: string, msg: string) => {
    const id = Number(msg);
    if (cancelled.size > 1000) cancelled.clear();
    cancelled.add(id);
    if (running !== null && id === running) thread.cancel();
  });

  async function task<T>(id: number, kind: Exclude<JobKind, 'sweep'>, input: unknown, progress = true): Promise<T> {
    let last = 0;
    running = id;
    try {
      return await thread.run<T>(kind, input, {
        timeMs: timeLimitMs(kind),
        onProgress: progress
          ? (fraction, stage) => {
              const t = Date.now();
              if (t - last < 500) return;
              last = t;
              void db()('jobs').where({ id, state: 'running' }).update({ progress: Math.min(0.99, fraction), stage: stage.slice(0, 200) }).catch(() => {});
            }
          : undefined,
      });
    } finally {
      running = null;
    }
  }

  /** Claim a job row: queued → running, unless its owner already runs their share of jobs. */
  async function claim(row: { id: number; user_id: number | null }): Promise<boolean> {
    return db().transaction(async (trx) => {
      if (row.user_id != null) {
        await trx('users').where({ id: row.user_id }).forUpdate().first('id');
        const [{ n }] = await trx('jobs').where({ user_id: row.user_id, state: 'running' }).whereNot({ id: row.id }).count({ n: '*' });
        if (Number(n) >= L.maxRunningPerUser) return false;
      }
      const u = await trx('jobs').where({ id: row.id }).whereIn('state', ['queued', 'running'])
        .update({ state: 'running', started_at: trx.raw('COALESCE(started_at, CURRENT_TIMESTAMP(3))'), attempts: trx.raw('attempts + 1'), stage: 'starting' });
      return u > 0;
    });
  }

  async function runExport(id: number, input: { revision: number; format: string }, userId: number | null, projectId: number) {
    const rev = await db()('revisions').where({ id: input.revision }).first('params');
    if (!rev) return failJob(id, 'not_found', 'The revision was deleted before the export ran.');
    const params = parseJson(rev.params);
    const stored = await db()('exports').where({ revision_id: input.revision, format: input.format, engine_version: ENGINE_VERSION }).first('id');
    if (stored) return finish(id, { export: Number(stored.id) });
    const { bytes } = await task<{ bytes: Uint8Array }>(id, 'export', { params, format: input.format });
    const buf = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    await db()('jobs').where({ id }).update({ stage: 'storing', progress: 0.95 });
    const exportId = await db().transaction(async (trx) => {
      const chunks = Math.ceil(buf.length / CHUNK_BYTES);
      const [eid] = await trx('exports').insert({
        revision_id: input.revision, format: input.format, bytes: Buffer.alloc(0), chunks, sha256: sha256Hex(buf),
        params_hash: paramsHash(params), engine_version: ENGINE_VERSION, size: buf.length, created_by: userId,
      });
      for (let i = 0; i < chunks; i++) {
        await trx('export_chunks').insert({ export_id: eid, seq: i, bytes: buf.subarray(i * CHUNK_BYTES, (i + 1) * CHUNK_BYTES) });
      }
      await audit({ actorId: userId, action: 'export.create', targetType: 'export', targetId: Number(eid), details: { project: projectId, revision: input.revision, format: input.format, job: id } }, trx);
      return Number(eid);
    });
    await finish(id, { export: exportId, size: buf.length });
  }

  async function runParse(id: number, input: { filename: string; kind: 'auto' | 'pattern' | 'structure'; mediaType: string }, text: string, userId: number | null, projectId: number) {
    const parsed = await task<Parsed>(id, 'parse', { text, filename: input.filename, kind: input.kind });
    const bytes = Buffer.from(text, 'utf8');
    const datasetId = await db().transaction(async (trx) => {
      const [did] = await trx('datasets').insert({
        project_id: projectId, kind: parsed.kind, filename: input.filename, format: parsed.format, media_type: input.mediaType,
        bytes, sha256: sha256Hex(bytes), size: bytes.length, summary: JSON.stringify(parsed.summary), uploaded_by: userId,
      });
      await audit({ actorId: userId, action: 'dataset.upload', targetType: 'dataset', targetId: Number(did), details: { project: projectId, filename: input.filename, kind: parsed.kind } }, trx);
      return Number(did);
    });
    await finish(id, { dataset: datasetId });
  }

  async function measured(datasetId: number): Promise<string> {
    let text = measuredCache.get(datasetId);
    if (text === undefined) {
      const ds = await db()('datasets').where({ id: datasetId }).first('bytes');
      if (!ds) throw new TaskError('not_found', 'The measured dataset was deleted.');
      text = Buffer.from(ds.bytes).toString('utf8');
      if (measuredCache.size > 20) measuredCache.clear();
      measuredCache.set(datasetId, text);
    }
    return text;
  }

  /**
   * A sweep fans out: one record per grid point, keyed by the point index, and queued batches of points in
   * guided sizes (batches.ts) — at most 8 points, ⌈R/(4P)⌉ for R points left and P live workers — so the
   * queue and database round trips are paid per batch while the last batches are single points.
   */
  async function runSweep(id: number, input: SweepJob) {
    const rev = await db()('revisions').where({ id: input.revision }).first('params');
    if (!rev) return failJob(id, 'not_found', 'The revision was deleted before the sweep ran.');
    const base = parseJson(rev.params);
    const axes = input.axes as Axis[];
    const total = gridSize(axes);
    for (let start = 0; start < total; start += 500) {
      const rows = [];
      for (let i = start; i < Math.min(total, start + 500); i++) rows.push({ job_id: id, idx: i, params: JSON.stringify(gridPoint(base, axes, i)) });
      await db()('sweep_points').insert(rows).onConflict(['job_id', 'idx']).ignore();
    }
    await db()('jobs').where({ id }).update({ total, stage: `0 of ${total} points` });
    const pending = (await db()('sweep_points').where({ job_id: id }).whereNull('finished_at').orderBy('idx').pluck('idx')).map(Number);
    const live = await queue().getWorkersCount().catch(() => 1);
    const batches = guidedBatches(pending, { workers: live, factor: 4, max: 8 });
    // Re-adding a batch that is still queued is a no-op: BullMQ keeps one job per id, and the id names the
    // batch's points. A resumed sweep may batch differently; a point in two batches is recorded once.
    for (let s = 0; s < batches.length; s += 500) {
      await queue().addBulk(batches.slice(s, s + 500).map((idx) => ({ name: 'points', data: { sweep: id, idx }, opts: { jobId: pointsId(id, idx), removeOnComplete: true, removeOnFail: 1000 } })));
    }
    await settle(id);
  }

  /**
   * Record finished points and count them on their sweep in one transaction: the point rows and the sweep's
   * `done` change together or not at all (a worker killed in between cannot leave them apart), and only points
   * still unfinished count, so a retried point is never counted twice. Then close the sweep if these were its
   * last points. One commit per batch.
   */
  async function recordPoints(sweepId: number, results: PointResult[]) {
    if (results.length === 0) return;
    await db().transaction(async (trx) => {
      const rows = results.map(() => 'SELECT ? AS idx, ? AS rwp, ? AS rp, ? AS atoms, ? AS error').join(' UNION ALL ');
      const [res] = await trx.raw(
        `UPDATE sweep_points p JOIN (${rows}) v ON v.idx = p.idx
            SET p.rwp = v.rwp, p.rp = v.rp, p.atoms = v.atoms, p.error = v.error, p.runs = p.runs + 1, p.finished_at = CURRENT_TIMESTAMP(3)
          WHERE p.job_id = ? AND p.finished_at IS NULL`,
        [...results.flatMap((r) => [r.idx, r.rwp, r.rp, r.atoms, r.error]), sweepId],
      );
      const n = Number((res as { affectedRows?: number }).affectedRows ?? 0);
      if (n > 0) await trx('jobs').where({ id: sweepId }).increment('done', n);
    });
    await settle(sweepId);
  }

  /** Close the sweep when every point is in (its `done` counts each point once) with the best R_wp. */
  async function settle(sweepId: number) {
    const s = await db()('jobs').where({ id: sweepId }).first('state', 'total', 'done');
    if (!s || s.state !== 'running' || s.total == null) return;
    const total = Number(s.total);
    if (Number(s.done) < total) return;
    // The counter says all are in: confirm from the rows themselves before closing.
    const [{ n }] = await db()('sweep_points').where({ job_id: sweepId }).whereNotNull('finished_at').count({ n: '*' });
    if (Number(n) < total) return;
    const best = await db()('sweep_points').where({ job_id: sweepId }).whereNotNull('rwp').orderBy('rwp', 'asc').orderBy('idx', 'asc').first();
    const [{ f }] = await db()('sweep_points').where({ job_id: sweepId }).whereNull('rwp').count({ f: '*' });
    await finish(sweepId, { best: best ? { point: Number(best.idx), rwp: Number(best.rwp), params: parseJson(best.params) } : null, failedPoints: Number(f), points: total });
  }

  /** Sweep inputs by id (fixed once the sweep is queued), so a point reads only its own row. */
  const sweepInputs = new Map<number, SweepJob>();
  /** Datasets the task thread holds parsed, for the thread generation `threadHas.gen`. */
  const threadHas = { gen: -1, datasets: new Set<number>() };

  /** A batch of a sweep's points (legacy jobs carry one index): cut, pattern and R_wp each, recorded together. */
  async function runPoints(data: { sweep: number; idx: number | number[] }) {
    const sweep = Number(data.sweep);
    const wanted = (Array.isArray(data.idx) ? data.idx : [data.idx]).map(Number);
    // One round trip: the sweep's state (a cancel shows here) and the batch's points.
    const rows = await db()('sweep_points as p').join('jobs as j', 'j.id', 'p.job_id').where({ 'p.job_id': sweep }).whereIn('p.idx', wanted).orderBy('p.idx').select('j.state', 'p.idx', 'p.params', 'p.finished_at');
    if (rows.length === 0 || rows[0].state !== 'running') return; // cancelled, failed or gone: nothing to do
    cancelled.delete(sweep);
    let input = sweepInputs.get(sweep);
    if (!input) {
      const s = await db()('jobs').where({ id: sweep }).first('input');
      if (!s) return;
      input = parseJson(s.input) as SweepJob;
      if (sweepInputs.size > 50) sweepInputs.clear();
      sweepInputs.set(sweep, input);
    }
    const dataset = Number(input.dataset);
    const settings = settingsOf(input);
    const results: PointResult[] = [];
    try {
      for (const row of rows) {
        if (row.finished_at) continue;
        if (cancelled.has(sweep)) return;
        const params = parseJson(row.params);
        // The measured pattern crosses to the thread once per thread; later points name the dataset only.
        const run = async (send: boolean) =>
          task<{ atoms: number; rwp: number; rp: number }>(sweep, 'point', { params, dataset, measured: send ? await measured(dataset) : undefined, settings }, false);
        try {
          let r;
          try {
            r = await run(!(threadHas.gen === thread.generation && threadHas.datasets.has(dataset)));
          } catch (e) {
            if (!(e instanceof TaskError && e.code === NEED_MEASURED)) throw e;
            r = await run(true);
          }
          if (threadHas.gen !== thread.generation) threadHas.datasets = new Set();
          threadHas.gen = thread.generation;
          threadHas.datasets.add(dataset);
          results.push({ idx: Number(row.idx), rwp: Number.isFinite(r.rwp) ? r.rwp : null, rp: Number.isFinite(r.rp) ? r.rp : null, atoms: r.atoms, error: Number.isFinite(r.rwp) ? null : 'R_wp is not defined for this point' });
        } catch (e) {
          if (e instanceof TaskError && e.code === 'cancelled') return;
          if (!(e instanceof TaskError)) throw e;
          results.push({ idx: Number(row.idx), rwp: null, rp: null, atoms: null, error: e.message.slice(0, 2000) });
        }
      }
    } finally {
      // Points done before an error of the worker's own code are kept (a cancelled sweep needs none).
      if (!cancelled.has(sweep)) await recordPoints(sweep, results);
    }
    // Every point of the batch was in already (a retried batch): the sweep may still need closing.
    if (results.length === 0) await settle(sweep);
  }

  async function processTop(job: Job, token: string | undefined) {
    const id = Number(job.data.jobId);
    const row = await db()('jobs').where({ id }).first();
    if (!row || !['queued', 'running'].includes(row.state)) return; // cancelled before it started
    if (!(await claim(row))) {
      // The owner runs their share already: try again in a moment, without counting an attempt.
      await job.moveToDelayed(Date.now() + 1000 + Math.floor(Math.random() * 500), token);
      throw new DelayedError();
    }
    const input = parseJson(row.input);
    log(`job ${id} (${row.kind}) started`);
    try {
      switch (row.kind as JobKind) {
        case 'export':
          await runExport(id, input, row.user_id, Number(row.project_id));
          break;
        case 'parse':
          await runParse(id, input, String(job.data.text ?? ''), row.user_id, Number(row.project_id));
          break;
        case 'diffraction': {
          const rev = await db()('revisions').where({ id: input.revision }).first('params');
          if (!rev) return failJob(id, 'not_found', 'The revision was deleted before the job ran.');
          await finish(id, await task(id, 'diffraction', { params: parseJson(rev.params), settings: settingsOf(input) }));
          break;
        }
        case 'index': {
          // Parsed again so a job queued before a setting existed runs with its default.
          const { kind: _k, dataset, ...settings } = indexJobSchema.parse({ ...input, kind: 'index' });
          await finish(id, await task(id, 'index', { text: await measured(dataset), settings }));
          break;
        }
        case 'sweep':
          await runSweep(id, input);
          break;
        default:
          await failJob(id, 'internal', `Unknown job kind ${row.kind}.`);
      }
      log(`job ${id} (${row.kind}) handed on`);
    } catch (e) {
      if (e instanceof TaskError) {
        if (e.code !== 'cancelled') await failJob(id, e.code, e.message, e.details);
        log(`job ${id} (${row.kind}): ${e.code}`);
        return;
      }
      throw e;
    }
  }

  const worker = new Worker(
    queueName(),
    async (job, token) => (job.name === 'points' || job.name === 'point' ? runPoints(job.data) : processTop(job, token)),
    { connection: redis(), concurrency: 1, lockDuration: L.lockMs, stalledInterval: Math.max(1000, Math.floor(L.lockMs / 2)), maxStalledCount: 3 },
  );
  // Jobs that fail outside a task (the database went away, or the workers running it died three times).
  worker.on('failed', (job, err) => {
    if (!job) return;
    const stalled = /stalled/i.test(err.message);
    const msg = stalled ? 'The worker running this job stopped (crashed or was killed) several times; the job was given up.' : `The job failed on the worker: ${err.message}`;
    if (job.name === 'points' || job.name === 'point') {
      const idx: number[] = Array.isArray(job.data.idx) ? job.data.idx.map(Number) : [Number(job.data.idx)];
      void recordPoints(Number(job.data.sweep), idx.map((i) => ({ idx: i, rwp: null, rp: null, atoms: null, error: msg }))).catch(() => {});
    } else void failJob(Number(job.data.jobId), stalled ? 'worker_lost' : 'worker_error', msg).catch(() => {});
  });
  worker.on('error', (e) => log(`queue error: ${e.message}`));
  await worker.waitUntilReady();
  log(`ready (Redis ${new URL(process.env.REDIS_URL || 'redis://127.0.0.1').host || 'local'}, heap limit ${L.memoryMb} MB per task)`);
  return {
    worker,
    async close() {
      await worker.close();
      await thread.close();
      sub.disconnect();
    },
  };
}
