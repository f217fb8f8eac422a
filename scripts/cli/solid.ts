import type { Command } from 'commander';
import type { ZodType } from 'zod';
import { readFileSync } from 'node:fs';
import { CliError, zodMessage } from './errors';
import { icosahedralApproximantSchema, icosahedralPatchSchema } from '../../lib/params/icosahedral';
import { generateIcosahedralApproximant, generateIcosahedralPatch } from '../../lib/tiling/decorate';
import { decagonalModel } from '../../lib/tiling/decagonal';
import { writeXyz } from '../../lib/formats/xyz';
import { writeExtxyz } from '../../lib/formats/extxyz';
import { writeCif } from '../../lib/formats/cif';
import { writeJson } from '../../lib/formats/json';
import type { Structure } from '../../lib/structure/types';
import { atomicNumber } from '../../lib/structure/elements';

const FORMATS = ['xyz', 'extxyz', 'cif', 'json'];

function parse<T>(schema: ZodType<T>, input: unknown): T {
  const r = schema.safeParse(input);
  if (!r.success) throw new CliError(zodMessage(r.error));
  return r.data;
}

function num(flag: string, v: string | undefined): number | undefined {
  if (v === undefined) return undefined;
  const x = Number(v);
  if (v.trim() === '' || !Number.isFinite(x)) throw new CliError(`${flag}: "${v}" is not a number`);
  return x;
}

function vec(flag: string, v: string | undefined): number[] | undefined {
  if (v === undefined) return undefined;
  const parts = v.split(',');
  if (parts.length !== 3) throw new CliError(`${flag}: expected three numbers x,y,z, got "${v}"`);
  return parts.map((p) => num(flag, p)!);
}

function format(v: string): string {
  if (!FORMATS.includes(v)) throw new CliError(`--format: must be one of ${FORMATS.join(', ')}, got "${v}"`);
  return v;
}

function decorationFile(path: string | undefined): unknown {
  if (path === undefined) return undefined;
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch {
    throw new CliError(`--decoration: cannot read file "${path}"`);
  }
  try {
    return JSON.parse(text) as unknown;
  } catch (err) {
    throw new CliError(`--decoration: "${path}" is not valid JSON (${err instanceof Error ? err.message : String(err)})`);
  }
}

/** Generators throw RangeError naming the field (e.g. the point cap); that is a user error here. */
function run(make: () => Structure): Structure {
  try {
    return make();
  } catch (err) {
    if (err instanceof RangeError) throw new CliError(err.message);
    throw err;
  }
}

function write(s: Structure, fmt: string): void {
  const text = fmt === 'json' ? writeJson(s) : fmt === 'extxyz' ? writeExtxyz(s) : fmt === 'cif' ? writeCif(s) : writeXyz(s);
  process.stdout.write(text.endsWith('\n') ? text : text + '\n');
}

type Opts = Record<string, string | undefined>;

/** patch, approximant — owned by the icosahedral engine (decagonal approximants call lib/tiling/decagonal). */
export function registerSolidCommands(program: Command): void {
  program
    .command('patch')
    .description('A ball of a 3D quasicrystal model cut from its hyperlattice (vertices of the 3D Penrose tiling unless decorated).')
    .requiredOption('--family <name>', 'icosahedral')
    .requiredOption('--radius <r>', 'ball radius, same unit as --aR (Å)')
    .requiredOption('--aR <len>', 'quasilattice constant: rhombohedron edge in Å')
    .option('--lattice <type>', 'hyperlattice P, F or I', 'P')
    .option('--offset <x,y,z>', 'phason offset: window shift in perpendicular space, Å')
    .option('--centre <x,y,z>', 'ball centre in Å')
    .option('--species <El>', 'element for the vertices (default X)')
    .option('--decoration <file>', 'JSON file with site classes {"classes": […]}')
    .option('--max-points <n>', 'refuse to build more points than this (default 2000000)')
    .option('--format <fmt>', FORMATS.join(', '), 'xyz')
    .action((o: Opts) => {
      const fmt = format(String(o.format));
      if (o.family !== 'icosahedral') throw new CliError(`--family: patch supports icosahedral, got "${o.family}"`);
      const p = parse(icosahedralPatchSchema, {
        family: 'icosahedral',
        radius: num('--radius', o.radius),
        aR: num('--aR', o.aR),
        lattice: o.lattice,
        offset: vec('--offset', o.offset),
        centre: vec('--centre', o.centre),
        species: o.species,
        decoration: decorationFile(o.decoration),
        maxPoints: num('--max-points', o.maxPoints),
      });
      write(run(() => generateIcosahedralPatch(p)), fmt);
    });

  program
    .command('approximant')
    .description('One periodic cell of a cubic (icosahedral) or decagonal approximant p/q.')
    .requiredOption('--family <name>', 'icosahedral or decagonal')
    .requiredOption('--order <p/q>', 'ratio of consecutive Fibonacci numbers: 1/1, 2/1, 3/2, 5/3, …')
    .requiredOption('--aR <len>', 'quasilattice constant: rhombohedron edge in Å')
    .option('--lattice <type>', 'hyperlattice P, F or I', 'P')
    .option('--offset <x,y,z>', 'phason offset: window shift in (strained) perpendicular space, Å')
    .option('--species <El>', 'element for the vertices (default X)')
    .option('--decoration <file>', 'JSON file with site classes {"classes": […]}')
    .option('--max-points <n>', 'refuse to build more points than this (default 2000000)')
    .option('--format <fmt>', FORMATS.join(', '), 'xyz')
    .action((o: Opts) => {
      const fmt = format(String(o.format));
      if (o.family === 'decagonal') {
        // Decagonal: Penrose layers stacked along c (lib/tiling/decagonal.ts); --aR is the rhombus edge.
        if (o.lattice !== 'P' || o.offset !== undefined || o.decoration !== undefined)
          throw new CliError('--family: decagonal approximants take --order, --aR, --species, --max-points only');
        const m = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(o.order ?? '');
        if (!m) throw new CliError(`--order: expected P/Q such as 3/2, got "${o.order}"`);
        const aR = num('--aR', o.aR);
        const maxPoints = num('--max-points', o.maxPoints);
        const s = run(() => decagonalModel({ approximant: { p: Number(m[1]), q: Number(m[2]) }, edge: aR, ...(maxPoints !== undefined ? { maxPoints } : {}) }));
        if (o.species) {
          const sp = parse(icosahedralPatchSchema.shape.species, o.species);
          if (sp) s.species.fill(atomicNumber(sp));
        }
        write(s, fmt);
        return;
      }
      if (o.family !== 'icosahedral') throw new CliError(`--family: must be icosahedral or decagonal, got "${o.family}"`);
      const p = parse(icosahedralApproximantSchema, {
        family: 'icosahedral',
        order: o.order?.replace(/\s+/g, ''),
        aR: num('--aR', o.aR),
        lattice: o.lattice,
        offset: vec('--offset', o.offset),
        species: o.species,
        decoration: decorationFile(o.decoration),
        maxPoints: num('--max-points', o.maxPoints),
      });
      write(run(() => generateIcosahedralApproximant(p)), fmt);
    });
}
