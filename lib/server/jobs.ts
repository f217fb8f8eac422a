/** Runs lib/server/export-worker.ts in a child Node process (see that file for why). */
import { spawn } from 'node:child_process';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { ApiError } from './errors';

const TIMEOUT_MS = 120_000;
// Below MariaDB's max_allowed_packet (256 MiB, set by db/server/mariadb.mjs) so the row can be stored.
const MAX_BYTES = 200 * 1024 * 1024;

export function runExportJob(params: unknown, format: string): Promise<Buffer> {
  // `next start`, `next dev` and vitest all run from the project root.
  const root = process.env.TAUFORGE_ROOT ?? process.cwd();
  const loader = pathToFileURL(join(root, 'node_modules', 'tsx', 'dist', 'loader.mjs')).href;
  const script = join(root, 'lib', 'server', 'export-worker.ts');
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', loader, script], { cwd: root, env: process.env, stdio: ['pipe', 'pipe', 'pipe'] });
    const out: Buffer[] = [];
    const err: Buffer[] = [];
    let size = 0;
    const timer = setTimeout(() => child.kill('SIGKILL'), TIMEOUT_MS);
    child.stdout.on('data', (c: Buffer) => {
      size += c.length;
      if (size > MAX_BYTES) child.kill('SIGKILL');
      else out.push(c);
    });
    child.stderr.on('data', (c: Buffer) => err.push(c));
    child.on('error', (e) => {
      clearTimeout(timer);
      reject(e);
    });
    child.on('close', (code, signal) => {
      clearTimeout(timer);
      const msg = Buffer.concat(err).toString('utf8').trim().split('\n')[0]?.slice(0, 500) ?? '';
      if (code === 0) resolve(Buffer.concat(out));
      else if (code === 2) reject(new ApiError('unprocessable', `This revision cannot be generated: ${msg}`));
      else if (signal) reject(new ApiError('unprocessable', size > MAX_BYTES ? 'The export would be larger than 200 MB; cut a smaller model.' : 'The export took longer than two minutes and was stopped; cut a smaller model.'));
      else reject(new Error(`export worker failed (${code}): ${msg}`));
    });
    child.stdin.end(JSON.stringify({ params, format }));
  });
}
