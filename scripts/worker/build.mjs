// Builds the queue worker into plain JavaScript with esbuild (already installed: tsx is built on it):
//   dist/worker/main.mjs    the worker process (BullMQ consumer, MariaDB writes)
//   dist/worker/thread.mjs  the task thread it runs heavy work in (pure lib/ code)
// Why not `next build`: Next.js bundles lib/ into its own server chunks, which a separate process cannot
// start. Why not tsx: production should not compile TypeScript at run time. Packages in node_modules
// stay external (imported at run time), so the output is small and builds in about a second.
import { build } from 'esbuild';
import { join } from 'node:path';
import { root } from '../lib/env.mjs';

export const workerDist = join(root, 'dist', 'worker');

export async function buildWorker() {
  await build({
    absWorkingDir: root,
    entryPoints: { main: 'scripts/worker/main.ts', thread: 'lib/server/queue/thread.ts' },
    outdir: workerDist,
    outExtension: { '.js': '.mjs' },
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    packages: 'external',
    sourcemap: true,
    logLevel: 'warning',
    tsconfig: join(root, 'tsconfig.json'),
  });
  return { main: join(workerDist, 'main.mjs'), thread: join(workerDist, 'thread.mjs') };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const t0 = Date.now();
  await buildWorker();
  console.log(`worker built into dist/worker in ${Date.now() - t0} ms`);
}
