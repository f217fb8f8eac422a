import type { Command } from 'commander';

/** convergents, chain, tiling, patch, approximant — owned by the tiling engine. */
export function registerTilingCommands(program: Command): void {
  void program;
}
