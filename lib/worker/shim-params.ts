/**
 * TEMPORARY (workspace shim, remove when lib/params has the icosahedral schema and lib/generate.ts lands):
 * a model-params schema the workspace can run against. It follows the engines' spec types
 * (lib/tiling/approximant.ts, icosahedral.ts, fibonacci.ts) field for field.
 */
import { z } from 'zod';
import { chainParamsSchema } from '../params/chain';

const num = (what: string) => z.number({ message: `${what} must be a number` });

const windowSchema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('hypercube'), scale: num('scale').gt(0, 'scale must be positive').max(4, 'scale must be at most 4') }),
  z.strictObject({ kind: z.literal('sphere'), radius: num('radius').gt(0, 'radius must be positive (Å)').max(100, 'radius must be at most 100 Å') }),
  z.strictObject({
    kind: z.literal('shell'),
    r1: num('r1').min(0, 'r1 must be ≥ 0 (Å)'),
    r2: num('r2').gt(0, 'r2 must be positive (Å)').max(100, 'r2 must be at most 100 Å'),
  }),
]);

export const shimSiteClassSchema = z.strictObject({
  name: z.string().min(1, 'name must not be empty').max(40, 'name must be at most 40 characters'),
  position: z.array(num('position')).length(6, 'position must have 6 coordinates'),
  window: windowSchema,
  species: z.number().int('species must be an atomic number').min(0, 'species must be ≥ 0').max(98, 'species must be ≤ 98'),
  occupancy: num('occupancy').min(0, 'occupancy must be between 0 and 1').max(1, 'occupancy must be between 0 and 1').default(1),
});

export const shimIcosahedralSchema = z.strictObject({
  family: z.literal('icosahedral'),
  lattice: z.enum(['P', 'F', 'I'], { message: 'lattice must be P, F or I' }).default('P'),
  kind: z.enum(['approximant', 'patch'], { message: 'kind must be approximant or patch' }).default('approximant'),
  p: z.number().int('p must be an integer').min(1, 'p must be at least 1').max(89, 'p must be at most 89').default(2),
  q: z.number().int('q must be an integer').min(1, 'q must be at least 1').max(55, 'q must be at most 55').default(1),
  radius: num('radius').gt(0, 'radius must be positive (Å)').max(200, 'radius must be at most 200 Å').default(12),
  aR: num('aR').gt(0, 'aR must be a positive length in Å').max(100, 'aR must be at most 100 Å').default(4.6),
  offset: z.array(num('offset')).length(3, 'offset must have 3 components').default([0, 0, 0]),
  windowScale: num('windowScale').gt(0, 'windowScale must be positive').max(4, 'windowScale must be at most 4').default(1),
  classes: z.array(shimSiteClassSchema).max(16, 'at most 16 site classes').default([]),
  maxPoints: z.number().int().min(1).max(50_000_000).default(2_000_000),
});

export const shimChainSchema = chainParamsSchema.extend({ family: z.literal('fibonacci') });

export const shimModelSchema = z.discriminatedUnion('family', [shimIcosahedralSchema, shimChainSchema]);
export type ShimModelParams = z.infer<typeof shimModelSchema>;
