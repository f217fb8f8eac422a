// The pieces both `npm start` and `npm test` bring up: database, schema, mail fake, Next.js server.
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import { createDatabase, initialise, start as startMariadb } from '../../db/server/mariadb.mjs';
import { root } from './env.mjs';
import { fail, step } from './log.mjs';
import { portFree, run, startChild, stopChild, waitForPort } from './proc.mjs';

const tsx = join(root, 'node_modules', '.bin', 'tsx');
const nextBin = join(root, 'node_modules', 'next', 'dist', 'bin', 'next');

export async function bringUpDatabase({ dataDir, port, name, user, password, fresh }) {
  initialise(dataDir);
  const handle = await startMariadb(dataDir, port);
  createDatabase(handle, { name, user, password, fresh });
  return handle;
}

export function dbEnv({ port, name, user, password }) {
  return {
    TAUFORGE_DB_HOST: '127.0.0.1',
    TAUFORGE_DB_PORT: String(port),
    TAUFORGE_DB_NAME: name,
    TAUFORGE_DB_USER: user,
    TAUFORGE_DB_PASSWORD: password,
  };
}

export function migrate(env, { seed }) {
  step(seed ? 'running migrations and the demo seed' : 'running migrations');
  run(tsx, [join(root, 'scripts', 'db', 'migrate.ts'), ...(seed ? ['--seed'] : [])], { cwd: root, env });
}

export async function startMailFake(env, port) {
  if (!(await portFree(port))) fail(`port ${port} on 127.0.0.1 (local mail fake) is in use; set SMTP_PORT to a free port.`);
  step(`starting the local mail fake (SMTP) on 127.0.0.1:${port}`);
  const child = startChild(tsx, [join(root, 'scripts', 'mail-fake.ts')], { cwd: root, env: { ...env, SMTP_PORT: String(port) } });
  await waitForPort(port, '127.0.0.1', 30_000, child);
  return { child, stop: () => stopChild(child) };
}

export function build(env) {
  step('building the app (next build)');
  run(process.execPath, [nextBin, 'build'], { cwd: root, env: { ...env, NEXT_TELEMETRY_DISABLED: '1' } });
}

export async function serve(env, port) {
  if (!(await portFree(port))) fail(`port ${port} on 127.0.0.1 is in use; stop what listens there or set PORT to a free port.`);
  step(`starting the app server on 127.0.0.1:${port}`);
  // Run next's own entry point so the PID is the server's (an npx wrapper would leave it listening).
  // peer-address.cjs hands the socket's address to the app (client addresses, rate limits, audit log).
  const child = startChild(process.execPath, ['--require', join(root, 'scripts', 'peer-address.cjs'), nextBin, 'start', '-H', '127.0.0.1', '-p', String(port)], {
    cwd: root,
    env: { ...env, NEXT_TELEMETRY_DISABLED: '1' },
  });
  await waitForPort(port, '127.0.0.1', 120_000, child);
  return { child, stop: () => stopChild(child) };
}

/** The queue's Redis: ours on 127.0.0.1 (stopped on exit), or the external one REDIS_URL names. */
export async function bringUpRedis({ dataDir, port, persist, fresh }) {
  if (process.env.REDIS_URL) {
    step(`using the external Redis in REDIS_URL (${new URL(process.env.REDIS_URL).host}); none is started`);
    return { url: process.env.REDIS_URL, stop: async () => {} };
  }
  const { startRedis } = await import('./redis.mjs');
  return startRedis({ dataDir, port, persist, fresh });
}

/** How many worker processes: TAUFORGE_WORKERS, else one per core but one (for the web server), at least 1. */
export function workerCount() {
  const set = Number(process.env.TAUFORGE_WORKERS);
  if (Number.isInteger(set) && set >= 0) return set;
  return Math.max(1, availableParallelism() - 1);
}

/** Build the worker into plain JavaScript and start `count` worker processes. */
export async function startWorkers(env, count) {
  const { buildWorker } = await import('../worker/build.mjs');
  step('building the queue worker (esbuild → dist/worker)');
  const { main } = await buildWorker();
  const children = [];
  for (let i = 0; i < count; i++) children.push(startChild(process.execPath, [main], { cwd: root, env }));
  if (count) step(`started ${count} queue worker process${count === 1 ? '' : 'es'}`);
  return { children, stop: () => Promise.all(children.map((c) => stopChild(c))) };
}
