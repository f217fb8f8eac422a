/**
 * The Params of one model: what a project revision stores, what forms edit, what the API validates.
 * A discriminated union on `family` (and, for icosahedral models, on `mode`: a finite patch or a cubic
 * approximant). Each family's own fields live in that engine's schema module.
 */
import { z } from 'zod';
import { zodText } from '../zod-text';
import { chainParamsSchema } from './chain';
import { planarParamsSchema } from './planar';
import { decagonalParamsSchema } from './decagonal';
import { icosahedralApproximantSchema, icosahedralPatchSchema } from './icosahedral';

export const FAMILIES = ['fibonacci', 'penrose', 'octagonal', 'icosahedral', 'decagonal'] as const;
export type Family = (typeof FAMILIES)[number];

export const fibonacciModelSchema = chainParamsSchema.extend({ family: z.literal('fibonacci') });
export const planarModelSchema = planarParamsSchema;
export const decagonalModelSchema = decagonalParamsSchema.safeExtend({ family: z.literal('decagonal') });
export const icosahedralPatchModelSchema = icosahedralPatchSchema.extend({
  family: z.literal('icosahedral'),
  mode: z.literal('patch'),
});
export const icosahedralApproximantModelSchema = icosahedralApproximantSchema.extend({
  family: z.literal('icosahedral'),
  mode: z.literal('approximant'),
});

const icosahedralModelSchema = z.discriminatedUnion('mode', [icosahedralPatchModelSchema, icosahedralApproximantModelSchema], {
  message: 'mode must be patch or approximant',
});

export const modelParamsSchema = z.discriminatedUnion(
  'family',
  [fibonacciModelSchema, planarModelSchema, decagonalModelSchema, icosahedralModelSchema],
  { message: `family must be one of ${FAMILIES.join(', ')}` },
);

export type ModelParams = z.infer<typeof modelParamsSchema>;
export type ModelParamsInput = z.input<typeof modelParamsSchema>;

/** Parse Params or throw one readable error naming every bad field. */
export function parseModelParams(input: unknown): ModelParams {
  const r = modelParamsSchema.safeParse(input);
  if (!r.success) {
    throw new Error(zodText(r.error, 'params'));
  }
  return r.data;
}
