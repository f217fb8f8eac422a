import type { Command } from 'commander';

/** patch, approximant — owned by the icosahedral engine (decagonal approximants call lib/tiling/decagonal). */
export function registerSolidCommands(program: Command): void {
  void program;
}
