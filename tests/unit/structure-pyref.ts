// Test helper: run a reference script with the Debian python3 (numpy, ase, gemmi, spglib).
// Tests that use it skip cleanly (it.skipIf) when that interpreter or its modules are missing.
import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';

export const PY = '/usr/bin/python3';

const cache = new Map<string, boolean>();

/** True when /usr/bin/python3 can import every module named. */
export function hasPython(...modules: string[]): boolean {
  const key = modules.join(',');
  if (!cache.has(key)) {
    let ok = existsSync(PY);
    if (ok) {
      try {
        execFileSync(PY, ['-c', modules.map((m) => `import ${m}`).join('; ') || 'pass'], { stdio: 'ignore' });
      } catch {
        ok = false;
      }
    }
    cache.set(key, ok);
  }
  return cache.get(key)!;
}

/** Run a Python script with `input` on stdin and parse its stdout as JSON. */
export function runPython<T = unknown>(script: string, input = ''): T {
  const out = execFileSync(PY, ['-c', script], { input, encoding: 'utf8', maxBuffer: 256 * 1024 * 1024 });
  return JSON.parse(out) as T;
}
