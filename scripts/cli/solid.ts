import type { Command } from 'commander';
import { readFileSync } from 'node:fs';
import { CliError } from './errors';
import { emit, format as formatOf, num, parse, run, vec } from './args';
import { icosahedralApproximantSchema, icosahedralPatchSchema } from '../../lib/params/icosahedral';
import { generateIcosahedralApproximant, generateIcosahedralPatch } from '../../lib/tiling/decorate';
import { decagonalModel } from '../../lib/tiling/decagonal';
import { STRUCTURE_FORMATS } from '../../lib/formats/write';
import { atomicNumber } from '../../lib/structure/elements';

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
    .option('--format <fmt>', STRUCTURE_FORMATS.join(', '), 'xyz')
    .action((o: Opts) => {
      const fmt = formatOf(String(o.format), STRUCTURE_FORMATS);
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
      emit(run(() => generateIcosahedralPatch(p)), fmt);
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
    .option('--format <fmt>', STRUCTURE_FORMATS.join(', '), 'xyz')
    .action((o: Opts) => {
      const fmt = formatOf(String(o.format), STRUCTURE_FORMATS);
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
        emit(s, fmt);
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
      emit(run(() => generateIcosahedralApproximant(p)), fmt);
    });
}
