/**
 * Parameters shared by the planar rhombus tilings (penrose/, octagonal/): a round patch or one periodic
 * approximant cell of a convergent p/q of the tiling's irrational (τ or 1+√2).
 */
import { z } from 'zod';
import { maxPointsSchema } from '../point-cap';
import { convergents, type QuadraticIrrational } from '../../math/convergents';

/** Largest convergent index offered (cells grow like τ^(2k) or (1+√2)^(2k)). */
const MAX_CONVERGENTS = 30;

/** What a planar family tells the shared schema: its id, grid size, irrational and how to name it. */
export interface PlanarFamilySpec<F extends string> {
  family: F;
  /** Grid directions (5 Penrose, 4 Ammann–Beenker): the number of γ offsets. */
  directions: number;
  irrational: QuadraticIrrational;
  /** "τ (F(n+1)/F(n))" — how the convergent error names the irrational. */
  irrationalName: string;
  /**
   * Smallest denominator that still gives a valid (non-overlapping) approximant: below it the rational
   * perpendicular map reverses the order of the grid directions (found by the tile-area test in the tests).
   */
  minQ: number;
}

/** The approximants a planar family offers: its convergents with q ≥ minQ. */
export function planarConvergents(spec: PlanarFamilySpec<string>) {
  return convergents(spec.irrational, MAX_CONVERGENTS).filter((c) => c.q >= spec.minQ);
}

export function planarSchema<F extends string>(spec: PlanarFamilySpec<F>) {
  const list = planarConvergents(spec);
  const first = list.slice(0, 5).map((c) => `${c.p}/${c.q}`).join(', ');
  // The cell a form offers first: the smallest convergent that is more than one tile across.
  const small = list.find((c) => c.p >= 2) ?? list[0];
  return z
    .strictObject({
      family: z.literal(spec.family),
      /** Patch radius in Å: tiles whose centre lies within it (quasiperiodic patches). */
      radius: z
        .number({ message: 'must be a number' })
        .gt(0, 'must be positive')
        .max(1e5, 'must be at most 100000 Å')
        .meta({ title: 'Patch radius', unit: 'Å', description: 'Tiles whose centre lies within this distance of the origin.', examples: [10] })
        .optional(),
      /** Rhombus edge length in Å. */
      edge: z.number({ message: 'must be a number' }).gt(0, 'must be positive').max(1000, 'must be at most 1000 Å').meta({ title: 'Edge length', unit: 'Å' }).default(1),
      /** Periodic approximant: the irrational replaced by the convergent p/q. */
      approximant: z
        .strictObject({
          p: z.number().int('must be an integer').min(1, 'must be at least 1').meta({ title: 'p' }),
          q: z.number().int('must be an integer').min(1, 'must be at least 1').meta({ title: 'q' }),
        })
        .meta({ title: 'Periodic approximant', description: `Order p/q, a convergent of ${spec.irrationalName}: ${first} …`, examples: [{ p: small.p, q: small.q }] })
        .optional(),
      /** Grid offsets γ_j (one per direction); Σγ = 0 gives the Penrose tiling proper. Default 0. */
      gamma: z
        .array(z.number({ message: 'must be a number' }).min(-100, 'must be at least -100').max(100, 'must be at most 100'))
        .meta({ title: 'Grid offsets γ', description: `${spec.directions} numbers, one per grid direction; Σγ = 0 gives the tiling proper.`, examples: [Array(spec.directions).fill(0)] })
        .optional(),
      maxPoints: maxPointsSchema,
    })
    .superRefine((v, ctx) => {
      if (v.radius === undefined && v.approximant === undefined) {
        ctx.addIssue({ code: 'custom', path: ['radius'], message: 'required unless an approximant is asked for' });
      }
      const n = spec.directions;
      if (v.gamma !== undefined && v.gamma.length !== n) {
        ctx.addIssue({ code: 'custom', path: ['gamma'], message: `must have ${n} entries for ${spec.family}, got ${v.gamma.length}` });
      }
      if (v.approximant) {
        const { p, q } = v.approximant;
        if (!list.some((c) => c.p === p && c.q === q)) {
          const eg = list.slice(0, 4).map((c) => `${c.p}/${c.q}`).join(', ');
          ctx.addIssue({ code: 'custom', path: ['approximant'], message: `${p}/${q} is not a convergent of ${spec.irrationalName}; use one of ${eg}, …` });
        }
      }
    })
    .meta({ examples: [{ family: spec.family, radius: 10, edge: 1 }] });
}

export type PlanarParams = z.infer<ReturnType<typeof planarSchema<string>>>;
