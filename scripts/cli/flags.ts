/**
 * What the commands share: commander argument parsers (a bad value is reported by commander as
 * "option '--aR <len>' argument 'abc' is invalid. …", exit code 2), reading files, and writing results.
 */
import { readFileSync } from 'node:fs';
import { InvalidArgumentError, Option, type Command } from 'commander';
import type { ZodType } from 'zod';
import { CliError, zodMessage } from './errors';
import { plainError } from '../../lib/zod-text';
import type { Structure } from '../../lib/structure/types';
import { readStructure, type StructureFormat } from '../../lib/formats/read';
import { exportFile, type WriteFormat } from '../../lib/formats/write';
import { parseSupercell, type SupercellSize } from '../../lib/structure/supercell';
import { generate } from '../../lib/models';
import { ensureSymmetry } from '../../lib/server/symmetry-wasm';
import { spaceGroupOf } from '../../lib/structure/symmetry';
import { radiationSchema } from '../../lib/diffraction/params';
import type { Radiation } from '../../lib/diffraction/form-factors';
import { parseWavelength } from '../../lib/diffraction/wavelengths';

/** commander parser: a finite number. */
export function number(v: string): number {
  const x = Number(v);
  if (v.trim() === '' || !Number.isFinite(x)) throw new InvalidArgumentError('not a number');
  return x;
}

/** commander parser: "x,y,z" → three numbers. */
export function vector3(v: string): number[] {
  const parts = v.split(',');
  if (parts.length !== 3) throw new InvalidArgumentError('expected three numbers x,y,z');
  return parts.map((p) => number(p));
}

/** commander parser: "b0,b1,…" → numbers (one or more). */
export function numbers(v: string): number[] {
  return v.split(',').map((p) => {
    try {
      return number(p);
    } catch {
      throw new InvalidArgumentError(`"${p}" is not a number; expected numbers separated by commas`);
    }
  });
}

/**
 * commander parser: a wavelength spec (an X-ray line such as CuKa1, "<n>kV" for electrons, or a length
 * in Å), checked here and kept as written: the line name also tells `diffract powder --kalpha2` its Kα2.
 */
export function wavelength(v: string): string {
  try {
    parseWavelength(v, 'wavelength');
  } catch (e) {
    throw new InvalidArgumentError((e as Error).message.replace(/^wavelength: /, ''));
  }
  return v;
}

/** --radiation: which scattering factors the diffraction commands use. */
export function radiationOption(fallback: Radiation): Option {
  return new Option('--radiation <r>', 'radiation, for the scattering factors').choices(radiationSchema.options).default(fallback);
}

/** commander parser: "p/q" → {p, q} (whether p/q is an allowed order is the model's to say). */
export function ratio(v: string): { p: number; q: number } {
  const m = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(v);
  if (!m) throw new InvalidArgumentError('expected P/Q such as 3/2');
  return { p: Number(m[1]), q: Number(m[2]) };
}

/** commander parser: "20:90" → [20, 90] with end > start. */
export function span(v: string): [number, number] {
  const m = /^\s*([-+0-9.eE]+)\s*:\s*([-+0-9.eE]+)\s*$/.exec(v);
  const a = m ? Number(m[1]) : NaN;
  const b = m ? Number(m[2]) : NaN;
  if (!Number.isFinite(a) || !Number.isFinite(b)) throw new InvalidArgumentError('expected START:END, e.g. 20:90');
  if (!(b > a)) throw new InvalidArgumentError(`end ${b} must exceed start ${a}`);
  return [a, b];
}

/** Validate with a zod schema; a failure is the user's to fix (exit 2). */
export function parse<T>(schema: ZodType<T>, input: unknown): T {
  const r = schema.safeParse(input, { error: plainError });
  if (!r.success) throw new CliError(zodMessage(r.error));
  return r.data;
}

export function readText(path: string, flag: string): string {
  try {
    return readFileSync(path, 'utf8');
  } catch (e) {
    throw new CliError(`${flag}: cannot read "${path}" (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
  }
}

/** A JSON file given to a flag. */
export function readJsonFile(path: string | undefined, flag: string): unknown {
  if (path === undefined) return undefined;
  const text = readText(path, flag);
  try {
    return JSON.parse(text) as unknown;
  } catch (err) {
    throw new CliError(`${flag}: "${path}" is not valid JSON (${err instanceof Error ? err.message : String(err)})`);
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

/**
 * A command's result goes to its standard output: commander's writeOut, which program.ts sets to
 * process.stdout (or to a buffer when a test runs the program in-process).
 */
export function emit(cmd: Command, text: string): void {
  const write = cmd.configureOutput().writeOut ?? ((t: string) => process.stdout.write(t));
  write(text);
}

/** commander parser: "2x2x1" → [2, 2, 1]. */
export function supercellSize(v: string): SupercellSize {
  try {
    return parseSupercell(v);
  } catch (e) {
    throw new InvalidArgumentError((e as Error).message.replace(/^supercell: /, ''));
  }
}

/**
 * Params → Structure through the registry (the only way in), written to stdout in one format through the export
 * pipeline (lib/formats/write.ts exportFile): checked, optionally repeated into a supercell, wrapped into the cell
 * when periodic, the check's warnings in the comment line and on standard error.
 */
/** Periodic cuts up to this many atoms get their space group in the CLI's notes. */
const SPACE_GROUP_ATOM_LIMIT = 12000;

export function generateAndEmit(
  cmd: Command,
  params: Record<string, unknown>,
  format: WriteFormat | StructureFormat,
  supercell?: SupercellSize,
  cifSymmetry: 'found' | 'p1' = 'p1',
): void {
  const s = compute(() => generate(params));
  // The space group (moyo, symprec 1e-3 Å) for periodic cuts small enough to search quickly; larger cells
  // (the search grows fast with the atom count) are left to `check`.
  ensureSymmetry();
  const spaceGroup = s.cell && s.species.length <= SPACE_GROUP_ATOM_LIMIT ? spaceGroupOf : undefined;
  const { text, report } = compute(() => exportFile(s, format, { supercell, spaceGroup, cifSymmetry }));
  const errOut = cmd.configureOutput().writeErr;
  // Notes and the space group go to standard error as '# ' comment lines, so standard output stays a clean file.
  const notes = [...(s.notes ?? [])];
  if (report.spaceGroup) notes.push(`space group ${report.spaceGroup.symbol} (No. ${report.spaceGroup.number})`);
  if (errOut) for (const n of notes) errOut(`# ${n}\n`);
  for (const w of report.warnings) if (w.severity !== 'info' && errOut) errOut(`check ${w.severity}: ${w.message}\n`);
  emit(cmd, text.endsWith('\n') ? text : text + '\n');
}
