import type { Command } from 'commander';
import { registerDiffractPowder } from './diffract-powder';
import { registerDiffractAt } from './diffract-at';
import { registerDiffractZone } from './diffract-zone';
import { registerDiffractHyperspace } from './diffract-hyperspace';
import { registerDiffractCompare } from './diffract-compare';
import { registerDiffractIndex } from './diffract-index';

/** diffract powder | at | zone | hyperspace (+ qc-powder) | compare | index. */
export function registerDiffract(program: Command): void {
  const d = program.command('diffract').description('Simulate diffraction of a structure file or an ideal quasicrystal.');
  registerDiffractPowder(d);
  registerDiffractAt(d);
  registerDiffractZone(d);
  registerDiffractHyperspace(d);
  registerDiffractCompare(d);
  registerDiffractIndex(d);
}
