/**
 * Revisions: every save is a new immutable row. Saves carry the revision the client edited
 * (baseRevision); if the head has moved on, the save answers 409 with the newer head and stores
 * nothing, so the client still holds its edits and can merge them onto the newer revision.
 */
import { z } from 'zod';
import type { Knex } from 'knex';
import { modelParamsSchema } from '../models/params';
import { db } from './db';
import { ApiError } from './errors';
import { access, type Actor } from './authz';
import { audit } from './audit';
import { iso, listQuery, type Page, contains } from './paging';
import { fieldErrors, queryId } from './http';
import { jsonDiff, type DiffEntry } from './json-diff';

export const saveRevisionSchema = z.strictObject({
  params: z.unknown().refine((v) => v !== undefined, 'send the model params'),
  message: z.string({ message: 'describe the change' }).trim().min(1, 'describe the change in a few words').max(500, 'at most 500 characters'),
  baseRevision: z.number({ message: 'send the id of the revision you edited' }).int().positive().nullable(),
});

/** A restore names the head it was asked on top of, like a save: a stale base answers 409 with the newer head. */
export const restoreSchema = z.strictObject({
  message: z.string().trim().max(500).optional(),
  baseRevision: z.number({ message: 'send the id of the head revision you restore on top of' }).int().positive().nullable(),
});

export const revisionListQuery = listQuery(['number', 'created_at'] as const, 'number');
export const diffQuery = z.object({
  from: queryId('from (a revision id)'),
  to: queryId('to (a revision id)'),
});

export interface RevisionInfo {
  id: number;
  number: number;
  message: string;
  authorName: string | null;
  createdAt: string;
  params: Record<string, unknown>;
}

/** The params a revision stores (a project's first one included): valid model params, or a 400 naming each field under `params.`. */
export function validateParams(params: unknown): Record<string, unknown> {
  const r = modelParamsSchema.safeParse(params);
  if (!r.success) throw new ApiError('validation_failed', 'The model parameters are not valid.', { fields: prefix(fieldErrors(r.error), 'params') });
  return r.data as Record<string, unknown>;
}

function prefix(fields: Record<string, string>, p: string): Record<string, string> {
  return Object.fromEntries(Object.entries(fields).map(([k, v]) => [k === '(body)' ? p : `${p}.${k}`, v]));
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
export function revisionInfo(r: any): RevisionInfo {
  return {
    id: Number(r.id),
    number: Number(r.number),
    message: r.message,
    authorName: r.author_name ?? null,
    createdAt: iso(r.created_at)!,
    params: typeof r.params === 'string' ? JSON.parse(r.params) : r.params,
  };
}

function revQuery() {
  return db()('revisions as r').leftJoin('users as u', 'u.id', 'r.author_id').select('r.*', 'u.name as author_name');
}

export async function listRevisions(actor: Actor | null, projectId: number, q: z.infer<typeof revisionListQuery>): Promise<Page<RevisionInfo>> {
  await access(actor, projectId, 'read');
  const base = revQuery().where('r.project_id', projectId);
  if (q.q) base.where('r.message', 'like', contains(q.q));
  const [{ n }] = await db().count<{ n: number }[]>({ n: '*' }).from(base.clone().as('x'));
  const rows = await base.orderBy(`r.${q.sort}`, q.dir).orderBy('r.id', q.dir).limit(q.pageSize).offset((q.page - 1) * q.pageSize);
  return { items: rows.map(revisionInfo), total: Number(n), page: q.page, pageSize: q.pageSize };
}

export async function getRevision(actor: Actor | null, projectId: number, revisionId: number): Promise<RevisionInfo> {
  await access(actor, projectId, 'read');
  const r = await revQuery().where({ 'r.id': revisionId, 'r.project_id': projectId }).first();
  if (!r) throw new ApiError('not_found', 'No such revision in this project.');
  return revisionInfo(r);
}

/**
 * Insert a revision on top of `baseRevision`. Order matters under concurrency (InnoDB, REPEATABLE READ):
 * the project row is locked by the transaction's very first statement, so every later read in it — the
 * access check, the head, the next number — sees the state after the previous writer committed. (Reading
 * anything before the lock fixes the transaction's snapshot early, and the next number read from that
 * stale snapshot collided: "Duplicate entry" 500s, and 409s whose newer head was invisible.) The head
 * and the number are read with locking reads as well, which always see the newest committed rows.
 */
async function insertRevision(actor: Actor | null, projectId: number, params: unknown, message: string, baseRevision: number | null | undefined, action: string, details: Record<string, unknown> = {}): Promise<RevisionInfo> {
  const valid = validateParams(params);
  const id = await db().transaction(async (trx) => {
    const locked = await trx('projects').where({ id: projectId }).forUpdate().first('head_revision');
    await access(actor, projectId, 'edit', trx);
    if (!locked) throw new ApiError('not_found', 'No such project, or you cannot see it.');
    const head = locked.head_revision ? Number(locked.head_revision) : null;
    if (baseRevision !== undefined && baseRevision !== head) {
      const newer = head ? await trx('revisions as r').leftJoin('users as u', 'u.id', 'r.author_id').where('r.id', head).forShare().first('r.*', 'u.name as author_name') : null;
      throw new ApiError('conflict', 'Someone saved a newer revision while you were editing. Your changes were not saved; review the newer revision and save again on top of it.', {
        baseRevision,
        head: newer ? revisionInfo(newer) : null,
      });
    }
    const last = await trx('revisions').where({ project_id: projectId }).forUpdate().max<{ n: number | null }>({ n: 'number' }).first();
    const number = Number(last?.n ?? 0) + 1;
    const [rid] = await trx('revisions').insert({ project_id: projectId, number, params: JSON.stringify(valid), message, author_id: actor!.id });
    await trx('projects').where({ id: projectId }).update({ head_revision: rid, updated_at: trx.fn.now(3) });
    await audit({ actorId: actor!.id, action, targetType: 'revision', targetId: rid, details: { project: projectId, number, ...details } }, trx);
    return Number(rid);
  });
  const r = await revQuery().where('r.id', id).first();
  return revisionInfo(r);
}

/**
 * Copies a project's revisions 1…upTo into another project as they are: same numbers, params (the
 * stored JSON text, so every params hash is unchanged), messages, authors and times. Revisions are
 * immutable and numbered without gaps, so this is the history of revision upTo. Used by a fork, inside
 * its transaction, after the access check; answers how many revisions were copied.
 */
export async function copyHistory(trx: Knex.Transaction, fromProject: number, toProject: number, upTo: number): Promise<number> {
  const [result] = await trx.raw(
    'INSERT INTO revisions (project_id, number, params, message, author_id, created_at) ' +
      'SELECT ?, number, params, message, author_id, created_at FROM revisions WHERE project_id = ? AND number <= ? ORDER BY number',
    [toProject, fromProject, upTo],
  );
  return Number((result as { affectedRows: number }).affectedRows);
}

export async function saveRevision(actor: Actor | null, projectId: number, input: z.infer<typeof saveRevisionSchema>): Promise<RevisionInfo> {
  return insertRevision(actor, projectId, input.params, input.message, input.baseRevision, 'revision.save');
}

export async function restoreRevision(actor: Actor | null, projectId: number, revisionId: number, input: z.infer<typeof restoreSchema>): Promise<RevisionInfo> {
  await access(actor, projectId, 'edit');
  const old = await db()('revisions').where({ id: revisionId, project_id: projectId }).first();
  if (!old) throw new ApiError('not_found', 'No such revision in this project.');
  const params = typeof old.params === 'string' ? JSON.parse(old.params) : old.params;
  return insertRevision(actor, projectId, params, input.message || `Restore revision ${old.number}`, input.baseRevision, 'revision.restore', { restored: revisionId });
}

export async function diffRevisions(actor: Actor | null, projectId: number, q: z.infer<typeof diffQuery>): Promise<{ from: RevisionInfo; to: RevisionInfo; changes: DiffEntry[] }> {
  const from = await getRevision(actor, projectId, q.from);
  const to = await getRevision(actor, projectId, q.to);
  return { from, to, changes: jsonDiff(from.params, to.params) };
}
