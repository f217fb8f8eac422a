import { Option, type Command } from 'commander';
import { CliError } from '../errors';
import { compute, emit, loadStructure, number } from '../flags';
import { checkStructure, checkText } from '../../../lib/structure/checks/report';

interface Flags {
  input: string;
  format: 'json' | 'text';
  maxListed?: number;
  strict?: boolean;
}

/** check: the Check step on any structure file the command line reads. */
export function registerCheck(program: Command): void {
  program
    .command('check')
    .description('Check a structure: shortest distances against metallic radii, too-close pairs, coordination, density, composition.')
    .requiredOption('--input <file>', 'structure file: XYZ, extended XYZ, CIF or Tauforge JSON')
    .addOption(new Option('--format <fmt>', 'report as json or text').choices(['json', 'text']).default('text'))
    .option('--max-listed <n>', 'most too-close pairs listed (default 50)', number)
    .option('--strict', 'exit with code 3 when a severe problem is found')
    .action((o: Flags, cmd: Command) => {
      if (o.maxListed !== undefined && (!Number.isInteger(o.maxListed) || o.maxListed < 0)) throw new CliError('--max-listed: expected a whole number ≥ 0');
      const s = loadStructure(o.input);
      const report = compute(() => checkStructure(s, { maxListed: o.maxListed }));
      emit(cmd, o.format === 'json' ? JSON.stringify(report, null, 2) + '\n' : checkText(report));
      if (o.strict && report.severe) throw new CliError('check: severe problems found (see the warnings)', 3);
    });
}
