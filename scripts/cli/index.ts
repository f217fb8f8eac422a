/**
 * Tauforge command line: `npm run -s cli -- COMMAND [flags]`.
 * Results go to stdout; errors go to stderr with a non-zero exit code.
 * Each command registers itself from commands/<command>.ts.
 */
import { Command, CommanderError } from 'commander';
import { registerConvergents } from './commands/convergents';
import { registerChain } from './commands/chain';
import { registerTiling } from './commands/tiling';
import { registerPatch } from './commands/patch';
import { registerApproximant } from './commands/approximant';
import { registerDiffract } from './commands/diffract';
import { CliError } from './errors';

// `… | head` closes the pipe early; that is the reader's choice, not an error.
process.stdout.on('error', (err: NodeJS.ErrnoException) => {
  if (err.code === 'EPIPE') process.exit(0);
  throw err;
});

const program = new Command();
program
  .name('tauforge')
  .description('Build, check, export and diffract quasicrystal models and approximants.')
  .exitOverride()
  .configureOutput({ writeErr: (s) => process.stderr.write(s) });

registerConvergents(program);
registerChain(program);
registerTiling(program);
registerPatch(program);
registerApproximant(program);
registerDiffract(program);

async function main() {
  try {
    await program.parseAsync(process.argv);
  } catch (err) {
    if (err instanceof CommanderError) {
      process.exit(err.exitCode === 0 ? 0 : 2);
    }
    const message = err instanceof Error ? err.message : String(err);
    process.stderr.write(`error: ${message}\n`);
    process.exit(err instanceof CliError ? err.exitCode : 1);
  }
}

void main();
