import { Option, type Command } from 'commander';
import { CliError } from '../errors';
import { generateAndEmit, number, ratio } from '../flags';

/** tiling: Penrose rhombus or Ammann–Beenker tilings. */
export function registerTiling(program: Command): void {
  program
    .command('tiling')
    .description('Penrose rhombus or Ammann–Beenker tiling vertices (patch by radius, or one approximant cell).')
    .addOption(new Option('--family <name>', 'penrose or octagonal').choices(['penrose', 'octagonal']).makeOptionMandatory())
    .option('--radius <r>', 'patch radius in Å (tiles whose centre lies within it)', number)
    .option('--edge <len>', 'rhombus edge length in Å (default 1)', number)
    .option('--approximant <p/q>', 'periodic approximant: a convergent p/q of τ (penrose) or 1+√2 (octagonal)', ratio)
    .option('--max-points <n>', 'refuse to build more points than this', number)
    .addOption(new Option('--format <fmt>', 'xyz or json').choices(['xyz', 'json']).default('xyz'))
    .action((o: { family: string; radius?: number; edge?: number; approximant?: { p: number; q: number }; maxPoints?: number; format: 'xyz' | 'json' }, cmd: Command) => {
      if (o.approximant === undefined && o.radius === undefined) throw new CliError('--radius: required unless --approximant is given');
      generateAndEmit(cmd, { family: o.family, radius: o.radius, edge: o.edge, approximant: o.approximant, maxPoints: o.maxPoints }, o.format);
    });
}
