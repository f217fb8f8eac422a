/**
 * Node side of the space-group finder: read moyo's WebAssembly bytes from the installed package and
 * initialise lib/structure/symmetry once (server routes, CLI, tests). The browser fetches the same file
 * (components/workspace/SpaceGroupFacts.tsx).
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { initSymmetry, symmetryReady } from '../structure/symmetry';

/** Absolute path of moyo_wasm_bg.wasm in node_modules. */
export function moyoWasmPath(): string {
  try {
    return createRequire(import.meta.url).resolve('@spglib/moyo-wasm/moyo_wasm_bg.wasm');
  } catch {
    return path.join(process.cwd(), 'node_modules', '@spglib', 'moyo-wasm', 'moyo_wasm_bg.wasm');
  }
}

/** Initialise the symmetry finder from disk (idempotent). */
export function ensureSymmetry(): void {
  if (symmetryReady()) return;
  initSymmetry(readFileSync(moyoWasmPath()));
}
