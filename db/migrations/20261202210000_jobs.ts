/**
 * Jobs: the durable record of queued heavy work (who, what, state, progress, timings, result or error);
 * Redis only holds the queue. `active_key` is the coalescing key while a job is queued or running and
 * NULL afterwards, so a unique index turns "identical request while one is pending" into one job.
 * Sweep points are keyed by (sweep, point index): a retried point overwrites its own row, never adds one.
 * Exports are stored in chunks (each well below max_allowed_packet) instead of one LONGBLOB value.
 */
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('jobs', (t) => {
    t.engine('InnoDB');
    t.bigIncrements('id').primary();
    t.bigInteger('project_id').unsigned().notNullable().references('projects.id').onDelete('CASCADE');
    t.bigInteger('user_id').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.string('kind', 24).notNullable();
    t.enu('state', ['queued', 'running', 'done', 'failed', 'cancelled']).notNullable().defaultTo('queued');
    t.double('progress').notNullable().defaultTo(0);
    t.string('stage', 200).nullable();
    t.json('input').notNullable();
    t.json('result').nullable();
    t.text('error').nullable();
    t.specificType('active_key', 'CHAR(64)').nullable().unique();
    t.integer('attempts').notNullable().defaultTo(0);
    t.integer('total').unsigned().nullable();
    t.integer('done').unsigned().notNullable().defaultTo(0);
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'));
    t.datetime('started_at', { precision: 3 }).nullable();
    t.datetime('finished_at', { precision: 3 }).nullable();
    t.index(['project_id', 'created_at']);
    t.index(['user_id', 'state']);
  });
  await knex.schema.createTable('sweep_points', (t) => {
    t.engine('InnoDB');
    t.bigInteger('job_id').unsigned().notNullable().references('jobs.id').onDelete('CASCADE');
    t.integer('idx').unsigned().notNullable();
    t.json('params').notNullable();
    t.double('rwp').nullable();
    t.double('rp').nullable();
    t.integer('atoms').unsigned().nullable();
    t.text('error').nullable();
    /** How many times a worker ran this point to the end (a retry after a killed worker makes it 2). */
    t.integer('runs').unsigned().notNullable().defaultTo(0);
    t.datetime('finished_at', { precision: 3 }).nullable();
    t.primary(['job_id', 'idx']);
    t.index(['job_id', 'rwp']);
  });
  await knex.schema.createTable('export_chunks', (t) => {
    t.engine('InnoDB');
    t.bigInteger('export_id').unsigned().notNullable().references('exports.id').onDelete('CASCADE');
    t.integer('seq').unsigned().notNullable();
    t.specificType('bytes', 'MEDIUMBLOB').notNullable();
    t.primary(['export_id', 'seq']);
  });
  await knex.schema.alterTable('exports', (t) => {
    t.integer('chunks').unsigned().notNullable().defaultTo(0);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('exports', (t) => {
    t.dropColumn('chunks');
  });
  await knex.schema.dropTableIfExists('export_chunks');
  await knex.schema.dropTableIfExists('sweep_points');
  await knex.schema.dropTableIfExists('jobs');
}
