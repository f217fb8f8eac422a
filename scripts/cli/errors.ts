import type { ZodError } from 'zod';
import { zodText } from '../../lib/zod-text';

/** An error the user caused (bad flag, bad file); printed as one line, exit code 2. */
export class CliError extends Error {
  constructor(message: string, public exitCode = 2) {
    super(message);
  }
}

/** Turn a zod error into one readable line naming each bad field. */
export function zodMessage(err: ZodError): string {
  return zodText(err);
}
