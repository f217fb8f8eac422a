/**
 * Jobs as the API sees them: start (a durable row in MariaDB, then a BullMQ job in Redis), read state and
 * progress, list a project's jobs, cancel, and a sweep's ranked points. Limits checked here: queue
 * length per user; identical requests coalesce through the unique `active_key` (one pending job per key).
 */
import { z } from 'zod';
import { db } from '../db';
import { ApiError } from '../errors';
import { access, type Actor, type ProjectAction } from '../authz';
import { audit } from '../audit';
import { paramsHash, sha256Hex } from '../crypto';
import { iso, listQuery, type Page } from '../paging';
import { parseModelParams } from '../../models';
import { bullId, cancelChannel, plainRedis, queue } from './connection';
import { limits } from './limits';
import { gridPoint, gridSize } from './grid';
import type { JobKind } from './kinds';
import { diffractionJobSchema, indexJobSchema, sweepJobSchema } from './kinds';
import { saveRevision } from '../revisions';

export type JobState = 'queued' | 'running' | 'done' | 'failed' | 'cancelled';
export const jobListQuery = listQuery(['created_at', 'state', 'kind'] as const, 'created_at');
export const pointListQuery = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});

export interface JobInfo {
  id: number;
  project: number;
  kind: JobKind;
  state: JobState;
  progress: number;
  stage: string | null;
  input: Record<string, unknown>;
  result: unknown;
  error: { code: string; message: string; details: unknown } | null;
  total: number | null;
  done: number;
  attempts: number;
  createdBy: string | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  url: string;
}

const parseJson = (v: unknown) => (typeof v === 'string' ? JSON.parse(v) : v);

// eslint-disable-next-line @typescript-eslint/no-explicit-any
export function jobInfo(r: any): JobInfo {
  let error = null;
  if (r.error) {
    try {
      error = JSON.parse(r.error);
    } catch {
      error = { code: 'failed', message: String(r.error), details: null };
    }
  }
  // A running sweep's progress is its count of finished points (kept by the workers, one commit per batch of points).
  const sweeping = r.kind === 'sweep' && r.state === 'running' && r.total != null && Number(r.total) > 0;
  return {
    id: Number(r.id),
    project: Number(r.project_id),
    kind: r.kind,
    state: r.state,
    progress: sweeping ? Math.min(1, Number(r.done ?? 0) / Number(r.total)) : Number(r.progress),
    stage: sweeping ? `${Number(r.done ?? 0)} of ${Number(r.total)} points` : (r.stage ?? null),
    input: parseJson(r.input) ?? {},
    result: parseJson(r.result) ?? null,
    error,
    total: r.total == null ? null : Number(r.total),
    done: Number(r.done ?? 0),
    attempts: Number(r.attempts ?? 0),
    createdBy: r.user_name ?? null,
    createdAt: iso(r.created_at)!,
    startedAt: iso(r.started_at),
    finishedAt: iso(r.finished_at),
    url: `/api/jobs/${r.id}`,
  };
}

function jobQuery() {
  return db()('jobs as j').leftJoin('users as u', 'u.id', 'j.user_id').select('j.*', 'u.name as user_name');
}

export interface EnqueueOptions {
  /** Identical work (same key) while one is pending becomes that one job. */
  coalesce?: unknown;
  /** Data for the worker that is not kept in MariaDB (an upload's text). */
  extra?: Record<string, unknown>;
  total?: number;
}

/** Insert the durable row and queue it. The caller has checked access. */
export async function enqueue(actor: Actor, projectId: number, kind: JobKind, input: Record<string, unknown>, o: EnqueueOptions = {}): Promise<{ job: JobInfo; coalesced: boolean }> {
  const activeKey = o.coalesce === undefined ? null : sha256Hex(`${kind}\n${paramsHash(o.coalesce)}`);
  if (activeKey) {
    const same = await jobQuery().where('j.active_key', activeKey).first();
    if (same) return { job: jobInfo(same), coalesced: true };
  }
  const { maxQueuedPerUser } = limits();
  const [{ n }] = await db()('jobs').where({ user_id: actor.id }).whereIn('state', ['queued', 'running']).count({ n: '*' });
  if (Number(n) >= maxQueuedPerUser) {
    throw new ApiError('rate_limited', `You have ${n} jobs waiting or running (the limit is ${maxQueuedPerUser}); wait for one to finish or cancel one.`, { retryAfterSeconds: 10 });
  }
  let id: number;
  try {
    [id] = await db()('jobs').insert({ project_id: projectId, user_id: actor.id, kind, input: JSON.stringify(input), active_key: activeKey, total: o.total ?? null });
  } catch (e) {
    // Two identical requests raced: the other one's job is the answer.
    if (activeKey && e instanceof Error && /Duplicate/.test(e.message)) {
      const same = await jobQuery().where('j.active_key', activeKey).first();
      if (same) return { job: jobInfo(same), coalesced: true };
    }
    throw e;
  }
  try {
    await queue().add(kind, { jobId: Number(id), ...o.extra }, { jobId: bullId(Number(id)), removeOnComplete: true, removeOnFail: 1000 });
  } catch (e) {
    await db()('jobs').where({ id }).update({ state: 'failed', active_key: null, finished_at: db().fn.now(3), error: JSON.stringify({ code: 'queue_unreachable', message: 'The job queue (Redis) could not be reached; nothing was started. Try again shortly.', details: null }) });
    console.error('tauforge queue: add failed', e instanceof Error ? e.message : e);
    throw new ApiError('internal', 'The job queue could not be reached; nothing was started. Try again shortly.');
  }
  await audit({ actorId: actor.id, action: `job.${kind}`, targetType: 'job', targetId: Number(id), details: { project: projectId } });
  return { job: jobInfo(await jobQuery().where('j.id', id).first()), coalesced: false };
}

async function revisionParams(projectId: number, revisionId: number): Promise<unknown> {
  const rev = await db()('revisions').where({ id: revisionId, project_id: projectId }).first('params');
  if (!rev) throw new ApiError('not_found', 'No such revision in this project.');
  return parseJson(rev.params);
}

async function patternDataset(projectId: number, datasetId: number): Promise<void> {
  const ds = await db()('datasets').where({ id: datasetId, project_id: projectId }).first('kind');
  if (!ds) throw new ApiError('not_found', 'No such dataset in this project.');
  if (ds.kind !== 'pattern') throw new ApiError('unprocessable', 'That dataset is a structure file; choose a measured pattern.');
}

const ACTION: Record<'diffraction' | 'index' | 'sweep', ProjectAction> = { diffraction: 'export', index: 'export', sweep: 'edit' };

/** Start a diffraction, index or sweep job (exports start through lib/server/exports.ts). */
export async function startJob(actor: Actor | null, projectId: number, body: { kind: 'diffraction' | 'index' | 'sweep' } & Record<string, unknown>): Promise<{ job: JobInfo; coalesced: boolean }> {
  await access(actor, projectId, ACTION[body.kind]);
  const a = actor!;
  if (body.kind === 'diffraction') {
    const input = diffractionJobSchema.parse(body);
    await revisionParams(projectId, input.revision);
    return enqueue(a, projectId, 'diffraction', input, { coalesce: { project: projectId, ...input } });
  }
  if (body.kind === 'index') {
    const input = indexJobSchema.parse(body);
    await patternDataset(projectId, input.dataset);
    return enqueue(a, projectId, 'index', input, { coalesce: { project: projectId, ...input } });
  }
  const input = sweepJobSchema.parse(body);
  const base = await revisionParams(projectId, input.revision);
  await patternDataset(projectId, input.dataset);
  const total = gridSize(input.axes);
  const max = limits().maxSweepPoints;
  if (total > max) throw new ApiError('validation_failed', `The grid has ${total} points; the limit is ${max}. Use fewer values per axis.`, { fields: { axes: `at most ${max} points` } });
  // Every value of every axis, tried alone on the base params: a bad value is refused here, before
  // anything is queued (Σ values checks, not Π).
  input.axes.forEach((axis, k) => {
    axis.values.forEach((v, i) => {
      try {
        parseModelParams(gridPoint(base, [{ path: axis.path, values: [v] }], 0));
      } catch (e) {
        throw new ApiError('validation_failed', `Axis ${axis.path}, value ${JSON.stringify(v)}: ${e instanceof Error ? e.message : e}`, { fields: { [`axes.${k}.values.${i}`]: 'not valid for this model' } });
      }
    });
  });
  return enqueue(a, projectId, 'sweep', input, { total });
}

async function jobRow(actor: Actor | null, jobId: number, action: ProjectAction = 'read') {
  const r = await jobQuery().where('j.id', jobId).first();
  if (!r) throw new ApiError('not_found', 'No such job, or you cannot see it.');
  try {
    await access(actor, Number(r.project_id), action);
  } catch (e) {
    if (e instanceof ApiError && e.code === 'not_found') throw new ApiError('not_found', 'No such job, or you cannot see it.');
    throw e;
  }
  return r;
}

export async function getJob(actor: Actor | null, jobId: number): Promise<JobInfo> {
  return jobInfo(await jobRow(actor, jobId));
}

export async function listJobs(actor: Actor | null, projectId: number, q: z.infer<typeof jobListQuery>): Promise<Page<JobInfo>> {
  await access(actor, projectId, 'read');
  const base = jobQuery().where('j.project_id', projectId);
  if (q.q) base.where('j.kind', q.q);
  const [{ n }] = await db().count<{ n: number }[]>({ n: '*' }).from(base.clone().as('x'));
  const rows = await base.orderBy(`j.${q.sort}`, q.dir).orderBy('j.id', 'desc').limit(q.pageSize).offset((q.page - 1) * q.pageSize);
  return { items: rows.map(jobInfo), total: Number(n), page: q.page, pageSize: q.pageSize };
}

/** Cancel: the one who started it, or an editor of the project. A finished job answers 409. */
export async function cancelJob(actor: Actor | null, jobId: number): Promise<JobInfo> {
  const r = await jobRow(actor, jobId);
  if (!actor) throw new ApiError('unauthenticated', 'Sign in (or send an API token) to do this.');
  if (Number(r.user_id) !== actor.id) await access(actor, Number(r.project_id), 'edit');
  const n = await db()('jobs').where({ id: jobId }).whereIn('state', ['queued', 'running']).update({ state: 'cancelled', active_key: null, finished_at: db().fn.now(3), stage: 'cancelled' });
  if (n === 0) throw new ApiError('conflict', `This job has already ${r.state === 'done' ? 'finished' : r.state === 'failed' ? 'failed' : 'been cancelled'}.`);
  try {
    await queue().remove(bullId(jobId));
  } catch {
    /* running (locked by a worker): the worker hears the cancel below */
  }
  try {
    await plainRedis().publish(cancelChannel(), String(jobId));
  } catch {
    /* the worker also checks the row before each sweep point */
  }
  await audit({ actorId: actor.id, action: 'job.cancel', targetType: 'job', targetId: jobId, details: { project: Number(r.project_id) } });
  return getJob(actor, jobId);
}

export interface SweepPoint {
  idx: number;
  params: Record<string, unknown>;
  rwp: number | null;
  rp: number | null;
  atoms: number | null;
  error: string | null;
  runs: number;
  rank: number | null;
}

/** A sweep's points, best R_wp first (failed and unfinished points last). */
export async function sweepPoints(actor: Actor | null, jobId: number, q: z.infer<typeof pointListQuery>): Promise<Page<SweepPoint>> {
  const r = await jobRow(actor, jobId);
  if (r.kind !== 'sweep') throw new ApiError('not_found', 'This job is not a sweep.');
  const [{ n }] = await db()('sweep_points').where({ job_id: jobId }).count({ n: '*' });
  const rows = await db()('sweep_points').where({ job_id: jobId })
    .orderByRaw('rwp IS NULL, rwp ASC, idx ASC').limit(q.pageSize).offset((q.page - 1) * q.pageSize);
  const items = rows.map((p, i) => ({
    idx: Number(p.idx),
    params: parseJson(p.params),
    rwp: p.rwp == null ? null : Number(p.rwp),
    rp: p.rp == null ? null : Number(p.rp),
    atoms: p.atoms == null ? null : Number(p.atoms),
    error: p.error ?? null,
    runs: Number(p.runs),
    rank: p.rwp == null ? null : (q.page - 1) * q.pageSize + i + 1,
  }));
  return { items, total: Number(n), page: q.page, pageSize: q.pageSize };
}

export const savePointSchema = z.strictObject({
  point: z.number().int().min(0).optional(),
  message: z.string().trim().min(1).max(500).optional(),
});

/** Save a sweep point (the best R_wp unless one is named) as a new revision of the project. */
export async function saveSweepPoint(actor: Actor | null, jobId: number, input: z.infer<typeof savePointSchema>) {
  const r = await jobRow(actor, jobId, 'edit');
  if (r.kind !== 'sweep') throw new ApiError('not_found', 'This job is not a sweep.');
  const q = db()('sweep_points').where({ job_id: jobId });
  const p = input.point === undefined ? await q.whereNotNull('rwp').orderBy('rwp', 'asc').orderBy('idx', 'asc').first() : await q.where({ idx: input.point }).first();
  if (!p) throw new ApiError('not_found', input.point === undefined ? 'No point of this sweep has an R_wp yet.' : 'No such point in this sweep.');
  if (p.rwp == null) throw new ApiError('unprocessable', `Point ${p.idx} has no result${p.error ? `: ${p.error}` : ' yet'}.`);
  const project = await db()('projects').where({ id: r.project_id }).first('head_revision');
  const message = input.message ?? `Sweep ${jobId}, point ${p.idx}: R_wp ${(100 * Number(p.rwp)).toFixed(2)} %`;
  return saveRevision(actor, Number(r.project_id), { params: parseJson(p.params), message, baseRevision: project?.head_revision == null ? null : Number(project.head_revision) });
}
