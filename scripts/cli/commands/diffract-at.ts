import type { Command } from 'commander';
import { CliError } from '../errors';
import { compute, emit, loadStructure, radiationOption, readText } from '../flags';
import type { Radiation } from '../../../lib/diffraction/form-factors';
import { intensityAt } from '../../../lib/diffraction/intensity-at';

interface AtFlags {
  input: string;
  qFile: string;
  radiation: Radiation;
}

function atCommand(o: AtFlags, cmd: Command): void {
  const s = loadStructure(o.input);
  const text = readText(o.qFile, '--q-file');
  const q: number[] = [];
  text.split(/\r\n|\r|\n/).forEach((line, i) => {
    const t = line.trim();
    if (t === '' || t.startsWith('#')) return;
    const parts = t.split(/[\s,]+/);
    const v = parts.map(Number);
    if (parts.length !== 3 || !v.every(Number.isFinite)) {
      throw new CliError(`--q-file line ${i + 1}: expected three numbers "qx qy qz" (Å⁻¹), got "${t}"`);
    }
    q.push(v[0], v[1], v[2]);
  });
  const out = compute(() => intensityAt(s, Float64Array.from(q), o.radiation));
  emit(cmd, Array.from(out, (x) => x.toPrecision(12)).join('\n') + (out.length ? '\n' : ''));
}

/** diffract at: |F(Q)|²/N at given Q. */
export function registerDiffractAt(d: Command): void {
  d.command('at')
    .description('|F(Q)|²/N at each Cartesian Q (Å⁻¹, phase Q·r) of a file with one "qx qy qz" a line.')
    .requiredOption('--input <file>', 'structure file')
    .requiredOption('--q-file <file>', 'file of qx qy qz lines')
    .addOption(radiationOption('xray'))
    .action((o: AtFlags, cmd: Command) => atCommand(o, cmd));
}
