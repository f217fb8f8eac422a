import type { Knex } from 'knex';

/**
 * Forks carry their parent's history: a fork made at revision n of its parent holds copies of the
 * parent's revisions 1…n (same numbers, params, messages, authors and times) and saves its own from n + 1.
 * `forked_at_number` records n in the fork itself, so the fork point stays known when the parent (and with
 * it `forked_from_project` / `forked_from_revision`) is deleted. NULL for originals and for forks made
 * before forks carried history (those hold one copied revision, numbered 1).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('projects', (t) => {
    t.integer('forked_at_number').unsigned().nullable().after('forked_from_revision');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('projects', (t) => {
    t.dropColumn('forked_at_number');
  });
}
