import type { Knex } from 'knex';
import bcrypt from 'bcryptjs';

/**
 * Demo data: a fictional alloy-modelling group ("Harrowgate Alloy Modelling Group") with a group
 * lead who is also the site admin and a doctoral student, and three small projects.
 * The sign-in for both accounts is printed in the README.
 */
export const DEMO_PASSWORD = 'quasi-demo-2026';
export const DEMO_USERS = [
  { email: 'lead@harrowgate.test', name: 'Runa Halvorsen', site_role: 'admin' as const },
  { email: 'student@harrowgate.test', name: 'Tomasz Weir', site_role: 'member' as const },
];

/**
 * The demo projects. Each description states what its params generate (counts, cell, lengths); the
 * numbers come from generate() and tests/unit/models/demo-seed.test.ts holds them to it.
 */
export const DEMO_PROJECTS = [
  {
    name: 'Fibonacci warm-up chain',
    description: 'A 1D quasiperiodic chain and its 89/55 approximant (order 10): one periodic cell of 144 segments, 89 long (1 Å) and 55 short (1/τ ≈ 0.618 Å), 123.0 Å in all. Used to teach new group members the cut-and-project method.',
    visibility: 'public',
    tags: ['teaching', '1D'],
    params: { family: 'fibonacci', order: 10, approximant: true, long: 1.0, ratio: 1.6180339887498949 },
    members: [['student', 'editor']],
  },
  {
    name: 'Penrose patch for surface imaging',
    description: 'A round rhombus tiling patch of radius 12 Å with 1 Å edges: 616 vertices, 345 thick and 225 thin rhombi, to compare with the group’s own surface images.',
    visibility: 'unlisted',
    tags: ['2D', 'surface'],
    params: { family: 'penrose', radius: 12, edge: 1 },
    members: [['student', 'viewer']],
  },
  {
    name: 'Icosahedral 2/1 vertex model',
    description: 'Undecorated vertices of the 2/1 cubic approximant (a_R = 4.6 Å): 136 vertices in a cube of edge 20.49 Å, the starting point for a DFT relaxation.',
    visibility: 'private',
    tags: ['3D', 'approximant', 'DFT'],
    params: { family: 'icosahedral', mode: 'approximant', order: '2/1', aR: 4.6, lattice: 'P' },
    members: [],
  },
] as const;

export async function seed(knex: Knex): Promise<void> {
  const hash = await bcrypt.hash(DEMO_PASSWORD, 10);
  const now = new Date();
  const ids: number[] = [];
  for (const u of DEMO_USERS) {
    const [id] = await knex('users').insert({ ...u, password_hash: hash, verified_at: now });
    ids.push(id);
  }
  const [lead, student] = ids;
  const userOf = { lead, student };

  for (const p of DEMO_PROJECTS) {
    const [projectId] = await knex('projects').insert({
      owner_id: lead,
      name: p.name,
      description: p.description,
      visibility: p.visibility,
      tags: JSON.stringify(p.tags),
    });
    await knex('project_members').insert({ project_id: projectId, user_id: lead, role: 'owner' });
    for (const [who, role] of p.members) {
      await knex('project_members').insert({ project_id: projectId, user_id: userOf[who], role });
    }
    const [revId] = await knex('revisions').insert({
      project_id: projectId,
      number: 1,
      params: JSON.stringify(p.params),
      message: 'First cut',
      author_id: lead,
    });
    await knex('projects').where({ id: projectId }).update({ head_revision: revId });
  }
  await knex('audit_log').insert({ actor_id: null, action: 'seed.demo', details: JSON.stringify({ users: DEMO_USERS.length, projects: DEMO_PROJECTS.length }) });
}
