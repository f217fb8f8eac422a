/**
 * Node side of the space-group finder: read moyo's WebAssembly bytes from the installed package and
 * initialise lib/structure/symmetry once (server routes, the queue's tasks, CLI, tests). The browser fetches the
 * same file (components/workspace/CheckPanel.tsx, downloads.ts).
 *
 * The path is built at run time, not written as a module specifier, so the server bundler does not try to bundle
 * the .wasm file itself (it would, and fail, for a literal `require.resolve('@spglib/moyo-wasm/…wasm')`).
 */
import { existsSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { initSymmetry, symmetryReady } from '../structure/symmetry';

const PACKAGE = ['@spglib', 'moyo-wasm'];
const FILE = 'moyo_wasm_bg.wasm';

/** Absolute path of moyo_wasm_bg.wasm in node_modules. */
export function moyoWasmPath(): string {
  const local = path.join(process.cwd(), 'node_modules', ...PACKAGE, FILE);
  if (existsSync(local)) return local;
  try {
    const pkg = createRequire(path.join(process.cwd(), 'package.json')).resolve([...PACKAGE, 'package.json'].join('/'));
    return path.join(path.dirname(pkg), FILE);
  } catch {
    return local;
  }
}

/** Initialise the symmetry finder from disk (idempotent). */
export function ensureSymmetry(): void {
  if (symmetryReady()) return;
  initSymmetry(readFileSync(moyoWasmPath()));
}
