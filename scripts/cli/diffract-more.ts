import type { Command } from 'commander';

/** `diffract zone` (registered once zone-axis maps land). */
export function registerZoneCommand(d: Command): void {
  void d;
}

/** `diffract hyperspace` (registered once the Fourier-module engine lands). */
export function registerHyperspaceCommand(d: Command): void {
  void d;
}
