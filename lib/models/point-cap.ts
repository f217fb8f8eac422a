/**
 * The point cap every model takes: the largest number of points a caller allows a cut to hold, checked
 * against the model's estimate before anything is allocated (and again on the real count).
 */
import { z } from 'zod';

export const DEFAULT_MAX_POINTS = 2_000_000;
/** Upper bound users may raise maxPoints to (memory guard). */
export const MAX_POINTS_LIMIT = 50_000_000;

export const maxPointsSchema = z
  .number()
  .int('must be an integer')
  .min(1, 'must be at least 1')
  .max(MAX_POINTS_LIMIT, `must be at most ${MAX_POINTS_LIMIT.toLocaleString('en-US')}`)
  .meta({ title: 'Point cap', unit: 'points', description: 'The cut stops with a message before it would hold more points than this.' })
  .default(DEFAULT_MAX_POINTS);

/** Fail before allocating when the estimated output is larger than the caller allows. */
export function checkPointCap(estimated: number, maxPoints: number, what: string): void {
  if (estimated > maxPoints) {
    const n = (x: number) => Math.round(x).toLocaleString('en-US');
    throw new RangeError(`maxPoints: ${what} would hold about ${n(estimated)} points, more than the cap of ${n(maxPoints)}; lower the size or raise the point cap (maxPoints)`);
  }
}
