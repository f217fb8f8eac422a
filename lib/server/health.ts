import { db } from './db';
import { queueHealth, type QueueHealth } from './queue/health';

export interface Health {
  ok: boolean;
  database: { reachable: boolean; status: 'reachable' | 'unreachable'; latestMigration: string | null; error?: string };
  /** The job queue (Redis); admins also read its counts and the number of live workers. */
  queue: QueueHealth;
  time: string;
}

async function databaseHealth(detail: boolean): Promise<Health['database']> {
  try {
    await db().raw('SELECT 1');
    const row = await db()('knex_migrations').orderBy('id', 'desc').first('name');
    return { reachable: true, status: 'reachable', latestMigration: row?.name ?? null };
  } catch (err) {
    const database: Health['database'] = { reachable: false, status: 'unreachable', latestMigration: null };
    if (detail) database.error = err instanceof Error ? err.message.split('\n')[0].slice(0, 200) : 'unknown error';
    return database;
  }
}

/**
 * Database reachability and the newest applied migration, and whether the job queue (Redis) answers.
 * `ok` needs both: without the queue no upload, export or sweep can run. The error text of either (host
 * names, ports, user names) and the queue's counts are only for site admins (`detail`); everyone else
 * reads "reachable" or "unreachable".
 */
export async function health(detail = false): Promise<Health> {
  const time = new Date().toISOString();
  const [database, queue] = await Promise.all([databaseHealth(detail), queueHealth(detail)]);
  return { ok: database.reachable && queue.reachable, database, queue, time };
}
