/**
 * Parameters of the continued-fraction table and of the Fibonacci chain (lib/tiling/fibonacci.ts).
 */
import { z } from 'zod';

export const DEFAULT_MAX_POINTS = 2_000_000;
/** Upper bound users may raise maxPoints to (memory guard). */
export const MAX_POINTS_LIMIT = 50_000_000;

export const maxPointsSchema = z
  .number()
  .int('must be an integer')
  .min(1, 'must be at least 1')
  .max(MAX_POINTS_LIMIT, `must be at most ${MAX_POINTS_LIMIT}`)
  .default(DEFAULT_MAX_POINTS);

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

export const chainParamsSchema = z.strictObject({
  /** Substitution order n: the chain has F(n+2) segments, F(n+1) long and F(n) short. */
  order: int(0, 60),
  /** Periodic approximant (τ replaced by F(n+1)/F(n)): one cell of F(n+1) L and F(n) S segments. */
  approximant: z.boolean({ message: 'must be true or false' }).default(false),
  /** Phason offset of the window, in units of the short length's perpendicular image (see fibonacci.ts). */
  offset: z
    .number({ message: 'must be a number' })
    .min(-1000, 'must be at least -1000')
    .max(1000, 'must be at most 1000')
    .default(0),
  /** Long segment length in Å. */
  long: z
    .number({ message: 'must be a number' })
    .gt(0, 'must be positive')
    .max(1e4, 'must be at most 10000 Å')
    .default(1),
  /** Long/short length ratio; τ by default (the ideal quasiperiodic chain). */
  ratio: z
    .number({ message: 'must be a number' })
    .gt(0, 'must be positive')
    .max(100, 'must be at most 100')
    .default((1 + Math.sqrt(5)) / 2),
  maxPoints: maxPointsSchema,
});
export type ChainParams = z.infer<typeof chainParamsSchema>;
export type ChainParamsInput = z.input<typeof chainParamsSchema>;
