import { Option, type Command } from 'commander';
import { CliError } from '../errors';
import { emit, number, parse } from '../flags';
import { convergents, GOLDEN_MEAN, SILVER_MEAN } from '../../../lib/math/convergents';
import { convergentsParamsSchema } from '../../../lib/math/convergents-params';

/** convergents: the continued-fraction table of τ or 1+√2. */
export function registerConvergents(program: Command): void {
  program
    .command('convergents')
    .description('Continued-fraction convergents p/q of the golden (tau) or silver (1+√2) mean, with errors.')
    .addOption(new Option('--of <name>', 'tau or silver').choices(['tau', 'silver']).makeOptionMandatory())
    .requiredOption('--count <n>', 'number of convergents', number)
    .addOption(new Option('--format <fmt>', 'table or json').choices(['table', 'json']).default('table'))
    .action((o: { of: string; count: number; format: 'table' | 'json' }, cmd: Command) => {
      const p = parse(convergentsParamsSchema, { of: o.of, count: o.count });
      const x = p.of === 'tau' ? GOLDEN_MEAN : p.of === 'silver' ? SILVER_MEAN : p.of;
      let rows;
      try {
        rows = convergents(x, p.count);
      } catch (err) {
        if (err instanceof RangeError) throw new CliError(err.message);
        throw err;
      }
      if (o.format === 'json') {
        const out = rows.map((r) => ({ k: r.k, a: r.a, p: r.p, q: r.q, value: r.value, error: r.error, boundOk: r.boundOk }));
        emit(cmd, JSON.stringify(out) + '\n');
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
      emit(cmd, [line(head), ...body.map(line)].join('\n') + '\n');
    });
}
