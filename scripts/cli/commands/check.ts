import { Option, type Command } from 'commander';
import { CliError } from '../errors';
import { compute, emit, loadStructure, number } from '../flags';
import { checkStructure, checkText } from '../../../lib/structure/checks/report';
import { spaceGroupOf, SYMMETRY_ATOM_LIMITS } from '../../../lib/structure/symmetry';
import { ensureSymmetry } from '../../../lib/server/symmetry-wasm';

interface Flags {
  input: string;
  format: 'json' | 'text';
  maxListed?: number;
  strict?: boolean;
  symmetryMaxAtoms: number;
}

/** check: the Check step on any structure file the command line reads. */
export function registerCheck(program: Command): void {
  program
    .command('check')
    .description('Check a structure: shortest distances against metallic radii, too-close pairs, coordination, density, composition, space group.')
    .requiredOption('--input <file>', 'structure file: XYZ, extended XYZ, CIF or Tauforge JSON')
    .addOption(new Option('--format <fmt>', 'report as json or text').choices(['json', 'text']).default('text'))
    .option('--max-listed <n>', 'most too-close pairs listed (default 50)', number)
    .option('--strict', 'exit with code 3 when a severe problem is found')
    .option('--symmetry-max-atoms <n>', `largest cell whose space group is searched (moyo, symprec 1e-3 Å; its time grows steeply: ~20 s for 10 000 atoms)`, number, SYMMETRY_ATOM_LIMITS.cli)
    .action((o: Flags, cmd: Command) => {
      if (o.maxListed !== undefined && (!Number.isInteger(o.maxListed) || o.maxListed < 0)) throw new CliError('--max-listed: expected a whole number ≥ 0');
      if (!Number.isInteger(o.symmetryMaxAtoms) || o.symmetryMaxAtoms < 0) throw new CliError('--symmetry-max-atoms: expected a whole number ≥ 0');
      const s = loadStructure(o.input);
      ensureSymmetry();
      const report = compute(() => checkStructure(s, { maxListed: o.maxListed, spaceGroup: spaceGroupOf, spaceGroupMaxAtoms: o.symmetryMaxAtoms }));
      emit(cmd, o.format === 'json' ? JSON.stringify(report, null, 2) + '\n' : checkText(report));
      if (o.strict && report.severe) throw new CliError('check: severe problems found (see the warnings)', 3);
    });
}
