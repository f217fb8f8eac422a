/**
 * Tauforge command line: `npm run -s cli -- COMMAND [flags]`.
 * Results go to stdout; errors go to stderr with a non-zero exit code. The commands are in program.ts.
 */
import { runCli } from './program';

// `… | head` closes the pipe early; that is the reader's choice, not an error.
process.stdout.on('error', (err: NodeJS.ErrnoException) => {
  if (err.code === 'EPIPE') process.exit(0);
  throw err;
});

// On success let the process end by itself (stdout drains first); on failure stop at once.
void runCli(process.argv.slice(2)).then((code) => {
  if (code !== 0) process.exit(code);
});
