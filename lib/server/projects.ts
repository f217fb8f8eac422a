/** Projects: create from a starter, list, read with lineage, change settings, delete, fork. */
import { z } from 'zod';
import type { Knex } from 'knex';
import { STARTERS } from '../models/starters';
import { db } from './db';
import { ApiError, notFound } from './errors';
import { access, canRead, permissions, type Actor, type ProjectRole, type Visibility } from './authz';
import { audit } from './audit';
import { iso, listQuery, type Page, contains } from './paging';
import { copyHistory, revisionInfo, validateParams, type RevisionInfo } from './revisions';

const VISIBILITY = ['private', 'unlisted', 'public'] as const;

const tagsSchema = z
  .array(z.string().trim().min(1, 'a tag cannot be empty').max(32, 'a tag has at most 32 characters').regex(/^[\p{L}\p{N} ._+/-]+$/u, 'tags hold letters, digits, spaces and . _ + / -'))
  .max(12, 'at most 12 tags')
  .transform((t) => [...new Set(t)]);

export const createProjectSchema = z
  .strictObject({
    name: z.string({ message: 'enter a name' }).trim().min(1, 'enter a name').max(120, 'at most 120 characters'),
    description: z.string().trim().max(5000, 'at most 5000 characters').default(''),
    tags: tagsSchema.default([]),
    visibility: z.enum(VISIBILITY, { message: 'visibility is private, unlisted or public' }).default('private'),
    starter: z.string().max(64).optional(),
    params: z.unknown().optional(),
    message: z.string().trim().max(500).optional(),
  })
  .refine((v) => v.starter !== undefined || v.params !== undefined, { message: 'choose a starter or send params', path: ['starter'] });

export const updateProjectSchema = z
  .strictObject({
    name: z.string().trim().min(1, 'enter a name').max(120, 'at most 120 characters').optional(),
    description: z.string().trim().max(5000, 'at most 5000 characters').optional(),
    tags: tagsSchema.optional(),
    visibility: z.enum(VISIBILITY, { message: 'visibility is private, unlisted or public' }).optional(),
  })
  .refine((v) => Object.keys(v).length > 0, 'send at least one of name, description, tags, visibility');

export const forkSchema = z.strictObject({
  /** The parent's revision to fork at (its id, as in the revision list); the head when left out. */
  revision: z.number({ message: 'send the id of the revision to fork at' }).int('a revision id is a whole number').positive('a revision id is a whole number').optional(),
  name: z.string({ message: 'the name is text' }).trim().min(1, 'enter a name').max(120, 'at most 120 characters').optional(),
});

export const projectListQuery = listQuery(['updated_at', 'created_at', 'name'] as const, 'updated_at').extend({
  scope: z.enum(['mine', 'public']).default('mine'),
  tag: z.string().max(32).optional(),
});

export interface ProjectSummary {
  id: number;
  name: string;
  description: string;
  tags: string[];
  visibility: Visibility;
  ownerName: string;
  role: ProjectRole | null;
  headRevision: number | null;
  headNumber: number | null;
  /** The parent project's id, only when this reader may open the parent (null for an original, or a hidden parent). */
  forkedFrom: number | null;
  /** For a fork: the revision it was made at. Its revisions 1…forkedAtNumber are the parent's, as they were. */
  forkedAtNumber: number | null;
  createdAt: string;
  updatedAt: string;
}

export interface ProjectLink {
  id: number;
  name: string;
  ownerName: string;
  revision: number | null;
  revisionNumber: number | null;
}

/** A parent the reader may not open: neither its id nor the revision forked from is shown. */
export interface HiddenProjectLink {
  id: null;
  name: string;
  ownerName: '';
  revision: null;
  revisionNumber: null;
  visible: false;
}

export interface ProjectDetail extends ProjectSummary {
  head: RevisionInfo | null;
  revisionCount: number;
  parent: (ProjectLink & { visible: true }) | HiddenProjectLink | null;
  forks: ProjectLink[];
  /** Forks this actor cannot open (private ones of other people): counted, not named. */
  hiddenForks: number;
  permissions: ReturnType<typeof permissions>;
}

function tagsOf(v: unknown): string[] {
  if (Array.isArray(v)) return v.map(String);
  if (typeof v === 'string') {
    try {
      const a = JSON.parse(v);
      return Array.isArray(a) ? a.map(String) : [];
    } catch {
      return [];
    }
  }
  return [];
}

function summaryQuery(k: Knex | Knex.Transaction, actor: Actor | null) {
  const q = k('projects as p')
    .join('users as o', 'o.id', 'p.owner_id')
    .leftJoin('revisions as h', 'h.id', 'p.head_revision')
    .leftJoin('projects as pp', 'pp.id', 'p.forked_from_project')
    .select('p.id', 'p.name', 'p.description', 'p.tags', 'p.visibility', 'p.head_revision', 'p.forked_from_project', 'p.forked_at_number', 'p.created_at', 'p.updated_at', 'o.name as owner_name', 'h.number as head_number');
  // Lineage shows a parent's id only to readers who may open the parent (the rule of authz.canRead).
  const admin = actor?.siteRole === 'admin' ? 1 : 0;
  if (actor) {
    q.leftJoin('project_members as me', function () {
      this.on('me.project_id', '=', 'p.id').andOn('me.user_id', '=', k.raw('?', [actor.id]));
    }).select('me.role as my_role');
    q.leftJoin('project_members as pm', function () {
      this.on('pm.project_id', '=', 'pp.id').andOn('pm.user_id', '=', k.raw('?', [actor.id]));
    }).select(k.raw("(pp.visibility <> 'private' OR pm.role IS NOT NULL OR ? = 1) AS parent_visible", [admin]));
  } else {
    q.select(k.raw('NULL as my_role'), k.raw("(pp.visibility <> 'private') AS parent_visible"));
  }
  return q;
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function summary(r: any): ProjectSummary {
  return {
    id: Number(r.id),
    name: r.name,
    description: r.description,
    tags: tagsOf(r.tags),
    visibility: r.visibility,
    ownerName: r.owner_name,
    role: r.my_role ?? null,
    headRevision: r.head_revision ? Number(r.head_revision) : null,
    headNumber: r.head_number ? Number(r.head_number) : null,
    forkedFrom: r.forked_from_project && Number(r.parent_visible) === 1 ? Number(r.forked_from_project) : null,
    forkedAtNumber: r.forked_at_number ? Number(r.forked_at_number) : null,
    createdAt: iso(r.created_at)!,
    updatedAt: iso(r.updated_at)!,
  };
}

export async function listProjects(actor: Actor | null, q: z.infer<typeof projectListQuery>): Promise<Page<ProjectSummary>> {
  const k = db();
  const base = summaryQuery(k, actor);
  if (q.scope === 'mine') {
    if (!actor) throw new ApiError('unauthenticated', 'Sign in to see your projects (or ask for scope=public).');
    base.whereNotNull('me.role');
  } else {
    base.where('p.visibility', 'public');
  }
  if (q.q) {
    const like = contains(q.q);
    base.where((w) => w.where('p.name', 'like', like).orWhere('p.description', 'like', like));
  }
  if (q.tag) base.whereRaw('JSON_CONTAINS(p.tags, ?)', [JSON.stringify(q.tag)]);
  const countRow = await k.count<{ n: number }[]>({ n: '*' }).from(base.clone().as('x'));
  const rows = await base.orderBy(`p.${q.sort}`, q.dir).orderBy('p.id', 'desc').limit(q.pageSize).offset((q.page - 1) * q.pageSize);
  return { items: rows.map(summary), total: Number(countRow[0].n), page: q.page, pageSize: q.pageSize };
}

export async function createProject(actor: Actor, input: z.infer<typeof createProjectSchema>): Promise<ProjectSummary> {
  let params: unknown = input.params;
  if (params === undefined) {
    const s = STARTERS.find((x) => x.id === input.starter);
    if (!s) throw new ApiError('validation_failed', 'The request body is not valid.', { fields: { starter: `no starter called "${input.starter}"; choose one of ${STARTERS.map((x) => x.id).join(', ')}` } });
    params = s.params;
  }
  const valid = validateParams(params);
  const id = await db().transaction(async (trx) => {
    const [pid] = await trx('projects').insert({
      owner_id: actor.id,
      name: input.name,
      description: input.description,
      tags: JSON.stringify(input.tags),
      visibility: input.visibility,
    });
    await trx('project_members').insert({ project_id: pid, user_id: actor.id, role: 'owner' });
    const [rid] = await trx('revisions').insert({ project_id: pid, number: 1, params: JSON.stringify(valid), message: input.message || 'First cut', author_id: actor.id });
    await trx('projects').where({ id: pid }).update({ head_revision: rid });
    await audit({ actorId: actor.id, action: 'project.create', targetType: 'project', targetId: pid, details: { starter: input.starter ?? null } }, trx);
    return Number(pid);
  });
  return getSummary(actor, id);
}

async function getSummary(actor: Actor | null, id: number, k: Knex | Knex.Transaction = db()): Promise<ProjectSummary> {
  const r = await summaryQuery(k, actor).where('p.id', id).first();
  if (!r) throw notFound();
  return summary(r);
}

/**
 * A project with its head, revision count, parent and forks. The access check comes first (a hidden
 * project must answer 404 before anything is read); the five reads after it do not depend on each
 * other, so they go out together.
 */
export async function getProject(actor: Actor | null, id: number): Promise<ProjectDetail> {
  const a = await access(actor, id, 'read');
  const k = db();
  const [s, head, count, parentRow, forkRows] = await Promise.all([
    getSummary(actor, id, k),
    k('projects as p').join('revisions as r', 'r.id', 'p.head_revision').leftJoin('users as u', 'u.id', 'r.author_id').where('p.id', id).first('r.*', 'u.name as author_name'),
    k('revisions').where({ project_id: id }).count<{ n: number }[]>({ n: '*' }),
    parentQuery(k, actor, id),
    summaryQuery(k, actor).where('p.forked_from_project', id).leftJoin('revisions as fr', 'fr.id', 'p.forked_from_revision').select('p.forked_from_revision', 'fr.number as fork_number', 'p.visibility').orderBy('p.created_at', 'asc'),
  ]);
  let parent: ProjectDetail['parent'] = null;
  if (parentRow) {
    const visible = canRead(actor, { id: Number(parentRow.id), visibility: parentRow.visibility, role: parentRow.my_role ?? null });
    parent = visible
      ? {
          id: Number(parentRow.id),
          name: parentRow.name,
          ownerName: parentRow.owner_name,
          revision: parentRow.forked_from_revision ? Number(parentRow.forked_from_revision) : null,
          revisionNumber: parentRow.revision_number ? Number(parentRow.revision_number) : null,
          visible: true,
        }
      : { id: null, name: 'a private project', ownerName: '', revision: null, revisionNumber: null, visible: false };
  }
  const canSee = (r: { visibility: string; my_role: string | null }) => r.visibility !== 'private' || r.my_role || actor?.siteRole === 'admin';
  const hiddenForks = forkRows.filter((r) => !canSee(r)).length;
  const forks: ProjectLink[] = forkRows
    .filter(canSee)
    .map((r) => ({ id: Number(r.id), name: r.name, ownerName: r.owner_name, revision: r.forked_from_revision ? Number(r.forked_from_revision) : null, revisionNumber: r.fork_number ? Number(r.fork_number) : null }));
  return {
    ...s,
    head: head ? revisionInfo(head) : null,
    revisionCount: Number(count[0].n),
    parent,
    forks,
    hiddenForks,
    permissions: permissions(actor, a),
  };
}

/** The project this one was forked from, the revision it was forked at and the actor's role there, in one row (none for an original). */
function parentQuery(k: Knex, actor: Actor | null, id: number) {
  const q = k('projects as c')
    .join('projects as p', 'p.id', 'c.forked_from_project')
    .join('users as o', 'o.id', 'p.owner_id')
    .leftJoin('revisions as fr', 'fr.id', 'c.forked_from_revision')
    .where('c.id', id)
    .select('p.id', 'p.name', 'p.visibility', 'o.name as owner_name', 'c.forked_from_revision', 'fr.number as revision_number');
  if (actor) {
    q.leftJoin('project_members as me', function () {
      this.on('me.project_id', '=', 'p.id').andOn('me.user_id', '=', k.raw('?', [actor.id]));
    }).select('me.role as my_role');
  }
  return q.first();
}

export async function updateProject(actor: Actor | null, id: number, input: z.infer<typeof updateProjectSchema>): Promise<ProjectSummary> {
  await db().transaction(async (trx) => {
    await access(actor, id, 'manage', trx);
    const patch: Record<string, unknown> = { updated_at: trx.fn.now(3) };
    if (input.name !== undefined) patch.name = input.name;
    if (input.description !== undefined) patch.description = input.description;
    if (input.tags !== undefined) patch.tags = JSON.stringify(input.tags);
    if (input.visibility !== undefined) patch.visibility = input.visibility;
    await trx('projects').where({ id }).update(patch);
    await audit({ actorId: actor!.id, action: 'project.update', targetType: 'project', targetId: id, details: { fields: Object.keys(input) } }, trx);
  });
  return getSummary(actor, id);
}

export async function deleteProject(actor: Actor | null, id: number): Promise<void> {
  await db().transaction(async (trx) => {
    await access(actor, id, 'delete', trx);
    const p = await trx('projects').where({ id }).first('name');
    // Break the projects ↔ revisions cycle first, and detach forks (their lineage keeps "deleted").
    await trx('projects').where({ id }).update({ head_revision: null });
    await trx('projects').where({ forked_from_project: id }).update({ forked_from_project: null, forked_from_revision: null });
    await trx('projects').where({ id }).delete();
    await audit({ actorId: actor!.id, action: 'project.delete', targetType: 'project', targetId: id, details: { name: p?.name } }, trx);
  });
}

/**
 * A fork is a new private project of the actor's that carries the parent's history up to the chosen
 * revision (the head by default): copies of revisions 1…n with their numbers, params, messages, authors
 * and times, its head the copy of n. Its own saves go on from n + 1, so "revision 3" means the same model
 * in parent and fork up to the fork point. The fork point is recorded twice: the parent's revision
 * (forked_from_revision, a link while the parent lives) and n itself (forked_at_number, kept for good).
 * Datasets and exports stay with the parent (exports regenerate byte for byte from the params).
 */
export async function forkProject(actor: Actor | null, id: number, input: z.infer<typeof forkSchema>): Promise<ProjectSummary> {
  const newId = await db().transaction(async (trx) => {
    await access(actor, id, 'fork', trx);
    const src = await trx('projects').where({ id }).first();
    const revId = input.revision ?? src.head_revision;
    const rev = revId ? await trx('revisions').where({ id: revId, project_id: id }).first('id', 'number') : null;
    if (!rev) throw new ApiError('not_found', 'No such revision in this project.');
    const number = Number(rev.number);
    const [pid] = await trx('projects').insert({
      owner_id: actor!.id,
      name: input.name ?? `${src.name} (fork)`.slice(0, 120),
      description: src.description,
      tags: typeof src.tags === 'string' ? src.tags : JSON.stringify(src.tags ?? []),
      visibility: 'private',
      forked_from_project: id,
      forked_from_revision: rev.id,
      forked_at_number: number,
    });
    await trx('project_members').insert({ project_id: pid, user_id: actor!.id, role: 'owner' });
    const copied = await copyHistory(trx, id, Number(pid), number);
    const head = await trx('revisions').where({ project_id: pid, number }).first('id');
    await trx('projects').where({ id: pid }).update({ head_revision: head.id });
    await audit({ actorId: actor!.id, action: 'project.fork', targetType: 'project', targetId: pid, details: { from: id, revision: Number(rev.id), number, copied } }, trx);
    return Number(pid);
  });
  return getSummary(actor, newId);
}
