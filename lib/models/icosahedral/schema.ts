/** Params of icosahedral patches (patch.ts) and cubic approximants (approximant.ts), told apart by `mode`. */
import { z } from 'zod';
import { decorationSchema } from './decoration-schema';
import { elementSymbolSchema } from '../element-schema';
import { maxPointsSchema } from '../point-cap';

const finite = z.number().refine(Number.isFinite, { message: 'must be a finite number' });
const vec3 = z.tuple([finite, finite, finite]);

/**
 * Phason offset: a shift of the window in perpendicular space, Å, each component |x| ≤ 100, measured from
 * the symmetric position (approximants: the m-3-fixed window centre of approximant.ts; patches: the
 * origin), so (0, 0, 0) keeps the full point group. Approximant offsets are reduced modulo the
 * perpendicular periods.
 */
const offset = vec3
  .refine((v) => v.every((x) => Math.abs(x) <= 100), { message: 'each component must be within ±100 Å' })
  .meta({ title: 'Phason offset', unit: 'Å, perp. space', description: 'Shifts the occupation domain in perpendicular space from its symmetric position; (0, 0, 0) keeps the full symmetry, other values can lower it.' })
  .default([0, 0, 0]);

const common = {
  /** Quasilattice constant: edge of the rhombohedra, Å. */
  aR: z
    .number()
    .positive()
    .max(50)
    .meta({ title: 'Rhombohedron edge a_R', unit: 'Å', description: 'Quasilattice constant; the edge of both rhombohedra.', examples: [4.6] }),
  lattice: z
    .enum(['P', 'F', 'I'], { message: 'must be P, F or I' })
    .meta({
      title: 'Hyperlattice type',
      description: 'The 6D lattice the cut is taken from.',
      optionLabels: { P: 'P — simple', F: 'F — face-centred', I: 'I — body-centred' },
    })
    .default('P'),
  offset,
  /** Element for the plain vertices (ignored when a decoration is given). */
  species: elementSymbolSchema.meta({ title: 'Species', description: 'Element on every vertex when there is no decoration, e.g. Al.' }).optional(),
  maxPoints: maxPointsSchema,
  decoration: decorationSchema.optional(),
};

export const icosahedralPatchSchema = z.object({
  family: z.literal('icosahedral').default('icosahedral'),
  ...common,
  /** Ball radius, Å. */
  radius: z.number().positive().max(10_000).meta({ title: 'Patch radius', unit: 'Å', description: 'Points within this distance of the centre.', examples: [15] }),
  centre: vec3.meta({ title: 'Patch centre', unit: 'Å' }).default([0, 0, 0]),
});

/** True when p/q = F(n+1)/F(n) with F(1) = F(2) = 1 (OEIS A000045). */
export function isFibonacciOrder(p: number, q: number): boolean {
  let a = 1;
  let b = 1;
  while (a <= q) {
    if (a === q && b === p) return true;
    [a, b] = [b, a + b];
  }
  return false;
}

export function parseOrder(order: string): { p: number; q: number } {
  const [p, q] = order.split('/').map(Number);
  return { p, q };
}

export const approximantOrderSchema = z
  .string()
  .regex(/^\d{1,6}\/\d{1,6}$/, { message: 'must look like p/q, e.g. 3/2' })
  .refine((s) => {
    const { p, q } = parseOrder(s);
    return isFibonacciOrder(p, q);
  }, { message: 'must be a ratio of consecutive Fibonacci numbers: 1/1, 2/1, 3/2, 5/3, 8/5, 13/8, 21/13, 34/21, …' })
  .meta({ title: 'Order p/q', description: 'Consecutive Fibonacci numbers: 1/1, 2/1, 3/2, 5/3, 8/5 …', examples: ['2/1'] });

export const icosahedralApproximantSchema = z.object({
  family: z.literal('icosahedral').default('icosahedral'),
  ...common,
  order: approximantOrderSchema,
});

export const icosahedralPatchModelSchema = icosahedralPatchSchema.extend({ family: z.literal('icosahedral'), mode: z.literal('patch') });
export const icosahedralApproximantModelSchema = icosahedralApproximantSchema.extend({
  family: z.literal('icosahedral'),
  mode: z.literal('approximant'),
});
export const icosahedralModelSchema = z.discriminatedUnion('mode', [icosahedralPatchModelSchema, icosahedralApproximantModelSchema], {
  message: 'mode must be patch or approximant',
});

export type IcosahedralPatchParams = z.infer<typeof icosahedralPatchModelSchema>;
export type IcosahedralApproximantParams = z.infer<typeof icosahedralApproximantModelSchema>;
export type IcosahedralParams = z.infer<typeof icosahedralModelSchema>;
