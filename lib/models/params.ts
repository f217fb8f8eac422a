/**
 * The Params of one model: what a project revision stores, what forms edit, what the API validates.
 * A discriminated union on `family` (and, for icosahedral models, on `mode`: a finite patch or a cubic
 * approximant) of the families' own schemas (lib/models/<family>/schema.ts). The registry
 * (lib/models/index.ts) must hold a definition for every member; the type checker fails otherwise.
 */
import { z } from 'zod';
import { plainError, zodText } from '../zod-text';
import { chainModelSchema } from './chain/schema';
import { penroseModelSchema } from './penrose/schema';
import { octagonalModelSchema } from './octagonal/schema';
import { decagonalModelSchema } from './decagonal/schema';
import { icosahedralModelSchema } from './icosahedral/schema';

const SCHEMAS = [chainModelSchema, penroseModelSchema, octagonalModelSchema, icosahedralModelSchema, decagonalModelSchema] as const;

export const FAMILIES = ['fibonacci', 'penrose', 'octagonal', 'icosahedral', 'decagonal'] as const;
export type Family = (typeof FAMILIES)[number];

export const modelParamsSchema = z.discriminatedUnion('family', SCHEMAS, { message: `family must be one of ${FAMILIES.join(', ')}` });

export type ModelParams = z.infer<typeof modelParamsSchema>;
export type ModelParamsInput = z.input<typeof modelParamsSchema>;
/** The Params of one family. */
export type ParamsOf<F extends Family> = Extract<ModelParams, { family: F }>;

/** Parse Params or throw one readable error naming every bad field. */
export function parseModelParams(input: unknown): ModelParams {
  const r = modelParamsSchema.safeParse(input, { error: plainError });
  if (!r.success) throw new Error(zodText(r.error, 'params'));
  return r.data;
}
