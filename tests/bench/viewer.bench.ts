/**
 * Viewer frame cost in headless Chromium (WebGL2 through SwiftShader, i.e. in software on the CPU):
 * sphere impostors as the viewer draws them (quads written out, one draw per species), the same impostors
 * through InstancedBufferGeometry, and a naive InstancedMesh of 168-triangle spheres — same atoms, same
 * run, same 1280×800 page — at 10³, 10⁴ and 10⁵ atoms (fcc balls from app/lab/viewer). Each frame is
 * forced to finish with a 1-pixel gl.readPixels (window.__tauforgeViewer.renderFrames).
 *
 * Server: TAUFORGE_BASE_URL when set (any running build or dev server); otherwise a production build in
 * .next-bench served by `next start` on a free port and stopped at the end. The build is removed afterwards
 * (eslint and tsc would otherwise read it) unless TAUFORGE_BENCH_KEEP=1, which keeps it for the next run
 * (reused while .next-bench/BUILD_ID exists; TAUFORGE_BENCH_REBUILD=1 forces a fresh one). `next build` rewrites tsconfig.json's
 * include list for its folder; the bench puts the file back as it found it.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium, type Page } from 'playwright-core';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const DIST = '.next-bench';
const SIZES = [1_000, 10_000, 100_000];

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const a = s.address();
      s.close(() => resolve(typeof a === 'object' && a ? a.port : 0));
    });
  });
}

async function waitForHttp(url: string, child: ChildProcess, timeoutMs = 90_000): Promise<void> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (child.exitCode !== null) throw new Error(`next start exited with ${child.exitCode}`);
    try {
      const r = await fetch(url);
      if (r.status < 500) return;
    } catch {
      /* not yet */
    }
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`${url} did not answer within ${timeoutMs / 1000} s`);
}

function build(): void {
  const tsconfig = path.join(root, 'tsconfig.json');
  const before = readFileSync(tsconfig, 'utf8');
  console.log(`building into ${DIST} (once) …`);
  const r = spawnSync(process.execPath, [path.join(root, 'node_modules', 'next', 'dist', 'bin', 'next'), 'build'], {
    cwd: root,
    env: { ...process.env, TAUFORGE_DIST_DIR: DIST, NEXT_TELEMETRY_DISABLED: '1', NODE_ENV: 'production' },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  if (readFileSync(tsconfig, 'utf8') !== before) writeFileSync(tsconfig, before);
  if (r.status !== 0) throw new Error(`next build failed (exit ${r.status})`);
}

async function server(): Promise<{ base: string; stop: () => Promise<void> }> {
  if (process.env.TAUFORGE_BASE_URL) return { base: process.env.TAUFORGE_BASE_URL, stop: async () => {} };
  if (process.env.TAUFORGE_BENCH_REBUILD === '1' || !existsSync(path.join(root, DIST, 'BUILD_ID'))) build();
  const port = await freePort();
  const child = spawn(process.execPath, [path.join(root, 'node_modules', 'next', 'dist', 'bin', 'next'), 'start', '-H', '127.0.0.1', '-p', String(port)], {
    cwd: root,
    env: { ...process.env, TAUFORGE_DIST_DIR: DIST, NEXT_TELEMETRY_DISABLED: '1', NODE_ENV: 'production' },
    stdio: 'ignore',
  });
  const base = `http://127.0.0.1:${port}`;
  const halt = () =>
    new Promise<void>((resolve) => {
      if (child.exitCode !== null) return resolve();
      const t = setTimeout(() => child.kill('SIGKILL'), 10_000);
      child.once('exit', () => {
        clearTimeout(t);
        resolve();
      });
      child.kill('SIGTERM');
    });
  const stop = async () => {
    await halt();
    if (process.env.TAUFORGE_BENCH_KEEP !== '1') rmSync(path.join(root, DIST), { recursive: true, force: true });
  };
  try {
    await waitForHttp(`${base}/lab/viewer?n=1`, child);
  } catch (e) {
    await stop();
    throw e;
  }
  return { base, stop };
}

interface Figures {
  msPerFrame: number;
  triangles: number;
  calls: number;
}

async function measure(page: Page, base: string, n: number, mode: 'impostor' | 'instanced' | 'naive'): Promise<Figures> {
  await page.goto(`${base}/lab/viewer?n=${n}&shape=fcc&mode=${mode}`);
  await page.waitForFunction(() => ((window as unknown as { __tauforgeViewer?: { frames(): number } }).__tauforgeViewer?.frames() ?? 0) > 0, null, { timeout: 300_000 });
  // Fewer frames where one frame takes seconds.
  const k = mode === 'naive' && n >= 100_000 ? 2 : n >= 100_000 ? 4 : 8;
  return (await page.evaluate(`window.__tauforgeViewer.renderFrames(${k})`)) as Figures;
}

export default async function viewerBench(): Promise<void> {
  const { base, stop } = await server();
  const browser = await chromium.launch({
    executablePath: process.env.TAUFORGE_CHROMIUM ?? '/usr/bin/chromium',
    args: ['--use-angle=swiftshader', '--disable-background-networking', '--no-first-run'],
  });
  try {
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    page.setDefaultTimeout(300_000);
    console.log('atoms   | viewer ms/frame  triangles calls | instanced ms/frame | naive ms/frame  triangles calls | naive/viewer');
    let ratioAtMax = NaN;
    for (const n of SIZES) {
      const imp = await measure(page, base, n, 'impostor');
      const inst = await measure(page, base, n, 'instanced');
      const naive = await measure(page, base, n, 'naive');
      const ratio = naive.msPerFrame / imp.msPerFrame;
      if (n === SIZES[SIZES.length - 1]) ratioAtMax = ratio;
      console.log(
        `${String(n).padStart(7)} | ${imp.msPerFrame.toFixed(1).padStart(14)} ${String(imp.triangles).padStart(10)} ${String(imp.calls).padStart(5)} | ` +
          `${inst.msPerFrame.toFixed(1).padStart(18)} | ${naive.msPerFrame.toFixed(1).padStart(14)} ${String(naive.triangles).padStart(10)} ${String(naive.calls).padStart(5)} | ${ratio.toFixed(1).padStart(6)}×`,
      );
    }
    console.log(`target: the viewer's frame ≥ 10× cheaper than naive spheres at ${SIZES[SIZES.length - 1]} atoms — ${ratioAtMax >= 10 ? 'met' : 'NOT met'} (${ratioAtMax.toFixed(1)}×)`);
  } finally {
    await browser.close();
    await stop();
  }
}
