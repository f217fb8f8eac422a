// Our own MariaDB server: a data directory inside the project, bound to 127.0.0.1 on a project port,
// with its own socket and pid file. It never reads /etc/mysql (--no-defaults) and never touches a
// system MariaDB.
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { fail, step } from '../../scripts/lib/log.mjs';
import { capture, portFree, run, startChild, stopChild, which } from '../../scripts/lib/proc.mjs';

const asRoot = typeof process.getuid === 'function' && process.getuid() === 0;

function bin(name) {
  const p = which(name);
  if (!p) fail(`${name} was not found; install Debian's mariadb-server (npm start does this when run as root).`);
  return p;
}

export function paths(dataDir) {
  const run = join(dataDir, '..', `${dataDir.split('/').pop()}-run`);
  return {
    dataDir,
    runDir: run,
    socket: join(run, 'mariadb.sock'),
    pidFile: join(run, 'mariadb.pid'),
    logFile: join(run, 'mariadb.err'),
  };
}

/** Initialise the data directory once (about 2 s). */
export function initialise(dataDir) {
  const p = paths(dataDir);
  mkdirSync(p.runDir, { recursive: true });
  if (existsSync(join(dataDir, 'mysql'))) {
    step(`MariaDB data directory ${rel(dataDir)} exists; reusing it`);
    return p;
  }
  step(`initialising MariaDB data directory ${rel(dataDir)}`);
  mkdirSync(dataDir, { recursive: true });
  const args = ['--no-defaults', `--datadir=${dataDir}`, '--auth-root-authentication-method=normal', '--skip-test-db'];
  if (asRoot) args.splice(1, 0, '--user=root');
  const r = capture(bin('mariadb-install-db'), args);
  if (r.status !== 0) {
    rmSync(dataDir, { recursive: true, force: true });
    fail(`mariadb-install-db failed: ${(r.stderr || r.stdout).trim().split('\n').slice(-3).join(' | ')}`);
  }
  return p;
}

function rel(p) {
  return p.startsWith(process.cwd()) ? p.slice(process.cwd().length + 1) : p;
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

function admin(p, args) {
  return capture(bin('mariadb-admin'), ['--no-defaults', `--socket=${p.socket}`, '-uroot', ...args]);
}

/** Start mariadbd and wait until it answers. Returns a handle with stop(). */
export async function start(dataDir, port) {
  const p = paths(dataDir);
  const running = alivePid(p.pidFile);
  if (running) {
    fail(`Tauforge's MariaDB for ${rel(dataDir)} is already running (pid ${running}); is another npm start still up? Stop it, or kill ${running}.`);
  }
  if (!(await portFree(port))) {
    fail(`port ${port} on 127.0.0.1 is in use; stop what listens there or set TAUFORGE_DB_PORT to a free port.`);
  }
  step(`starting MariaDB on 127.0.0.1:${port}`);
  const args = [
    '--no-defaults',
    ...(asRoot ? ['--user=root'] : []),
    `--datadir=${dataDir}`,
    `--socket=${p.socket}`,
    `--pid-file=${p.pidFile}`,
    `--port=${port}`,
    '--bind-address=127.0.0.1',
    `--log-error=${p.logFile}`,
    // The 16 MiB default breaks large exports.
    '--max-allowed-packet=256M',
    '--character-set-server=utf8mb4',
    '--collation-server=utf8mb4_unicode_ci',
    '--innodb-buffer-pool-size=256M',
    '--skip-name-resolve',
  ];
  const child = startChild(bin('mariadbd'), args, { stdio: 'ignore' });
  const until = Date.now() + 60_000;
  while (Date.now() < until) {
    if (child.exitCode !== null) {
      const tail = existsSync(p.logFile) ? readFileSync(p.logFile, 'utf8').trim().split('\n').slice(-3).join(' | ') : '';
      fail(`mariadbd exited at start (code ${child.exitCode}): ${tail.slice(0, 400)}`);
    }
    if (admin(p, ['ping']).status === 0) break;
    await new Promise((r) => setTimeout(r, 250));
  }
  if (admin(p, ['ping']).status !== 0) fail('MariaDB did not answer within 60 s; see its log in ' + rel(p.logFile));
  return {
    ...p,
    port,
    child,
    /** Clean shutdown: mariadb-admin shutdown, then wait for the process. */
    async stop() {
      if (child.exitCode !== null) return;
      step('stopping MariaDB');
      admin(p, ['shutdown']);
      await stopChild(child, 30_000);
    },
  };
}

/** Run SQL as root over the socket. */
export function sql(handle, statement) {
  const r = capture(bin('mariadb'), ['--no-defaults', `--socket=${handle.socket}`, '-uroot', '-e', statement]);
  if (r.status !== 0) fail(`MariaDB refused a setup statement: ${r.stderr.trim().slice(0, 300)}`);
  return r.stdout;
}

function quote(s) {
  return `'${String(s).replace(/\\/g, '\\\\').replace(/'/g, "\\'")}'`;
}

/** Create the database (optionally dropping it first) and the application user for localhost and 127.0.0.1. */
export function createDatabase(handle, { name, user, password, fresh = false }) {
  if (!/^[A-Za-z0-9_]+$/.test(name) || !/^[A-Za-z0-9_]+$/.test(user)) fail('database and user names may hold only letters, digits and _');
  step(`${fresh ? 'creating a fresh' : 'ensuring'} database ${name} and user ${user}`);
  const stmts = [];
  if (fresh) stmts.push(`DROP DATABASE IF EXISTS \`${name}\``);
  stmts.push(`CREATE DATABASE IF NOT EXISTS \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  for (const host of ['localhost', '127.0.0.1']) {
    stmts.push(`CREATE USER IF NOT EXISTS ${quote(user)}@${quote(host)} IDENTIFIED BY ${quote(password)}`);
    stmts.push(`ALTER USER ${quote(user)}@${quote(host)} IDENTIFIED BY ${quote(password)}`);
    // The test suite creates and drops scratch databases (migration up/down tests), hence the wildcard.
    stmts.push(`GRANT ALL PRIVILEGES ON \`${name.replace(/_/g, '\\_')}%\`.* TO ${quote(user)}@${quote(host)}`);
  }
  stmts.push('FLUSH PRIVILEGES');
  sql(handle, stmts.join(';\n'));
}

export { run };
