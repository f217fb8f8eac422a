import type { ZodType } from 'zod';
import { zodText } from '../zod-text';

/**
 * Validate generator input with its zod schema; on failure throw a RangeError whose message names each
 * bad field ("order: Too big: expected number to be <=60"), so callers in a worker, the API or the CLI
 * can show it as is.
 */
export function parseParams<T>(schema: ZodType<T>, input: unknown, what: string): T {
  const r = schema.safeParse(input);
  if (r.success) return r.data;
  throw new RangeError(`${what}: ${zodText(r.error)}`);
}

/** Fail before allocating when the estimated output is larger than the caller allows. */
export function checkPointCap(estimated: number, maxPoints: number, what: string): void {
  if (estimated > maxPoints) {
    throw new RangeError(
      `maxPoints: ${what} would hold about ${Math.ceil(estimated)} points, more than maxPoints = ${maxPoints}; ` +
        'reduce the size or raise maxPoints',
    );
  }
}
