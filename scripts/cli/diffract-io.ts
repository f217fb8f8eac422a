/** Input/output helpers for the `diffract` commands. */
import { readFileSync } from 'node:fs';
import { CliError } from './errors';
import { readStructure } from '../../lib/formats/read';
import type { Structure } from '../../lib/structure/types';

export function readText(path: string, flag: string): string {
  try {
    return readFileSync(path, 'utf8');
  } catch (e) {
    throw new CliError(`${flag}: cannot read "${path}" (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
  }
}

/** Any structure file the formats engine reads (XYZ, extended XYZ, CIF, Tauforge JSON). */
export function loadStructure(path: string): Structure {
  const text = readText(path, '--input');
  try {
    return readStructure(text, path);
  } catch (e) {
    throw new CliError(`--input: ${(e as Error).message}`);
  }
}

/** A flag that must be a number. */
export function num(flag: string, v: string | undefined): number | undefined {
  if (v === undefined) return undefined;
  const x = Number(v);
  if (v.trim() === '' || !Number.isFinite(x)) throw new CliError(`${flag}: "${v}" is not a number`);
  return x;
}

export function oneOf<T extends string>(flag: string, v: string, allowed: readonly T[]): T {
  if (!(allowed as readonly string[]).includes(v)) throw new CliError(`${flag}: must be one of ${allowed.join(', ')}, got "${v}"`);
  return v as T;
}

/** "20:90" → [20, 90]. */
export function range(flag: string, v: string): [number, number] {
  const m = /^\s*([-+0-9.eE]+)\s*:\s*([-+0-9.eE]+)\s*$/.exec(v);
  const a = m ? Number(m[1]) : NaN;
  const b = m ? Number(m[2]) : NaN;
  if (!Number.isFinite(a) || !Number.isFinite(b)) throw new CliError(`${flag}: expected START:END, e.g. 20:90, got "${v}"`);
  if (!(b > a)) throw new CliError(`${flag}: end ${b} must exceed start ${a}`);
  return [a, b];
}

/** Round for output: fixed decimals, and −0 → 0, so the same input always prints the same bytes. */
export function r(x: number, decimals = 6): number {
  const v = Number(x.toFixed(decimals));
  return v === 0 ? 0 : v;
}

/** Run a lib computation; its errors name the field and are the user's to fix. */
export function compute<T>(f: () => T): T {
  try {
    return f();
  } catch (e) {
    if (e instanceof CliError) throw e;
    throw new CliError((e as Error).message);
  }
}
