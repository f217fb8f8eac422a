/**
 * Parameters of the Fibonacci chain (generate.ts); its family id is 'fibonacci'. Each field's `.meta()`
 * carries the words a form shows for it (title, unit, description), so the schema is their one source.
 */
import { z } from 'zod';
import { maxPointsSchema } from '../point-cap';

const int = (min: number, max: number) =>
  z
    .number({ message: `must be a number` })
    .int(`must be an integer`)
    .min(min, `must be at least ${min}`)
    .max(max, `must be at most ${max}`);

export const chainParamsSchema = z.strictObject({
  /** Substitution order n: the chain has F(n+2) segments, F(n+1) long and F(n) short. */
  order: int(0, 60).meta({
    title: 'Substitution order n',
    description: 'F(n+2) segments; as an approximant the cell is F(n+1)/F(n): n = 5 gives 8/5, n = 6 gives 13/8.',
  }),
  /** Periodic approximant (τ replaced by F(n+1)/F(n)): one cell of F(n+1) L and F(n) S segments. */
  approximant: z
    .boolean({ message: 'must be true or false' })
    .meta({ title: 'Periodic approximant', description: 'One periodic cell with τ replaced by F(n+1)/F(n).' })
    .default(false),
  /** Phason offset of the window, in units of the short length's perpendicular image (see fibonacci.ts). */
  offset: z
    .number({ message: 'must be a number' })
    .min(-1000, 'must be at least -1000')
    .max(1000, 'must be at most 1000')
    .meta({
      title: 'Phason offset',
      description: 'Shifts the window in perpendicular space, in units of the short segment’s perpendicular image (the window is 1 + 1/τ long).',
    })
    .default(0),
  /** Long segment length in Å. */
  long: z
    .number({ message: 'must be a number' })
    .gt(0, 'must be positive')
    .max(1e4, 'must be at most 10000 Å')
    .meta({ title: 'Long segment', unit: 'Å' })
    .default(1),
  /** Long/short length ratio; τ by default (the ideal quasiperiodic chain). */
  ratio: z
    .number({ message: 'must be a number' })
    .gt(0, 'must be positive')
    .max(100, 'must be at most 100')
    .meta({ title: 'Long/short ratio', description: 'τ ≈ 1.618 for the ideal chain; other ratios keep the sequence and change the lengths.' })
    .default((1 + Math.sqrt(5)) / 2),
  maxPoints: maxPointsSchema,
});
export const chainModelSchema = chainParamsSchema.extend({ family: z.literal('fibonacci') });
export type ChainParams = z.infer<typeof chainModelSchema>;
export type ChainParamsInput = z.input<typeof chainModelSchema>;
