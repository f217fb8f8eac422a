import { Option, type Command } from 'commander';
import { generateAndEmit, number } from '../flags';

/** chain: the Fibonacci chain (family 'fibonacci'). */
export function registerChain(program: Command): void {
  program
    .command('chain')
    .description('Fibonacci chain by cut-and-project (or its periodic approximant).')
    .requiredOption('--order <n>', 'order n: F(n+2) segments', number)
    .option('--approximant', 'one period of the approximant F(n+1)/F(n)')
    .option('--offset <x>', 'phason offset of the window (units of the short perpendicular step)', number)
    .option('--long <len>', 'long segment length in Å', number)
    .option('--ratio <r>', 'long/short length ratio (default τ)', number)
    .option('--max-points <n>', 'refuse to build more points than this', number)
    .addOption(new Option('--format <fmt>', 'xyz or json').choices(['xyz', 'json']).default('xyz'))
    .action((o: { order: number; approximant?: boolean; offset?: number; long?: number; ratio?: number; maxPoints?: number; format: 'xyz' | 'json' }, cmd: Command) => {
      generateAndEmit(
        cmd,
        { family: 'fibonacci', order: o.order, approximant: o.approximant === true, offset: o.offset, long: o.long, ratio: o.ratio, maxPoints: o.maxPoints },
        o.format,
      );
    });
}
