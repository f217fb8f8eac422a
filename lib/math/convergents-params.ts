/** Parameters of the continued-fraction table (convergents.ts): a preset or an explicit quadratic irrational. */
import { z } from 'zod';

const int = (min: number, max: number) =>
  z
    .number({ message: `must be a number` })
    .int(`must be an integer`)
    .min(min, `must be at least ${min}`)
    .max(max, `must be at most ${max}`);

/** x = (a + b·√d)/c; b, c non-zero; d ≥ 2 and not a perfect square. */
export const quadraticIrrationalSchema = z
  .strictObject({
    a: int(-1e9, 1e9),
    b: int(-1e9, 1e9).refine((v) => v !== 0, 'must be non-zero'),
    c: int(-1e9, 1e9).refine((v) => v !== 0, 'must be non-zero'),
    d: int(2, 1e9).refine((v) => Math.round(Math.sqrt(v)) ** 2 !== v, 'must not be a perfect square'),
  });

export const CF_PRESETS = ['tau', 'silver'] as const;
export type CfPreset = (typeof CF_PRESETS)[number];

export const convergentsParamsSchema = z.strictObject({
  /** A preset name (tau = golden mean, silver = 1+√2) or an explicit quadratic irrational. */
  of: z.union([z.enum(CF_PRESETS, { message: `must be one of ${CF_PRESETS.join(', ')} or {a,b,c,d}` }), quadraticIrrationalSchema]),
  /** 77 convergents of τ fit in doubles; the generator reports the exact limit for other numbers. */
  count: int(1, 200),
});
export type ConvergentsParams = z.infer<typeof convergentsParamsSchema>;

