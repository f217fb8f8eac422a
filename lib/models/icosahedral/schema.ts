/** Params of icosahedral patches (patch.ts) and cubic approximants (approximant.ts), told apart by `mode`. */
import { z } from 'zod';
import { decorationSchema } from './decoration-schema';
import { elementSymbolSchema } from '../element-schema';
import { maxPointsSchema } from '../point-cap';

const finite = z.number().refine(Number.isFinite, { message: 'must be a finite number' });
const vec3 = z.tuple([finite, finite, finite]);

/** Phason offset: a shift of the window in perpendicular space, Å, each component |x| ≤ 100. */
const offset = vec3.refine((v) => v.every((x) => Math.abs(x) <= 100), { message: 'each component must be within ±100 Å' }).default([0, 0, 0]);

const common = {
  /** Quasilattice constant: edge of the rhombohedra, Å. */
  aR: z.number().positive().max(50),
  lattice: z.enum(['P', 'F', 'I'], { message: 'lattice must be P, F or I' }).default('P'),
  offset,
  /** Element for the plain vertices (ignored when a decoration is given). */
  species: elementSymbolSchema.optional(),
  maxPoints: maxPointsSchema,
  decoration: decorationSchema.optional(),
};

export const icosahedralPatchSchema = z.object({
  family: z.literal('icosahedral').default('icosahedral'),
  ...common,
  /** Ball radius, Å. */
  radius: z.number().positive().max(10_000),
  centre: vec3.default([0, 0, 0]),
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
  .regex(/^\d{1,6}\/\d{1,6}$/, { message: 'must look like P/Q, e.g. 3/2' })
  .refine((s) => {
    const { p, q } = parseOrder(s);
    return isFibonacciOrder(p, q);
  }, { message: 'must be a ratio of consecutive Fibonacci numbers: 1/1, 2/1, 3/2, 5/3, 8/5, 13/8, 21/13, 34/21, …' });

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
