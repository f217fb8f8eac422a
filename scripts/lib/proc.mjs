// Child processes and ports for the bootstrap scripts. Everything started here is stopped on exit.
import { spawn, spawnSync } from 'node:child_process';
import net from 'node:net';

const children = new Set();

/** Run a command to completion with inherited output; throws on non-zero exit. */
export function run(cmd, args, opts = {}) {
  const r = spawnSync(cmd, args, { stdio: 'inherit', ...opts });
  if (r.error) throw r.error;
  if (r.status !== 0) {
    const e = new Error(`${cmd} ${args.join(' ')} exited with ${r.status ?? r.signal}`);
    e.exitCode = r.status ?? 1;
    throw e;
  }
  return r;
}

/** Run and capture stdout; returns { status, stdout, stderr }. */
export function capture(cmd, args, opts = {}) {
  const r = spawnSync(cmd, args, { encoding: 'utf8', ...opts });
  return { status: r.status ?? (r.error ? 127 : 1), stdout: r.stdout ?? '', stderr: r.stderr ?? '', error: r.error };
}

/** Start a long-running child that is killed when this process exits. */
export function startChild(cmd, args, opts = {}) {
  const child = spawn(cmd, args, { stdio: 'inherit', ...opts });
  children.add(child);
  child.on('exit', () => children.delete(child));
  return child;
}

export function which(cmd) {
  const dirs = (process.env.PATH ?? '').split(':').concat(['/usr/sbin', '/usr/bin', '/sbin', '/bin']);
  for (const d of dirs) {
    const r = spawnSync('test', ['-x', `${d}/${cmd}`]);
    if (r.status === 0) return `${d}/${cmd}`;
  }
  return null;
}

/** Resolve true when nothing listens on host:port. */
export function portFree(port, host = '127.0.0.1') {
  return new Promise((resolve) => {
    const srv = net.createServer();
    srv.once('error', () => resolve(false));
    srv.listen(port, host, () => srv.close(() => resolve(true)));
  });
}

/** A free port chosen by the kernel. */
export function freePort(host = '127.0.0.1') {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once('error', reject);
    srv.listen(0, host, () => {
      const { port } = srv.address();
      srv.close(() => resolve(port));
    });
  });
}

/** Wait until a TCP port accepts connections. */
export async function waitForPort(port, host = '127.0.0.1', timeoutMs = 60_000, child) {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (child && child.exitCode !== null) throw new Error(`process exited with ${child.exitCode} before listening on ${port}`);
    const ok = await new Promise((resolve) => {
      const s = net.connect(port, host);
      s.once('connect', () => { s.destroy(); resolve(true); });
      s.once('error', () => resolve(false));
    });
    if (ok) return;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`nothing listened on ${host}:${port} within ${timeoutMs / 1000} s`);
}

/** Terminate a child and wait for it (SIGTERM, then SIGKILL after a grace period). */
export function stopChild(child, graceMs = 10_000) {
  return new Promise((resolve) => {
    if (!child || child.exitCode !== null || child.signalCode !== null) return resolve();
    const timer = setTimeout(() => child.kill('SIGKILL'), graceMs);
    child.once('exit', () => { clearTimeout(timer); resolve(); });
    child.kill('SIGTERM');
  });
}

export async function stopAllChildren() {
  await Promise.all([...children].map((c) => stopChild(c)));
}
