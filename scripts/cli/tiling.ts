import type { Command } from 'commander';
import { CliError } from './errors';
import { format, num, parse, run, emit } from './args';
import { convergents, GOLDEN_MEAN, SILVER_MEAN } from '../../lib/tiling/continued-fraction';
import { fibonacciChain } from '../../lib/tiling/fibonacci';
import { penroseTiling } from '../../lib/tiling/penrose';
import { octagonalTiling } from '../../lib/tiling/octagonal';
import { chainParamsSchema, convergentsParamsSchema } from '../../lib/params/chain';
import { planarParamsSchema } from '../../lib/params/planar';

/** convergents, chain, tiling — the 1D/2D tiling engine. */
export function registerTilingCommands(program: Command): void {
  program
    .command('convergents')
    .description('Continued-fraction convergents p/q of the golden (tau) or silver (1+√2) mean, with errors.')
    .requiredOption('--of <name>', 'tau or silver')
    .requiredOption('--count <n>', 'number of convergents')
    .option('--format <fmt>', 'table or json', 'table')
    .action((o: { of: string; count: string; format: string }) => {
      const fmt = format(o.format, ['table', 'json']);
      const p = parse(convergentsParamsSchema, { of: o.of, count: num('--count', o.count) });
      const x = p.of === 'tau' ? GOLDEN_MEAN : p.of === 'silver' ? SILVER_MEAN : p.of;
      let rows;
      try {
        rows = convergents(x, p.count);
      } catch (err) {
        if (err instanceof RangeError) throw new CliError(err.message);
        throw err;
      }
      if (fmt === 'json') {
        const out = rows.map((r) => ({ k: r.k, a: r.a, p: r.p, q: r.q, value: r.value, error: r.error, boundOk: r.boundOk }));
        process.stdout.write(JSON.stringify(out) + '\n');
        return;
      }
      const head = ['k', 'a', 'p', 'q', 'p/q', '|x - p/q|', '< 1/q^2'];
      const body = rows.map((r) => [
        String(r.k),
        String(r.a),
        String(r.p),
        String(r.q),
        r.value.toPrecision(17),
        r.error.toExponential(6),
        r.boundOk ? 'yes' : 'no',
      ]);
      const widths = head.map((h, i) => Math.max(h.length, ...body.map((b) => b[i].length)));
      const line = (cells: string[]) => cells.map((c, i) => c.padStart(widths[i])).join('  ');
      process.stdout.write([line(head), ...body.map(line)].join('\n') + '\n');
    });

  program
    .command('chain')
    .description('Fibonacci chain by cut-and-project (or its periodic approximant).')
    .requiredOption('--order <n>', 'order n: F(n+2) segments')
    .option('--approximant', 'one period of the approximant F(n+1)/F(n)')
    .option('--offset <x>', 'phason offset of the window (units of the short perpendicular step)')
    .option('--long <len>', 'long segment length in Å')
    .option('--ratio <r>', 'long/short length ratio (default τ)')
    .option('--max-points <n>', 'refuse to build more points than this')
    .option('--format <fmt>', 'xyz or json', 'xyz')
    .action((o: Record<string, string | boolean | undefined>) => {
      const fmt = format(String(o.format), ['xyz', 'json'] as const);
      const p = parse(chainParamsSchema, {
        order: num('--order', o.order as string),
        approximant: o.approximant === true,
        offset: num('--offset', o.offset as string | undefined),
        long: num('--long', o.long as string | undefined),
        ratio: num('--ratio', o.ratio as string | undefined),
        maxPoints: num('--max-points', o.maxPoints as string | undefined),
      });
      emit(run(() => fibonacciChain(p)), fmt);
    });

  program
    .command('tiling')
    .description('Penrose rhombus or Ammann–Beenker tiling vertices (patch by radius, or one approximant cell).')
    .requiredOption('--family <name>', 'penrose or octagonal')
    .option('--radius <r>', 'patch radius in Å (tiles whose centre lies within it)')
    .option('--edge <len>', 'rhombus edge length in Å', '1')
    .option('--approximant <p/q>', 'periodic approximant: a convergent p/q of τ (penrose) or 1+√2 (octagonal)')
    .option('--max-points <n>', 'refuse to build more points than this')
    .option('--format <fmt>', 'xyz or json', 'xyz')
    .action((o: Record<string, string | undefined>) => {
      const fmt = format(String(o.format), ['xyz', 'json'] as const);
      if (o.family !== 'penrose' && o.family !== 'octagonal') {
        throw new CliError(`--family: must be penrose or octagonal, got "${o.family}"`);
      }
      let approximant: { p: number; q: number } | undefined;
      if (o.approximant !== undefined) {
        const m = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(o.approximant);
        if (!m) throw new CliError(`--approximant: expected P/Q such as 3/2, got "${o.approximant}"`);
        approximant = { p: Number(m[1]), q: Number(m[2]) };
      }
      if (approximant === undefined && o.radius === undefined) {
        throw new CliError('--radius: required unless --approximant is given');
      }
      const p = parse(planarParamsSchema, {
        family: o.family,
        radius: num('--radius', o.radius),
        edge: num('--edge', o.edge),
        approximant,
        maxPoints: num('--max-points', o.maxPoints),
      });
      const { family, ...rest } = p;
      emit(run(() => (family === 'penrose' ? penroseTiling(rest) : octagonalTiling(rest))), fmt);
    });
}
