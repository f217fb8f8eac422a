/** Parameters of the decagonal model (generate.ts): Penrose rhombus layers stacked along c. */
import { z } from 'zod';
import { maxPointsSchema } from '../point-cap';
import { elementSymbolSchema } from '../element-schema';
import { convergents, GOLDEN_MEAN } from '../../math/convergents';

const TAU_CONVERGENTS = convergents(GOLDEN_MEAN, 30);

export const decagonalModelSchema = z
  .strictObject({
    family: z.literal('decagonal'),
    /** In-plane patch radius in Å (quasiperiodic model). */
    radius: z.number({ message: 'must be a number' }).gt(0, 'must be positive').max(1e5, 'must be at most 100000 Å').optional(),
    /** Periodic approximant: τ replaced by the convergent p/q in every layer. */
    approximant: z
      .strictObject({
        p: z.number().int('must be an integer').min(1, 'must be at least 1'),
        q: z.number().int('must be an integer').min(1, 'must be at least 1'),
      })
      .optional(),
    /** Rhombus edge in Å. Default 2.45 Å, a typical decagonal Al–Ni–Co value (from memory). */
    edge: z.number({ message: 'must be a number' }).gt(0, 'must be positive').max(1000, 'must be at most 1000 Å').default(2.45),
    /** Layers per period along c. Default 2 (the common two-layer stacking). */
    layers: z.number({ message: 'must be a number' }).int('must be an integer').min(1, 'must be at least 1').max(1000, 'must be at most 1000').default(2),
    /** Layer spacing in Å. Default 2.04 Å (half of c ≈ 4.08 Å in d-Al–Ni–Co, from memory). */
    spacing: z.number({ message: 'must be a number' }).gt(0, 'must be positive').max(1000, 'must be at most 1000 Å').default(2.04),
    /** In-plane shift of each layer relative to the one below, in Å. */
    shift: z
      .tuple([
        z.number({ message: 'must be a number' }).min(-1000, 'must be at least -1000').max(1000, 'must be at most 1000'),
        z.number({ message: 'must be a number' }).min(-1000, 'must be at least -1000').max(1000, 'must be at most 1000'),
      ])
      .default([0, 0]),
    /** Pentagrid offsets γ_j of the layer tiling (5 entries, default 0). */
    gamma: z
      .array(z.number({ message: 'must be a number' }).min(-100, 'must be at least -100').max(100, 'must be at most 100'))
      .length(5, 'must have 5 entries')
      .optional(),
    /** Element for every vertex (default: unassigned, written X). */
    species: elementSymbolSchema.optional(),
    maxPoints: maxPointsSchema,
  })
  .superRefine((v, ctx) => {
    if (v.radius === undefined && v.approximant === undefined) {
      ctx.addIssue({ code: 'custom', path: ['radius'], message: 'required unless an approximant is asked for' });
    }
    if (v.approximant && !TAU_CONVERGENTS.some((c) => c.p === v.approximant!.p && c.q === v.approximant!.q)) {
      ctx.addIssue({
        code: 'custom',
        path: ['approximant'],
        message: `${v.approximant.p}/${v.approximant.q} is not a convergent of τ (F(n+1)/F(n)); use one of 1/1, 2/1, 3/2, 5/3, …`,
      });
    }
  });
export type DecagonalParams = z.infer<typeof decagonalModelSchema>;
