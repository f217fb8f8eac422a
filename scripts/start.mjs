// `npm start`: install what is missing, start MariaDB, Redis and the mail fake on loopback, migrate, seed
// the demo into an empty database, build, start the queue workers (TAUFORGE_WORKERS, default cores − 1)
// and serve at http://127.0.0.1:3000. Ctrl-C stops everything. REDIS_URL: use that Redis, start none.
import { ensureMariadb, ensureNodeModules } from './lib/install.mjs';
import { ensureRedis } from './lib/redis.mjs';
import { loadEnv, root, settings } from './lib/env.mjs';
import { UserError, step } from './lib/log.mjs';
import { portFree, stopAllChildren } from './lib/proc.mjs';
import { bringUpDatabase, bringUpRedis, build, dbEnv, migrate, serve, startMailFake, startWorkers, workerCount } from './lib/services.mjs';

const cleanups = [];
let stopping = false;

async function shutdown(code) {
  if (stopping) return;
  stopping = true;
  for (const c of cleanups.reverse()) {
    try {
      await c();
    } catch {
      /* keep stopping the rest */
    }
  }
  await stopAllChildren();
  process.exit(code);
}

process.on('SIGINT', () => { step('Ctrl-C: shutting down'); void shutdown(0); });
process.on('SIGTERM', () => void shutdown(0));

async function main() {
  step('Tauforge: npm start');
  process.chdir(root);
  ensureNodeModules();
  loadEnv();
  ensureMariadb();
  ensureRedis();
  const s = settings();
  if (!(await portFree(s.appPort))) {
    throw new UserError(`port ${s.appPort} on 127.0.0.1 is in use; stop what listens there or set PORT to a free port.`);
  }
  const db = { port: s.dbPort, name: s.dbName, user: s.dbUser, password: s.dbPassword };
  const handle = await bringUpDatabase({ dataDir: s.dataDir, ...db, fresh: false });
  cleanups.push(() => handle.stop());
  const redisHandle = await bringUpRedis({ dataDir: s.redisDir, port: s.redisPort, persist: true, fresh: false });
  cleanups.push(() => redisHandle.stop());
  const url = `http://127.0.0.1:${s.appPort}`;
  const env = {
    ...process.env,
    ...dbEnv(db),
    NEXTAUTH_URL: process.env.NEXTAUTH_URL ?? url,
    SMTP_HOST: process.env.SMTP_HOST ?? '127.0.0.1',
    SMTP_PORT: String(s.smtpPort),
    TAUFORGE_MAIL_FAKE: process.env.SMTP_HOST ? '0' : '1',
    REDIS_URL: redisHandle.url,
  };
  migrate(env, { seed: true });
  if (!process.env.SMTP_HOST) {
    const mail = await startMailFake(env, s.smtpPort);
    cleanups.push(() => mail.stop());
  }
  build(env);
  const workers = await startWorkers(env, workerCount());
  cleanups.push(() => workers.stop());
  const server = await serve(env, s.appPort);
  cleanups.push(() => server.stop());
  step(`Tauforge is ready at ${url}  (Ctrl-C stops the app, the workers, the mail fake, Redis and MariaDB)`);
  server.child.on('exit', (code) => {
    if (!stopping) {
      step(`the app server exited (${code}); shutting down`);
      void shutdown(code ?? 1);
    }
  });
}

main().catch((err) => {
  const msg = err instanceof UserError ? err.message : `${err?.message ?? err}`.split('\n')[0];
  console.error(`tauforge: ${msg}`);
  void shutdown(1);
});
