/**
 * Parameters of the planar rhombus tilings (lib/tiling/penrose.ts, lib/tiling/octagonal.ts).
 */
import { z } from 'zod';
import { maxPointsSchema } from './chain';
import { convergents, GOLDEN_MEAN, SILVER_MEAN } from '../tiling/continued-fraction';

export const PLANAR_FAMILIES = ['penrose', 'octagonal'] as const;
export type PlanarFamily = (typeof PLANAR_FAMILIES)[number];

/**
 * Smallest denominators that still give a valid (non-overlapping) approximant: below them the rational
 * perpendicular map reverses the order of the grid directions (found by the tile-area test in
 * tests/unit/tiling-1d2d-planar.test.ts).
 */
export const MIN_APPROXIMANT_Q: Record<PlanarFamily, number> = { penrose: 1, octagonal: 1 };
/** Largest convergent index offered (cells grow like τ^(2k) or (1+√2)^(2k)). */
const MAX_CONVERGENTS = 30;

const convergentList = (family: PlanarFamily) =>
  convergents(family === 'penrose' ? GOLDEN_MEAN : SILVER_MEAN, MAX_CONVERGENTS).filter(
    (c) => c.q >= MIN_APPROXIMANT_Q[family],
  );

export const planarParamsSchema = z
  .strictObject({
    family: z.enum(PLANAR_FAMILIES, { message: `must be one of ${PLANAR_FAMILIES.join(', ')}` }),
    /** Patch radius in Å: tiles whose centre lies within it (quasiperiodic patches). */
    radius: z.number({ message: 'must be a number' }).gt(0, 'must be positive').max(1e5, 'must be at most 100000 Å').optional(),
    /** Rhombus edge length in Å. */
    edge: z.number({ message: 'must be a number' }).gt(0, 'must be positive').max(1000, 'must be at most 1000 Å').default(1),
    /** Periodic approximant: τ (penrose) or 1+√2 (octagonal) replaced by the convergent p/q. */
    approximant: z
      .strictObject({
        p: z.number().int('must be an integer').min(1, 'must be at least 1'),
        q: z.number().int('must be an integer').min(1, 'must be at least 1'),
      })
      .optional(),
    /** Grid offsets γ_j (5 for penrose, 4 for octagonal); Σγ = 0 gives the Penrose tiling proper. Default 0. */
    gamma: z.array(z.number({ message: 'must be a number' }).min(-100, 'must be at least -100').max(100, 'must be at most 100')).optional(),
    maxPoints: maxPointsSchema,
  })
  .superRefine((v, ctx) => {
    if (v.radius === undefined && v.approximant === undefined) {
      ctx.addIssue({ code: 'custom', path: ['radius'], message: 'required unless an approximant is asked for' });
    }
    const n = v.family === 'penrose' ? 5 : 4;
    if (v.gamma !== undefined && v.gamma.length !== n) {
      ctx.addIssue({ code: 'custom', path: ['gamma'], message: `must have ${n} entries for ${v.family}, got ${v.gamma.length}` });
    }
    if (v.approximant) {
      const list = convergentList(v.family);
      const { p, q } = v.approximant;
      if (!list.some((c) => c.p === p && c.q === q)) {
        const what = v.family === 'penrose' ? 'τ (F(n+1)/F(n))' : '1+√2 (Pell ratios)';
        const eg = list.slice(0, 4).map((c) => `${c.p}/${c.q}`).join(', ');
        ctx.addIssue({
          code: 'custom',
          path: ['approximant'],
          message: `${p}/${q} is not a convergent of ${what}; use one of ${eg}, …`,
        });
      }
    }
  });
export type PlanarParams = z.infer<typeof planarParamsSchema>;
export type PlanarParamsInput = z.input<typeof planarParamsSchema>;
