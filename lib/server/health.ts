import { db } from './db';

export interface Health {
  ok: boolean;
  database: { reachable: boolean; latestMigration: string | null; error?: string };
  time: string;
}

/** Database reachability and the newest applied migration. */
export async function health(): Promise<Health> {
  const time = new Date().toISOString();
  try {
    await db().raw('SELECT 1');
    const row = await db()('knex_migrations').orderBy('id', 'desc').first('name');
    return { ok: true, database: { reachable: true, latestMigration: row?.name ?? null }, time };
  } catch (err) {
    const message = err instanceof Error ? err.message.split('\n')[0].slice(0, 200) : 'unknown error';
    return { ok: false, database: { reachable: false, latestMigration: null, error: message }, time };
  }
}
