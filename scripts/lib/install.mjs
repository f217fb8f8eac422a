// Installs what a fresh machine lacks: node_modules (npm ci) and Debian packages (apt-get).
import { existsSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { root } from './env.mjs';
import { fail, step } from './log.mjs';
import { run, which } from './proc.mjs';

export function ensureNodeModules() {
  const lock = join(root, 'package-lock.json');
  const marker = join(root, 'node_modules', '.package-lock.json');
  if (existsSync(marker) && statSync(marker).mtimeMs >= statSync(lock).mtimeMs) {
    step('node_modules is up to date');
    return;
  }
  step('installing Node packages (npm ci)');
  run('npm', ['ci', '--no-audit', '--no-fund'], { cwd: root });
}

let aptUpdated = false;

/** Install Debian packages unless `present()` says they are there already. */
export function ensureDebian(packages, present, why) {
  if (present()) return;
  if (typeof process.getuid === 'function' && process.getuid() !== 0) {
    fail(`${why} needs the Debian package(s) ${packages.join(' ')}; run as root, or install them first: sudo apt-get install ${packages.join(' ')}`);
  }
  if (!which('apt-get')) {
    fail(`${why} needs ${packages.join(' ')}, and this machine has no apt-get; install them with your system's package manager.`);
  }
  // Wait for another apt/dpkg run instead of failing on its lock.
  const lockWait = ['-o', 'DPkg::Lock::Timeout=600'];
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  if (!aptUpdated) {
    step('apt-get update');
    run('apt-get', [...lockWait, 'update', '-q'], { env });
    aptUpdated = true;
  }
  step(`apt-get install ${packages.join(' ')} (${why})`);
  run('apt-get', [...lockWait, 'install', '-y', '-q', '--no-install-recommends', ...packages], { env });
}

export function ensureMariadb() {
  ensureDebian(['mariadb-server', 'mariadb-client'], () => Boolean(which('mariadbd')), 'the database');
}
