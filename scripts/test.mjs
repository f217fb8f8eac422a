// `npm test`: the same bootstrap as `npm start`, on a throwaway MariaDB and Redis (a fresh data directory
// and database every run; REDIS_URL uses an external Redis instead), with one queue worker, then lint, typecheck, vitest (unit + integration against the real MariaDB),
// a production build served on a free port, and the browser tests in Debian's Chromium.
// The last line is a plain summary: `tests: N passed, N failed`.
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { ensureDebian, ensureMariadb, ensureNodeModules } from './lib/install.mjs';
import { ensureRedis } from './lib/redis.mjs';
import { loadEnv, root, settings } from './lib/env.mjs';
import { UserError, step } from './lib/log.mjs';
import { capture, freePort, stopAllChildren, which } from './lib/proc.mjs';
import { bringUpDatabase, bringUpRedis, dbEnv, migrate, serve, startMailFake, startWorkers } from './lib/services.mjs';
import { spawnSync } from 'node:child_process';

const cleanups = [];
let stopping = false;
const tally = { passed: 0, failed: 0, skipped: 0 };
const problems = [];

async function cleanup() {
  if (stopping) return;
  stopping = true;
  for (const c of cleanups.reverse()) {
    try {
      await c();
    } catch {
      /* keep going */
    }
  }
  await stopAllChildren();
}

process.on('SIGINT', () => void cleanup().then(() => process.exit(130)));
process.on('SIGTERM', () => void cleanup().then(() => process.exit(143)));

function runPhase(label, cmd, args, env) {
  step(label);
  const r = spawnSync(cmd, args, { cwd: root, env, stdio: 'inherit' });
  const ok = r.status === 0;
  if (!ok) problems.push(`${label} failed (exit ${r.status ?? r.signal})`);
  return ok;
}

function vitestPhase(label, configArgs, env, reportName) {
  const report = join(root, '.data', reportName);
  rmSync(report, { force: true });
  const ok = runPhase(label, join(root, 'node_modules', '.bin', 'vitest'), [
    'run', ...configArgs, '--reporter=default', '--reporter=json', `--outputFile.json=${report}`,
  ], env);
  if (!existsSync(report)) {
    problems.push(`${label}: no report was written`);
    tally.failed += 1;
    return;
  }
  const r = JSON.parse(readFileSync(report, 'utf8'));
  tally.passed += r.numPassedTests ?? 0;
  tally.failed += (r.numFailedTests ?? 0) + (ok || r.numFailedTests ? 0 : 1);
  tally.skipped += (r.numPendingTests ?? 0) + (r.numTodoTests ?? 0);
  if ((r.numTotalTests ?? 0) === 0) {
    problems.push(`${label}: no test ran`);
    tally.failed += 1;
  }
}

async function main() {
  step('Tauforge: npm test');
  process.chdir(root);
  ensureNodeModules();
  loadEnv();
  ensureMariadb();
  ensureRedis();
  ensureDebian(['chromium'], () => existsSync('/usr/bin/chromium'), 'the browser tests');
  // A system font with Greek and symbols for glyphs our shipped Latin subsets lack (τ, θ, ⊥, Å in plots).
  ensureDebian(['fonts-dejavu-core'], () => existsSync('/usr/share/fonts/truetype/dejavu'), 'the browser tests');
  // Reference libraries that tests compare our results with (each test names the one it uses).
  ensureDebian(
    ['python3', 'python3-numpy', 'python3-scipy', 'python3-gemmi', 'python3-ase', 'python3-spglib', 'python3-xraylib', 'python3-pymatgen', 'python3-periodictable'],
    () => capture('/usr/bin/python3', ['-c', 'import numpy, scipy, gemmi, ase, spglib, xraylib, pymatgen.core, periodictable']).status === 0,
    'the reference checks in the tests',
  );
  const s = settings();
  mkdirSync(join(root, '.data'), { recursive: true });
  const dataDir = join(root, '.data', `test-mariadb-${process.pid}`);
  rmSync(dataDir, { recursive: true, force: true });
  cleanups.push(() => {
    rmSync(dataDir, { recursive: true, force: true });
    rmSync(`${dataDir}-run`, { recursive: true, force: true });
  });
  const db = { port: await freePort(), name: 'tauforge_test', user: s.dbUser, password: s.dbPassword };
  const handle = await bringUpDatabase({ dataDir, ...db, fresh: true });
  cleanups.push(() => handle.stop());
  const redisDir = join(root, '.data', `test-redis-${process.pid}`);
  const redis = await bringUpRedis({ dataDir: redisDir, port: await freePort(), persist: false, fresh: true });
  cleanups.push(async () => {
    await redis.stop();
    rmSync(redisDir, { recursive: true, force: true });
    rmSync(`${redisDir}-run`, { recursive: true, force: true });
  });
  const smtpPort = await freePort();
  const appPort = await freePort();
  const env = {
    ...process.env,
    ...dbEnv(db),
    NODE_ENV: 'production',
    TAUFORGE_DIST_DIR: '.next-test',
    NEXTAUTH_URL: `http://127.0.0.1:${appPort}`,
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: String(smtpPort),
    TAUFORGE_MAIL_FAKE: '1',
    TAUFORGE_TEST: '1',
    REDIS_URL: redis.url,
    // A killed worker's job moves to another worker after 4 s instead of 30 s.
    TAUFORGE_JOB_LOCK_MS: process.env.TAUFORGE_JOB_LOCK_MS ?? '4000',
  };
  migrate(env, { seed: true });
  const mail = await startMailFake(env, smtpPort);
  cleanups.push(() => mail.stop());

  // A developer may run a subset while working (TAUFORGE_TEST_PHASES=integration,e2e); CI runs them all.
  const phases = new Set((process.env.TAUFORGE_TEST_PHASES ?? 'lint,types,unit,integration,e2e').split(',').map((p) => p.trim()));
  const extra = process.env.TAUFORGE_TEST_FILES ? process.env.TAUFORGE_TEST_FILES.split(',') : [];
  if (phases.has('lint')) {
    const lintOk = runPhase('lint (eslint)', join(root, 'node_modules', '.bin', 'eslint'), ['.'], env);
    if (!lintOk) tally.failed += 1;
  }
  if (phases.has('types')) {
    const typesOk = runPhase('typecheck (tsc)', join(root, 'node_modules', '.bin', 'tsc'), ['--noEmit', '-p', 'tsconfig.json'], env);
    if (!typesOk) tally.failed += 1;
  }

  // One queue worker for the integration and browser tests (uploads and exports go through it).
  if (phases.has('integration') || phases.has('e2e')) {
    const workers = await startWorkers(env, Number(process.env.TAUFORGE_WORKERS ?? 1));
    cleanups.push(() => workers.stop());
  }

  // Unit tests are pure and run two files at a time; integration tests share one database and run in turn.
  if (phases.has('unit')) {
    vitestPhase('unit tests (vitest)', [...(extra.length ? extra.filter((f) => f.startsWith('tests/unit')) : ['tests/unit']), '--fileParallelism'], { ...env, NODE_ENV: 'test' }, 'vitest-unit.json');
  }
  if (phases.has('integration')) {
    vitestPhase('integration tests against MariaDB (vitest)', extra.length ? extra.filter((f) => f.startsWith('tests/integration')) : ['tests/integration'], { ...env, NODE_ENV: 'test' }, 'vitest-integration.json');
  }
  if (!phases.has('e2e')) return;

  const built = runPhase('production build for the browser tests (next build)', process.execPath, [join(root, 'node_modules', 'next', 'dist', 'bin', 'next'), 'build'], { ...env, NEXT_TELEMETRY_DISABLED: '1' });
  if (built) {
    const server = await serve(env, appPort);
    cleanups.push(() => server.stop());
    vitestPhase('browser tests (playwright-core + Chromium)', ['--config', 'tests/e2e/vitest.config.mts', ...extra.filter((f) => f.startsWith('tests/e2e'))], {
      ...env,
      NODE_ENV: 'test',
      TAUFORGE_BASE_URL: `http://127.0.0.1:${appPort}`,
      TAUFORGE_CHROMIUM: which('chromium') ?? '/usr/bin/chromium',
    }, 'e2e-report.json');
  } else {
    tally.failed += 1;
  }
}

main()
  .catch((err) => {
    const msg = err instanceof UserError ? err.message : `${err?.message ?? err}`.split('\n')[0];
    console.error(`tauforge: ${msg}`);
    problems.push(msg);
    tally.failed += 1;
  })
  .finally(async () => {
    await cleanup();
    for (const p of problems) console.log(`  ! ${p}`);
    const failed = tally.failed > 0 || problems.length > 0;
    console.log(`tests: ${tally.passed} passed, ${tally.failed} failed${tally.skipped ? `, ${tally.skipped} skipped` : ''}`);
    process.exit(failed ? 1 : 0);
  });
