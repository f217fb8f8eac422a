/**
 * Entry of a queue worker process, built by scripts/worker/build.mjs to dist/worker/main.mjs (plain
 * JavaScript: production never loads TypeScript at run time). Needs REDIS_URL (or the local Redis port)
 * and the TAUFORGE_DB_* settings. SIGTERM / SIGINT: finish the BullMQ handshake, close and exit.
 */
import { setPriority } from 'node:os';
import { startWorker } from '../../lib/server/queue/worker';
import { closeQueue } from '../../lib/server/queue/connection';
import { closeDb } from '../../lib/server/db';

async function main() {
  // Below the web server in the CPU scheduler (nice 10 by default), so heavy jobs on the same machine do
  // not slow requests down. Set before the task thread starts: Linux threads inherit their creator's nice.
  const nice = Number(process.env.TAUFORGE_WORKER_NICE ?? 10);
  try {
    if (nice) setPriority(nice);
  } catch {
    /* not permitted here: run at normal priority */
  }
  const handle = await startWorker(new URL('./thread.mjs', import.meta.url));
  let stopping = false;
  const stop = async () => {
    if (stopping) return;
    stopping = true;
    const force = setTimeout(() => process.exit(0), 5000);
    force.unref();
    await handle.close().catch(() => {});
    await closeQueue().catch(() => {});
    await closeDb().catch(() => {});
    process.exit(0);
  };
  process.on('SIGTERM', () => void stop());
  process.on('SIGINT', () => void stop());
}

main().catch((e: unknown) => {
  console.error(`tauforge worker: ${e instanceof Error ? e.message : e}`);
  process.exit(1);
});
