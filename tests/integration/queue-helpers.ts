/**
 * Helpers for the queue tests: worker processes of the built worker (dist/worker/main.mjs) on a queue
 * of the test's own (TAUFORGE_QUEUE), so the worker `npm test` starts never takes these jobs.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { join } from 'node:path';

export const root = join(__dirname, '..', '..');

export async function buildWorker(): Promise<string> {
  const mod = (await import(join(root, 'scripts', 'worker', 'build.mjs'))) as { buildWorker: () => Promise<{ main: string }> };
  return (await mod.buildWorker()).main;
}

export interface WorkerProc {
  child: ChildProcess;
  log: string[];
  kill(signal?: NodeJS.Signals): Promise<void>;
}

/** Start one worker process and wait for its "ready" line. */
export async function startWorker(main: string, env: Record<string, string | undefined>): Promise<WorkerProc> {
  const child = spawn(process.execPath, [main], { cwd: root, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
  const log: string[] = [];
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`worker did not start: ${log.join('')}`)), 30_000);
    const on = (b: Buffer) => {
      log.push(b.toString());
      if (/ready/.test(b.toString())) {
        clearTimeout(timer);
        resolve();
      }
    };
    child.stdout!.on('data', on);
    child.stderr!.on('data', (b: Buffer) => log.push(b.toString()));
    child.once('exit', (code) => reject(new Error(`worker exited (${code}): ${log.join('')}`)));
  });
  return {
    child,
    log,
    kill: (signal = 'SIGTERM') =>
      new Promise<void>((resolve) => {
        if (child.exitCode !== null || child.signalCode !== null) return resolve();
        child.once('exit', () => resolve());
        child.kill(signal);
      }),
  };
}

export async function until<T>(what: string, fn: () => Promise<T | null | undefined | false>, ms = 60_000, every = 100): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const v = await fn();
    if (v) return v;
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, every));
  }
}
