/**
 * Run the Tauforge command line from tests.
 *
 * `cli()` runs the commander program in-process (scripts/cli/program.ts `runCli`) with stdout and stderr
 * captured: the same parsing, commands and exit codes as `npm run -s cli`, without starting tsx (1–2 s a
 * call). `cliProcess()` starts the real entry point as users do; keep it for the end-to-end check.
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { runCli } from '../../scripts/cli/program';

export interface CliResult {
  /** Exit code: 0 success or help, 2 bad flag or file, 1 anything else. */
  code: number;
  out: string;
  err: string;
}

const ROOT = fileURLToPath(new URL('../..', import.meta.url));

/** In-process run of `tauforge ARGS…`. */
export async function cli(args: readonly string[]): Promise<CliResult> {
  let out = '';
  let err = '';
  const code = await runCli(args, { writeOut: (t) => void (out += t), writeErr: (t) => void (err += t) });
  return { code, out, err };
}

/** `npm run -s cli -- ARGS…` in a child process, from the repository root. */
export function cliProcess(args: readonly string[]): CliResult {
  const r = spawnSync('npm', ['run', '-s', 'cli', '--', ...args], { cwd: ROOT, encoding: 'utf8', maxBuffer: 1 << 28 });
  if (r.error) throw r.error;
  return { code: r.status ?? -1, out: r.stdout, err: r.stderr };
}
