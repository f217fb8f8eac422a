/**
 * The ordered list of migrations. Knex reads them from here (not by scanning the folder), so the same
 * TypeScript modules load under tsx, vitest and the Next.js server alike. Add new files at the end.
 */
import type { Knex } from 'knex';
import * as m20261201000000 from './20261201000000_initial_schema';
import * as m20261201010000 from './20261201010000_accounts_and_sharing';
import * as m20261202120000 from './20261202120000_fork_point';
import * as m20261202200000 from './20261202200000_session_version_token_scope';
import * as m20261202210000 from './20261202210000_jobs';

interface Migration {
  up(knex: Knex): Promise<void>;
  down(knex: Knex): Promise<void>;
}

export const migrations: [string, Migration][] = [
  ['20261201000000_initial_schema.ts', m20261201000000],
  ['20261201010000_accounts_and_sharing.ts', m20261201010000],
  ['20261202120000_fork_point.ts', m20261202120000],
  ['20261202200000_session_version_token_scope.ts', m20261202200000],
  ['20261202210000_jobs.ts', m20261202210000],
];

export const migrationSource: Knex.MigrationSource<[string, Migration]> = {
  getMigrations: async () => migrations,
  getMigrationName: ([name]) => name,
  getMigration: async ([, m]) => m,
};
