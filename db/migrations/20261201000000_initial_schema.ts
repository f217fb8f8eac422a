import type { Knex } from 'knex';

/**
 * First schema: users, projects, members, revisions, exports, datasets, audit log, and the local
 * mailbox that the development mail fake writes into. InnoDB + utf8mb4 throughout.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (t) => {
    t.engine('InnoDB');
    t.bigIncrements('id').primary();
    t.string('email', 254).notNullable().unique();
    t.string('name', 120).notNullable().defaultTo('');
    t.string('password_hash', 255).nullable();
    t.enu('site_role', ['admin', 'member']).notNullable().defaultTo('member');
    t.datetime('verified_at', { precision: 3 }).nullable();
    t.datetime('disabled_at', { precision: 3 }).nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'));
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'));
  });

  await knex.schema.createTable('projects', (t) => {
    t.engine('InnoDB');
    t.bigIncrements('id').primary();
    t.bigInteger('owner_id').unsigned().notNullable().references('users.id').onDelete('RESTRICT');
    t.string('name', 120).notNullable();
    t.text('description').notNullable();
    t.json('tags').nullable();
    t.enu('visibility', ['private', 'unlisted', 'public']).notNullable().defaultTo('private');
    t.bigInteger('forked_from_project').unsigned().nullable().references('projects.id').onDelete('SET NULL');
    t.bigInteger('forked_from_revision').unsigned().nullable();
    t.bigInteger('head_revision').unsigned().nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'));
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'));
    t.index(['owner_id', 'updated_at']);
    t.index(['visibility', 'updated_at']);
    t.index(['forked_from_project']);
  });

  await knex.schema.createTable('project_members', (t) => {
    t.engine('InnoDB');
    t.bigInteger('project_id').unsigned().notNullable().references('projects.id').onDelete('CASCADE');
    t.bigInteger('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE');
    t.enu('role', ['owner', 'editor', 'viewer']).notNullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'));
    t.primary(['project_id', 'user_id']);
    t.index(['user_id', 'role']);
  });

  await knex.schema.createTable('revisions', (t) => {
    t.engine('InnoDB');
    t.bigIncrements('id').primary();
    t.bigInteger('project_id').unsigned().notNullable().references('projects.id').onDelete('CASCADE');
    t.integer('number').unsigned().notNullable();
    t.json('params').notNullable();
    t.string('message', 500).notNullable().defaultTo('');
    t.bigInteger('author_id').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'));
    t.unique(['project_id', 'number']);
  });

  // projects ↔ revisions reference each other; add those keys once both tables exist.
  await knex.schema.alterTable('projects', (t) => {
    t.foreign('head_revision').references('revisions.id').onDelete('SET NULL');
    t.foreign('forked_from_revision').references('revisions.id').onDelete('SET NULL');
  });

  await knex.schema.createTable('exports', (t) => {
    t.engine('InnoDB');
    t.bigIncrements('id').primary();
    t.bigInteger('revision_id').unsigned().notNullable().references('revisions.id').onDelete('CASCADE');
    t.string('format', 16).notNullable();
    t.specificType('bytes', 'LONGBLOB').notNullable();
    t.specificType('sha256', 'CHAR(64)').notNullable();
    t.specificType('params_hash', 'CHAR(64)').notNullable();
    t.string('engine_version', 64).notNullable();
    t.bigInteger('size').unsigned().notNullable();
    t.bigInteger('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'));
    t.index(['revision_id', 'format']);
  });

  await knex.schema.createTable('datasets', (t) => {
    t.engine('InnoDB');
    t.bigIncrements('id').primary();
    t.bigInteger('project_id').unsigned().notNullable().references('projects.id').onDelete('CASCADE');
    t.enu('kind', ['pattern', 'structure']).notNullable();
    t.string('filename', 255).notNullable();
    t.specificType('bytes', 'LONGBLOB').notNullable();
    t.specificType('sha256', 'CHAR(64)').notNullable();
    t.bigInteger('size').unsigned().notNullable();
    t.json('summary').notNullable();
    t.bigInteger('uploaded_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'));
    t.index(['project_id', 'created_at']);
  });

  await knex.schema.createTable('audit_log', (t) => {
    t.engine('InnoDB');
    t.bigIncrements('id').primary();
    t.bigInteger('actor_id').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.string('action', 64).notNullable();
    t.string('target_type', 32).nullable();
    t.bigInteger('target_id').unsigned().nullable();
    t.json('details').nullable();
    t.string('ip', 64).nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'));
    t.index(['created_at']);
    t.index(['actor_id', 'created_at']);
    t.index(['target_type', 'target_id']);
  });

  // Written by the local mail fake (development and tests only); admins read it on the mailbox page.
  await knex.schema.createTable('mail_messages', (t) => {
    t.engine('InnoDB');
    t.bigIncrements('id').primary();
    t.string('mail_from', 254).notNullable();
    t.string('mail_to', 1000).notNullable();
    t.string('subject', 500).notNullable().defaultTo('');
    t.specificType('body_text', 'MEDIUMTEXT').notNullable();
    t.specificType('raw', 'MEDIUMBLOB').notNullable();
    t.datetime('received_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'));
    t.index(['received_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('mail_messages');
  await knex.schema.dropTableIfExists('audit_log');
  await knex.schema.dropTableIfExists('datasets');
  await knex.schema.dropTableIfExists('exports');
  await knex.schema.alterTable('projects', (t) => {
    t.dropForeign(['head_revision']);
    t.dropForeign(['forked_from_revision']);
  });
  await knex.schema.dropTableIfExists('revisions');
  await knex.schema.dropTableIfExists('project_members');
  await knex.schema.dropTableIfExists('projects');
  await knex.schema.dropTableIfExists('users');
}
