import { db } from './db';

export interface Health {
  ok: boolean;
  database: { reachable: boolean; status: 'reachable' | 'unreachable'; latestMigration: string | null; error?: string };
  time: string;
}

/**
 * Database reachability and the newest applied migration. The database's own error text (host names,
 * ports, user names) is only for site admins (`detail`); everyone else reads "unreachable".
 */
export async function health(detail = false): Promise<Health> {
  const time = new Date().toISOString();
  try {
    await db().raw('SELECT 1');
    const row = await db()('knex_migrations').orderBy('id', 'desc').first('name');
    return { ok: true, database: { reachable: true, status: 'reachable', latestMigration: row?.name ?? null }, time };
  } catch (err) {
    const database: Health['database'] = { reachable: false, status: 'unreachable', latestMigration: null };
    if (detail) database.error = err instanceof Error ? err.message.split('\n')[0].slice(0, 200) : 'unknown error';
    return { ok: false, database, time };
  }
}
