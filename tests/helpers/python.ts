/**
 * The one way tests call the reference libraries (numpy, scipy, spglib, ase, gemmi, xraylib, pymatgen, periodictable) through
 * Debian's /usr/bin/python3, which `npm test` installs. A missing interpreter or module is a failure with
 * the package to install — a reference check never passes by skipping.
 */
import { execFileSync } from 'node:child_process';

export const PY = '/usr/bin/python3';

/** Run a Python script with `input` on stdin and parse its stdout as JSON. */
export function runPython<T = unknown>(script: string, input = ''): T {
  let out: string;
  try {
    out = execFileSync(PY, ['-c', script], { input, encoding: 'utf8', maxBuffer: 1 << 28, stdio: ['pipe', 'pipe', 'pipe'] });
  } catch (e) {
    const err = e as { code?: string; stderr?: string; message: string };
    if (err.code === 'ENOENT') throw new Error(`${PY} is missing: install Debian's python3 and the reference libraries (npm test does)`);
    const missing = /No module named '([^']+)'/.exec(err.stderr ?? '');
    if (missing) throw new Error(`the reference library ${missing[1]} is missing: install python3-${missing[1]} (npm test does)`);
    throw new Error(`reference script failed: ${err.stderr || err.message}`);
  }
  return JSON.parse(out) as T;
}
