import { Option, type Command } from 'commander';
import { CliError } from '../errors';
import { compute, emit, generateAndEmit, number, ratio, readJsonFile, vector3 } from '../flags';
import { STRUCTURE_FORMATS, writeStructure } from '../../../lib/formats/write';
import type { StructureFormat } from '../../../lib/formats/read';
import { writeCif } from '../../../lib/formats/cif';
import { generate } from '../../../lib/models';
import { ensureSymmetry } from '../../../lib/server/symmetry-wasm';
import { findSpaceGroup, inStandardOrigin } from '../../../lib/structure/symmetry';

interface Flags {
  family: 'icosahedral' | 'decagonal';
  order: { p: number; q: number };
  aR: number;
  lattice?: string;
  offset?: number[];
  species?: string;
  decoration?: string;
  maxPoints?: number;
  format: StructureFormat;
  cifSymmetry: 'found' | 'p1';
}

/** approximant: one periodic cell of a cubic (icosahedral) or decagonal approximant. */
export function registerApproximant(program: Command): void {
  program
    .command('approximant')
    .description('One periodic cell of a cubic (icosahedral) or decagonal approximant p/q.')
    .addOption(new Option('--family <name>', 'icosahedral or decagonal').choices(['icosahedral', 'decagonal']).makeOptionMandatory())
    .requiredOption('--order <p/q>', 'ratio of consecutive Fibonacci numbers: 1/1, 2/1, 3/2, 5/3, …', ratio)
    .requiredOption('--aR <len>', 'quasilattice constant: rhombohedron edge in Å (decagonal: the rhombus edge)', number)
    .addOption(new Option('--lattice <type>', 'hyperlattice P, F or I (icosahedral; default P)').choices(['P', 'F', 'I']))
    .option('--offset <x,y,z>', 'phason offset: window shift in (strained) perpendicular space, Å (icosahedral)', vector3)
    .option('--species <El>', 'element for the vertices (default X)')
    .option('--decoration <file>', 'JSON file with site classes {"classes": […]} (icosahedral)')
    .option('--max-points <n>', 'refuse to build more points than this (default 2000000)', number)
    .addOption(new Option('--format <fmt>', STRUCTURE_FORMATS.join(', ')).choices(STRUCTURE_FORMATS).default('xyz'))
    .addOption(
      new Option('--cif-symmetry <mode>', 'CIF: found = space group, operations and asymmetric unit; p1 = P 1 with every atom').choices(['found', 'p1']).default('found'),
    )
    .action((o: Flags, cmd: Command) => {
      if (o.family === 'decagonal') {
        // Penrose layers stacked along c (lib/models/decagonal); --aR is the rhombus edge.
        if (o.lattice !== undefined || o.offset !== undefined || o.decoration !== undefined)
          throw new CliError('--family: decagonal approximants take --order, --aR, --species, --max-points only');
        generateAndEmit(cmd, { family: 'decagonal', approximant: o.order, edge: o.aR, species: o.species, maxPoints: o.maxPoints }, o.format);
        return;
      }
      const params = {
        family: 'icosahedral',
        mode: 'approximant',
        order: `${o.order.p}/${o.order.q}`,
        aR: o.aR,
        lattice: o.lattice,
        offset: o.offset,
        species: o.species,
        decoration: readJsonFile(o.decoration, '--decoration'),
        maxPoints: o.maxPoints,
      };
      const s = compute(() => generate(params));
      // The space group (moyo, symprec 1e-3 Å) joins the notes, which go to standard error as comment
      // lines so the structure on standard output stays a clean file.
      ensureSymmetry();
      const g = compute(() => findSpaceGroup(s));
      const notes = [...(s.notes ?? []), `space group ${g.hmSymbol} (No. ${g.number}), point group ${g.pointGroup}, found with symprec ${g.symprec} Å`];
      let text: string;
      if (o.format === 'cif' && o.cifSymmetry === 'found') {
        const std = compute(() => inStandardOrigin(s));
        if (std) text = compute(() => writeCif(std.structure, { symmetry: std.spaceGroup }));
        else {
          notes.push('CIF written in P 1: the cell is not in a standard setting of its space group');
          text = compute(() => writeStructure(s, 'cif'));
        }
      } else text = compute(() => writeStructure(s, o.format));
      emit(cmd, text.endsWith('\n') ? text : text + '\n');
      const writeErr = cmd.configureOutput().writeErr ?? ((t: string) => process.stderr.write(t));
      writeErr(notes.map((n) => `# ${n}\n`).join(''));
    });
}
