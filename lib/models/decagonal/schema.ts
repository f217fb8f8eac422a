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
    radius: z
      .number({ message: 'must be a number' })
      .gt(0, 'must be positive')
      .max(1e5, 'must be at most 100000 Å')
      .meta({ title: 'Patch radius', unit: 'Å', description: 'In-plane radius of each layer’s Penrose patch.', examples: [8] })
      .optional(),
    /** Periodic approximant: τ replaced by the convergent p/q in every layer. */
    approximant: z
      .strictObject({
        p: z.number().int('must be an integer').min(1, 'must be at least 1').meta({ title: 'p' }),
        q: z.number().int('must be an integer').min(1, 'must be at least 1').meta({ title: 'q' }),
      })
      .meta({
        title: 'Periodic approximant',
        description: `Order p/q of every layer, a convergent of τ: ${TAU_CONVERGENTS.slice(0, 5).map((c) => `${c.p}/${c.q}`).join(', ')} …`,
        examples: [{ p: 2, q: 1 }],
      })
      .optional(),
    /** Rhombus edge in Å. Default 2.45 Å, a typical decagonal Al–Ni–Co value (from memory). */
    edge: z.number({ message: 'must be a number' }).gt(0, 'must be positive').max(1000, 'must be at most 1000 Å').meta({ title: 'Edge length', unit: 'Å' }).default(2.45),
    /** Layers per period along c. Default 2 (the two-layer 10₅ period of d-Al–Ni–Co). */
    layers: z
      .number({ message: 'must be a number' })
      .int('must be an integer')
      .min(1, 'must be at least 1')
      .max(1000, 'must be at most 1000')
      .meta({ title: 'Layers per period', description: 'Penrose layers in one period along the tenfold axis.' })
      .default(2),
    /** Layer spacing in Å. Default 2.04 Å (half of c ≈ 4.08 Å in d-Al–Ni–Co, from memory). */
    spacing: z
      .number({ message: 'must be a number' })
      .gt(0, 'must be positive')
      .max(1000, 'must be at most 1000 Å')
      .meta({ title: 'Layer spacing', unit: 'Å', description: 'Distance between neighbouring layers along the tenfold axis.' })
      .default(2.04),
    /** In-plane shift of each layer relative to the one below, in Å. */
    shift: z
      .tuple([
        z.number({ message: 'must be a number' }).min(-1000, 'must be at least -1000').max(1000, 'must be at most 1000'),
        z.number({ message: 'must be a number' }).min(-1000, 'must be at least -1000').max(1000, 'must be at most 1000'),
      ])
      .meta({ title: 'Layer shift', unit: 'Å', description: 'How far each layer sits sideways (x, y) from the one below.' })
      .default([0, 0]),
    /**
     * How the layers of one period are related. 'screw' (default): every other layer is the layer turned by
     * 36° about the tenfold axis — for the Penrose vertex set, the layer inverted through the axis with its
     * perpendicular window inverted — the 10₅ screw axis of the decagonal phases, period two layers.
     * 'translation': identical layers, each moved by the shift.
     */
    stacking: z
      .enum(['screw', 'translation'], { message: 'must be screw or translation' })
      .meta({
        title: 'Stacking',
        description: 'How neighbouring layers are related along the tenfold axis.',
        optionLabels: { screw: '10₅ screw: every other layer turned by 36°', translation: 'identical layers, shifted' },
      })
      .default('screw'),
    /** Pentagrid offsets γ_j of the layer tiling (5 entries, default 0). */
    gamma: z
      .array(z.number({ message: 'must be a number' }).min(-100, 'must be at least -100').max(100, 'must be at most 100'))
      .length(5, 'must have 5 entries')
      .meta({ title: 'Grid offsets γ', description: '5 numbers, one per grid direction; Σγ = 0 gives the tiling proper.', examples: [[0, 0, 0, 0, 0]] })
      .optional(),
    /** Element for every vertex (default: unassigned, written X). */
    species: elementSymbolSchema.meta({ title: 'Species', description: 'Element on every vertex; empty leaves them unassigned (written X).' }).optional(),
    maxPoints: maxPointsSchema,
  })
  .superRefine((v, ctx) => {
    if (v.stacking === 'screw' && v.layers % 2 !== 0) {
      ctx.addIssue({ code: 'custom', path: ['layers'], message: `the 10₅ screw stacking repeats after two layers, so layers per period must be even (got ${v.layers}); use stacking "translation" for an odd count` });
    }
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
