/**
 * The command tree and one run of it, apart from the process: index.ts runs it on process.argv with
 * process.stdout/stderr, tests run it in-process with buffers (tests/helpers/cli.ts).
 * Each command registers itself from commands/<command>.ts and writes its result through commander's
 * writeOut (flags.ts `emit`), so whatever receives help text also receives results.
 */
import { Command, CommanderError } from 'commander';
import { registerConvergents } from './commands/convergents';
import { registerChain } from './commands/chain';
import { registerTiling } from './commands/tiling';
import { registerPatch } from './commands/patch';
import { registerApproximant } from './commands/approximant';
import { registerDiffract } from './commands/diffract';
import { registerCheck } from './commands/check';
import { registerSymmetrise } from './commands/symmetrise';
import { CliError } from './errors';

/** Where a run's standard output and standard error go. */
export interface CliOutput {
  writeOut(text: string): void;
  writeErr(text: string): void;
}

export const processOutput: CliOutput = {
  writeOut: (text) => void process.stdout.write(text),
  writeErr: (text) => void process.stderr.write(text),
};

/**
 * A fresh program (commander keeps parsed values on the commands, so build one per run). exitOverride
 * and the output are set before the commands are added: subcommands copy both when they are created.
 */
export function buildProgram(output: CliOutput = processOutput): Command {
  const program = new Command();
  program
    .name('tauforge')
    .description('Build, check, export and diffract quasicrystal models and approximants.')
    .exitOverride()
    .configureOutput({ writeOut: output.writeOut, writeErr: output.writeErr });
  registerConvergents(program);
  registerChain(program);
  registerTiling(program);
  registerPatch(program);
  registerApproximant(program);
  registerDiffract(program);
  registerCheck(program);
  registerSymmetrise(program);
  return program;
}

/**
 * Run one command line (the user's arguments, without node and the script) and return the exit code:
 * 0 on success or help, 2 for a bad flag or file (commander's own errors and CliError), 1 otherwise.
 */
export async function runCli(args: readonly string[], output: CliOutput = processOutput): Promise<number> {
  const program = buildProgram(output);
  try {
    await program.parseAsync([...args], { from: 'user' });
    return 0;
  } catch (err) {
    // commander has already printed its message (usage errors, or the help text with exit code 0).
    if (err instanceof CommanderError) return err.exitCode === 0 ? 0 : 2;
    const message = err instanceof Error ? err.message : String(err);
    output.writeErr(`error: ${message}\n`);
    return err instanceof CliError ? err.exitCode : 1;
  }
}
