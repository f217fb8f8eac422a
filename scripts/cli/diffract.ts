import type { Command } from 'commander';

/** diffract powder | zone | at | hyperspace — owned by the diffraction engine. */
export function registerDiffractCommands(program: Command): void {
  void program;
}
