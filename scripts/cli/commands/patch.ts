import { Option, type Command } from 'commander';
import { generateAndEmit, number, readJsonFile, vector3 } from '../flags';
import { STRUCTURE_FORMATS } from '../../../lib/formats/write';
import type { StructureFormat } from '../../../lib/formats/read';

/** A CIF needs a periodic cell; a finite ball has none. */
const PATCH_FORMATS = STRUCTURE_FORMATS.filter((f) => f !== 'cif');

/** patch: a finite ball of the icosahedral model. */
export function registerPatch(program: Command): void {
  program
    .command('patch')
    .description('A ball of a 3D quasicrystal model cut from its hyperlattice (vertices of the 3D Penrose tiling unless decorated).')
    .addOption(new Option('--family <name>', 'icosahedral').choices(['icosahedral']).makeOptionMandatory())
    .requiredOption('--radius <r>', 'ball radius, same unit as --aR (Å)', number)
    .requiredOption('--aR <len>', 'quasilattice constant: rhombohedron edge in Å', number)
    .addOption(new Option('--lattice <type>', 'hyperlattice P, F or I (default P)').choices(['P', 'F', 'I']))
    .option('--offset <x,y,z>', 'phason offset: window shift in perpendicular space, Å', vector3)
    .option('--centre <x,y,z>', 'ball centre in Å', vector3)
    .option('--species <El>', 'element for the vertices (default X)')
    .option('--decoration <file>', 'JSON file with site classes {"classes": […]}')
    .option('--max-points <n>', 'refuse to build more points than this (default 2000000)', number)
    .addOption(new Option('--format <fmt>', 'coordinate format (a patch has no cell, so no CIF)').choices(PATCH_FORMATS).default('xyz'))
    .action((o: Record<string, unknown> & { decoration?: string; format: StructureFormat }, cmd: Command) => {
      generateAndEmit(
        cmd,
        {
          family: 'icosahedral',
          mode: 'patch',
          radius: o.radius,
          aR: o.aR,
          lattice: o.lattice,
          offset: o.offset,
          centre: o.centre,
          species: o.species,
          decoration: readJsonFile(o.decoration, '--decoration'),
          maxPoints: o.maxPoints,
        },
        o.format,
      );
    });
}
