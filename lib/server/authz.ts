/**
 * The one place that decides what an actor may do with a project: (actor, project, action) →
 * allow, or the error to answer with. Every route handler that touches a project goes through
 * authorize(); the table in tests/integration/api-authz.test.ts checks the outcome for each role.
 *
 * - A project the actor cannot read answers 404, so private projects do not reveal they exist.
 * - A readable project, action not allowed: 401 when not signed in, 403 when signed in (RFC 9110).
 * - Site admins can read and delete any project (moderation), but edit only where they are members.
 *
 * Services start with `access(actor, projectId, action)`: it reads the project's visibility and the
 * actor's role in one query and then applies authorize().
 */
import type { Knex } from 'knex';
import { db } from './db';
import { ApiError, notFound } from './errors';

export type SiteRole = 'admin' | 'member';

/**
 * Who is asking, however they proved it (lib/server/actor.ts reads the session cookie or the API
 * token). Kept here, beside the rules, so that the files that find an actor (actor.ts, tokens.ts)
 * and the services that check one all depend on this file and not on each other.
 */
export interface Actor {
  id: number;
  email: string;
  name: string;
  siteRole: SiteRole;
  via: 'session' | 'token';
}

export type ProjectRole = 'owner' | 'editor' | 'viewer';
export type Visibility = 'private' | 'unlisted' | 'public';

export type ProjectAction =
  | 'read' // project, revisions, diffs, exports, datasets, lineage
  | 'fork'
  | 'export' // create an export file of a revision
  | 'edit' // save or restore revisions, upload or delete datasets
  | 'members.read'
  | 'manage' // settings, visibility, members, invitations
  | 'delete';

export interface ProjectAccess {
  id: number;
  visibility: Visibility;
  /** The actor's role in the project, if a member. */
  role: ProjectRole | null;
}

const RANK: Record<ProjectRole, number> = { viewer: 1, editor: 2, owner: 3 };

function atLeast(role: ProjectRole | null, want: ProjectRole): boolean {
  return role !== null && RANK[role] >= RANK[want];
}

export function canRead(actor: Actor | null, p: ProjectAccess): boolean {
  return p.visibility !== 'private' || p.role !== null || actor?.siteRole === 'admin';
}

export function allowed(actor: Actor | null, p: ProjectAccess, action: ProjectAction): boolean {
  if (!canRead(actor, p)) return false;
  const admin = actor?.siteRole === 'admin';
  switch (action) {
    case 'read':
      return true;
    case 'fork':
    case 'export':
      return actor !== null;
    case 'edit':
      return atLeast(p.role, 'editor');
    case 'members.read':
      return p.role !== null || admin;
    case 'manage':
      return atLeast(p.role, 'owner');
    case 'delete':
      return atLeast(p.role, 'owner') || admin;
  }
}

export function authorize(actor: Actor | null, p: ProjectAccess, action: ProjectAction): void {
  if (allowed(actor, p, action)) return;
  if (!canRead(actor, p)) throw notFound();
  if (!actor) throw new ApiError('unauthenticated', 'Sign in (or send an API token) to do this.');
  throw new ApiError('forbidden', forbiddenMessage(action));
}

function forbiddenMessage(action: ProjectAction): string {
  switch (action) {
    case 'edit':
      return 'You need to be an editor or owner of this project to change it.';
    case 'members.read':
      return 'Only members of this project can see its member list.';
    case 'manage':
      return 'Only owners of this project can change its settings and members.';
    case 'delete':
      return 'Only owners of this project (or a site admin) can delete it.';
    default:
      return 'You are not allowed to do this.';
  }
}

/** What the UI may offer this actor, computed by the same rules. */
export function permissions(actor: Actor | null, p: ProjectAccess): Record<ProjectAction, boolean> {
  const acts: ProjectAction[] = ['read', 'fork', 'export', 'edit', 'members.read', 'manage', 'delete'];
  return Object.fromEntries(acts.map((a) => [a, allowed(actor, p, a)])) as Record<ProjectAction, boolean>;
}

/** A project's visibility and the actor's role in it, for authorize(). 404 when there is no such project. */
export async function loadAccess(actor: Actor | null, projectId: number, k: Knex | Knex.Transaction = db()): Promise<ProjectAccess> {
  const q = k('projects as p').where('p.id', projectId).select('p.id', 'p.visibility');
  // One round trip: the membership row comes with the project row (NULL when not a member or signed out).
  if (actor) {
    q.leftJoin('project_members as m', function () {
      this.on('m.project_id', '=', 'p.id').andOn('m.user_id', '=', k.raw('?', [actor.id]));
    }).select('m.role');
  }
  const row = (await q.first()) as { id: number; visibility: Visibility; role?: ProjectRole | null } | undefined;
  if (!row) throw notFound();
  return { id: Number(row.id), visibility: row.visibility, role: row.role ?? null };
}

/** loadAccess + authorize: the first line of every project service. */
export async function access(actor: Actor | null, projectId: number, action: ProjectAction, k?: Knex | Knex.Transaction): Promise<ProjectAccess> {
  const a = await loadAccess(actor, projectId, k);
  authorize(actor, a, action);
  return a;
}
