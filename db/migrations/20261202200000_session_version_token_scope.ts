import type { Knex } from 'knex';

/**
 * Security hardening (issue 13):
 * - users.session_version: the number every session JWT carries from sign-in; a password reset, "sign
 *   out everywhere" and disabling the account increase it, which ends every older session.
 * - api_tokens.expires_at (optional) and api_tokens.scope ('read' answers only GET; 'write' is the old
 *   behaviour, so existing tokens keep working as they did).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('users', (t) => {
    t.integer('session_version').unsigned().notNullable().defaultTo(0);
  });
  await knex.schema.alterTable('api_tokens', (t) => {
    t.datetime('expires_at', { precision: 3 }).nullable();
    t.enum('scope', ['read', 'write']).notNullable().defaultTo('write');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('api_tokens', (t) => {
    t.dropColumn('scope');
    t.dropColumn('expires_at');
  });
  await knex.schema.alterTable('users', (t) => {
    t.dropColumn('session_version');
  });
}
