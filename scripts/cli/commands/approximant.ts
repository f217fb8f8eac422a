import { Option, type Command } from 'commander';
import { CliError } from '../errors';
import { generateAndEmit, number, ratio, readJsonFile, supercellSize, vector3 } from '../flags';
import { WRITE_FORMATS, type WriteFormat } from '../../../lib/formats/write';
import type { SupercellSize } from '../../../lib/structure/supercell';
import { presetDecoration } from '../../../lib/models/icosahedral/decorate';
import { CLUSTER_PRESETS } from '../../../lib/models/icosahedral/clusters';
import { CLUSTER_PRESET_NAMES } from '../../../lib/models/icosahedral/decoration-schema';

interface Flags {
  family: 'icosahedral' | 'decagonal';
  order: { p: number; q: number };
  aR: number;
  lattice?: string;
  offset?: number[];
  species?: string;
  decoration?: string;
  preset?: (typeof CLUSTER_PRESET_NAMES)[number];
  maxPoints?: number;
  format: WriteFormat;
  supercell?: SupercellSize;
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
    .addOption(
      new Option(
        '--preset <name>',
        `a cluster preset on the site it is meant for, with its usual species and companion classes (icosahedral; ${CLUSTER_PRESET_NAMES.map((n) => `${n}: a_R ≈ ${CLUSTER_PRESETS[n].aR!.toFixed(2)} Å`).join(', ')})`,
      ).choices([...CLUSTER_PRESET_NAMES]),
    )
    .option('--max-points <n>', 'refuse to build more points than this (default 2000000)', number)
    .addOption(new Option('--format <fmt>', `${WRITE_FORMATS.join(', ')} (poscar: VASP; lammps: LAMMPS data, atom style atomic)`).choices(WRITE_FORMATS).default('xyz'))
    .option('--supercell <n1xn2xn3>', 'repeat the cell, e.g. 2x2x1 (default 1x1x1)', supercellSize)
    .addOption(
      new Option('--cif-symmetry <mode>', 'CIF: found = space group, operations and asymmetric unit; p1 = P 1 with every atom').choices(['found', 'p1']).default('found'),
    )
    .action((o: Flags, cmd: Command) => {
      if (o.family === 'decagonal') {
        // Penrose layers stacked along c (lib/models/decagonal); --aR is the rhombus edge.
        if (o.lattice !== undefined || o.offset !== undefined || o.decoration !== undefined || o.preset !== undefined)
          throw new CliError('--family: decagonal approximants take --order, --aR, --species, --max-points only');
        generateAndEmit(cmd, { family: 'decagonal', approximant: o.order, edge: o.aR, species: o.species, maxPoints: o.maxPoints }, o.format, o.supercell);
        return;
      }
      if (o.preset !== undefined && o.decoration !== undefined) throw new CliError('--preset and --decoration: give one (a preset is a whole decoration)');
      generateAndEmit(
        cmd,
        {
          family: 'icosahedral',
          mode: 'approximant',
          order: `${o.order.p}/${o.order.q}`,
          aR: o.aR,
          lattice: o.lattice,
          offset: o.offset,
          species: o.species,
          decoration: o.preset !== undefined ? presetDecoration(o.preset) : readJsonFile(o.decoration, '--decoration'),
          maxPoints: o.maxPoints,
        },
        o.format,
        o.supercell,
        o.cifSymmetry,
      );
    });
}
