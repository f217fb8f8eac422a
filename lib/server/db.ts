/**
 * The one database handle of the server. lib/server is the only place that talks to MariaDB.
 * Kept on globalThis so Next.js dev reloads do not open a new pool each time.
 */
import knexFactory, { type Knex } from 'knex';
import { knexConfig } from '../../knexfile';

const g = globalThis as unknown as { __tauforgeDb?: Knex };

export function db(): Knex {
  if (!g.__tauforgeDb) g.__tauforgeDb = knexFactory(knexConfig());
  return g.__tauforgeDb;
}

export async function closeDb(): Promise<void> {
  if (g.__tauforgeDb) {
    await g.__tauforgeDb.destroy();
    g.__tauforgeDb = undefined;
  }
}
