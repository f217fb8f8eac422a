/**
 * Knex configuration. Every value comes from the environment (scripts/start.mjs and scripts/test.mjs
 * set them from .env.local); nothing secret lives here.
 * `connection.charset` is left out on purpose: it would force utf8mb4_general_ci on every table,
 * while the database default is utf8mb4_unicode_ci.
 */
import type { Knex } from 'knex';
import { migrationSource } from './db/migrations';

export function knexConfig(database = process.env.TAUFORGE_DB_NAME ?? 'tauforge'): Knex.Config {
  return {
    client: 'mysql2',
    connection: {
      host: process.env.TAUFORGE_DB_HOST ?? '127.0.0.1',
      port: Number(process.env.TAUFORGE_DB_PORT ?? 3307),
      user: process.env.TAUFORGE_DB_USER ?? 'tauforge',
      password: process.env.TAUFORGE_DB_PASSWORD ?? '',
      database,
      timezone: 'Z',
      dateStrings: false,
      supportBigNumbers: true,
    },
    pool: { min: 0, max: 8 },
    // Migrations come from the list in db/migrations/index.ts; the demo seed runs from scripts/db/migrate.ts.
    migrations: { migrationSource, tableName: 'knex_migrations' },
  };
}

const config: Record<string, Knex.Config> = {
  development: knexConfig(),
  test: knexConfig(),
  production: knexConfig(),
};

export default config;
