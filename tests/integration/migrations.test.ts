import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import knexFactory, { type Knex } from 'knex';
import { knexConfig } from '../../knexfile';

// Runs the real migrations against the real MariaDB that `npm test` started, in a scratch database.
const scratch = `${process.env.TAUFORGE_DB_NAME ?? 'tauforge_test'}_migrations`;
let admin: Knex;
let knex: Knex;

async function tables(k: Knex): Promise<string[]> {
  const rows = await k('information_schema.tables').where({ table_schema: scratch }).select('table_name as name');
  return rows.map((r: { name: string }) => r.name).sort();
}

beforeAll(async () => {
  admin = knexFactory(knexConfig(process.env.TAUFORGE_DB_NAME ?? 'tauforge_test'));
  await admin.raw(`DROP DATABASE IF EXISTS \`${scratch}\``);
  await admin.raw(`CREATE DATABASE \`${scratch}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  knex = knexFactory(knexConfig(scratch));
});

afterAll(async () => {
  await knex?.destroy();
  await admin?.raw(`DROP DATABASE IF EXISTS \`${scratch}\``);
  await admin?.destroy();
});

describe('migrations', () => {
  it('go up, all the way down, and up again', async () => {
    await knex.migrate.latest();
    const up1 = await tables(knex);
    for (const t of ['users', 'projects', 'project_members', 'revisions', 'exports', 'datasets', 'audit_log']) {
      expect(up1).toContain(t);
    }
    await knex.migrate.rollback(undefined, true);
    const down = (await tables(knex)).filter((t) => !t.startsWith('knex_migrations'));
    expect(down).toEqual([]);
    await knex.migrate.latest();
    expect(await tables(knex)).toEqual(up1);
  });

  it('creates InnoDB tables in utf8mb4 with the unique keys the services rely on', async () => {
    await knex.migrate.latest();
    const rows = await knex('information_schema.tables')
      .where({ table_schema: scratch })
      .whereNot('table_name', 'like', 'knex_%')
      .select('table_name as name', 'engine', 'table_collation as collation');
    for (const r of rows) {
      expect(r.engine, r.name).toBe('InnoDB');
      expect(r.collation, r.name).toMatch(/^utf8mb4_/);
    }
    const [u] = await knex('users').insert({ email: 'a@b.test', name: 'A' });
    await expect(knex('users').insert({ email: 'a@b.test', name: 'B' })).rejects.toThrow(/Duplicate/);
    const [p] = await knex('projects').insert({ owner_id: u, name: 'p', description: '' });
    await knex('revisions').insert({ project_id: p, number: 1, params: JSON.stringify({ family: 'fibonacci' }) });
    await expect(
      knex('revisions').insert({ project_id: p, number: 1, params: JSON.stringify({}) }),
    ).rejects.toThrow(/Duplicate/);
    // mysql2 hands JSON columns back already parsed.
    const rev = await knex('revisions').where({ project_id: p }).first();
    expect(rev.params).toEqual({ family: 'fibonacci' });
  });
});
