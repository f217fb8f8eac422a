import { Option, type Command } from 'commander';
import { CliError } from '../errors';
import { compute, emit, loadStructure, number } from '../flags';
import { exportFile, WRITE_FORMATS, type WriteFormat } from '../../../lib/formats/write';
import { findSpaceGroup, symmetrise } from '../../../lib/structure/symmetry';
import { ensureSymmetry } from '../../../lib/server/symmetry-wasm';

interface Flags {
  input: string;
  symprec: number;
  format: WriteFormat;
}

/**
 * symmetrise: snap a nearly symmetric cell onto the space group the finder sees at a loose tolerance (every atom
 * moved to the average of its images under the group; the cell kept). The group before (at the strict 1e-3 Å) and
 * after, and the largest move, go to standard error as '# ' lines; the snapped structure to standard output.
 */
export function registerSymmetrise(program: Command): void {
  program
    .command('symmetrise')
    .description('Snap a nearly symmetric periodic cell onto the space group found at --symprec; reports the largest move.')
    .requiredOption('--input <file>', 'structure file with a periodic cell: extended XYZ, CIF or Tauforge JSON')
    .option('--symprec <len>', 'distance tolerance in Å within which atoms count as symmetric images (default 0.01)', number, 0.01)
    .addOption(new Option('--format <fmt>', 'output format (CIF carries the space group)').choices([...WRITE_FORMATS]).default('cif'))
    .action((o: Flags, cmd: Command) => {
      if (!(o.symprec > 0) || o.symprec > 1) throw new CliError('--symprec: expected a length in Å, above 0 and at most 1');
      const s = loadStructure(o.input);
      if (!s.cell) throw new CliError('--input: symmetrise needs a periodic cell (this structure has none)');
      ensureSymmetry();
      const before = compute(() => findSpaceGroup(s));
      const out = compute(() => symmetrise(s, { symprec: o.symprec }));
      const { text, report } = compute(() => exportFile(out.structure, o.format, { cifSymmetry: 'found' }));
      const errOut = cmd.configureOutput().writeErr;
      if (errOut) {
        errOut(`# space group before: ${before.hmSymbol} (No. ${before.number}) at symprec ${before.symprec} Å\n`);
        errOut(`# snapped to ${out.spaceGroup.hmSymbol} (No. ${out.spaceGroup.number}, ${out.spaceGroup.operations.length} operations) at symprec ${o.symprec} Å; largest move ${out.maxShift.toFixed(5)} Å\n`);
        for (const w of report.warnings) if (w.severity !== 'info') errOut(`check ${w.severity}: ${w.message}\n`);
      }
      emit(cmd, text.endsWith('\n') ? text : text + '\n');
    });
}
