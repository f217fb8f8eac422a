// Our own redis-server for the job queue, run exactly like our MariaDB: a data folder inside the project,
// bound to 127.0.0.1 on a project port, with its own pid file and log, never reading /etc/redis.
// REDIS_URL points at an external Redis instead; then nothing is started here.
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { ensureDebian } from './install.mjs';
import { fail, step } from './log.mjs';
import { capture, portFree, startChild, stopChild, which } from './proc.mjs';

export function ensureRedis() {
  if (process.env.REDIS_URL) return;
  ensureDebian(['redis-server'], () => Boolean(which('redis-server')), 'the job queue');
}

export function redisPaths(dataDir) {
  const run = join(dataDir, '..', `${dataDir.split('/').pop()}-run`);
  return { dataDir, runDir: run, pidFile: join(run, 'redis.pid'), logFile: join(run, 'redis.log') };
}

function alivePid(pidFile) {
  if (!existsSync(pidFile)) return null;
  const pid = Number(readFileSync(pidFile, 'utf8').trim());
  if (!pid) return null;
  try {
    process.kill(pid, 0);
    return pid;
  } catch {
    return null;
  }
}

function rel(p) {
  return p.startsWith(process.cwd()) ? p.slice(process.cwd().length + 1) : p;
}

/**
 * Start redis-server and wait until it answers PING. `persist` keeps an append-only file in the data
 * folder (npm start: queued jobs survive a restart); the tests run without one.
 */
export async function startRedis({ dataDir, port, persist = true, fresh = false }) {
  const p = redisPaths(dataDir);
  const running = alivePid(p.pidFile);
  if (running) fail(`Tauforge's Redis for ${rel(dataDir)} is already running (pid ${running}); is another npm start still up? Stop it, or kill ${running}.`);
  if (!(await portFree(port))) fail(`port ${port} on 127.0.0.1 is in use; stop what listens there or set TAUFORGE_REDIS_PORT to a free port.`);
  if (fresh) rmSync(dataDir, { recursive: true, force: true });
  mkdirSync(dataDir, { recursive: true });
  mkdirSync(p.runDir, { recursive: true });
  const bin = which('redis-server');
  if (!bin) fail("redis-server was not found; install Debian's redis-server (npm start does this when run as root) or set REDIS_URL.");
  step(`starting Redis on 127.0.0.1:${port}`);
  const args = [
    '--bind', '127.0.0.1',
    '--port', String(port),
    '--dir', dataDir,
    '--pidfile', p.pidFile,
    '--logfile', p.logFile,
    '--daemonize', 'no',
    '--protected-mode', 'yes',
    // BullMQ needs every key kept: a queue must never be evicted under memory pressure.
    '--maxmemory-policy', 'noeviction',
    '--save', '',
    '--appendonly', persist ? 'yes' : 'no',
  ];
  const child = startChild(bin, args, { stdio: 'ignore' });
  const cli = which('redis-cli');
  const ping = () => (cli ? capture(cli, ['-h', '127.0.0.1', '-p', String(port), 'ping']).stdout.trim() === 'PONG' : false);
  const until = Date.now() + 30_000;
  while (Date.now() < until) {
    if (child.exitCode !== null) {
      const tail = existsSync(p.logFile) ? readFileSync(p.logFile, 'utf8').trim().split('\n').slice(-3).join(' | ') : '';
      fail(`redis-server exited at start (code ${child.exitCode}): ${tail.slice(0, 400)}`);
    }
    if (ping()) break;
    await new Promise((r) => setTimeout(r, 100));
  }
  if (!ping()) fail('Redis did not answer within 30 s; see its log in ' + rel(p.logFile));
  return {
    ...p,
    port,
    child,
    url: `redis://127.0.0.1:${port}`,
    /** SIGTERM: redis-server writes its append-only file and exits. */
    async stop() {
      if (child.exitCode !== null) return;
      step('stopping Redis');
      await stopChild(child, 15_000);
    },
  };
}
