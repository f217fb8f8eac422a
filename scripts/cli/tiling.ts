import type { Command } from 'commander';

/** convergents, chain, tiling — owned by the 1D/2D tiling engine. */
export function registerTilingCommands(program: Command): void {
  void program;
}
