import type { Knex } from 'knex';

/**
 * Accounts and sharing: one-time links (address verification, password reset), project
 * invitations, personal API tokens. Every secret is stored only as its sha256; the clear token
 * lives in the e-mail or is shown once.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('auth_links', (t) => {
    t.engine('InnoDB');
    t.bigIncrements('id').primary();
    t.bigInteger('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE');
    t.enu('purpose', ['verify', 'reset']).notNullable();
    t.specificType('token_hash', 'CHAR(64)').notNullable().unique();
    t.datetime('expires_at', { precision: 3 }).notNullable();
    t.datetime('used_at', { precision: 3 }).nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'));
    t.index(['user_id', 'purpose']);
  });

  await knex.schema.createTable('invitations', (t) => {
    t.engine('InnoDB');
    t.bigIncrements('id').primary();
    t.bigInteger('project_id').unsigned().notNullable().references('projects.id').onDelete('CASCADE');
    t.string('email', 254).notNullable();
    t.enu('role', ['owner', 'editor', 'viewer']).notNullable();
    t.specificType('token_hash', 'CHAR(64)').notNullable().unique();
    t.bigInteger('invited_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.datetime('expires_at', { precision: 3 }).notNullable();
    t.datetime('accepted_at', { precision: 3 }).nullable();
    t.bigInteger('accepted_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.datetime('revoked_at', { precision: 3 }).nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'));
    t.index(['project_id', 'created_at']);
  });

  await knex.schema.createTable('api_tokens', (t) => {
    t.engine('InnoDB');
    t.bigIncrements('id').primary();
    t.bigInteger('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE');
    t.string('name', 80).notNullable();
    t.string('prefix', 16).notNullable();
    t.specificType('token_hash', 'CHAR(64)').notNullable().unique();
    t.datetime('last_used_at', { precision: 3 }).nullable();
    t.datetime('revoked_at', { precision: 3 }).nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'));
    t.index(['user_id', 'created_at']);
  });

  // Exports are reused per (revision, format): one row per engine version, enforced by the database.
  await knex.schema.alterTable('exports', (t) => {
    t.unique(['revision_id', 'format', 'engine_version']);
  });
  // Datasets: which reader parsed them and how the upload was labelled.
  await knex.schema.alterTable('datasets', (t) => {
    t.string('format', 16).notNullable().defaultTo('');
    t.string('media_type', 100).notNullable().defaultTo('application/octet-stream');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('datasets', (t) => {
    t.dropColumn('format');
    t.dropColumn('media_type');
  });
  await knex.schema.alterTable('exports', (t) => {
    t.dropUnique(['revision_id', 'format', 'engine_version']);
  });
  await knex.schema.dropTableIfExists('api_tokens');
  await knex.schema.dropTableIfExists('invitations');
  await knex.schema.dropTableIfExists('auth_links');
}
