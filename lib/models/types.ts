/** What a model family gives the registry (lib/models/index.ts). */
import type { z } from 'zod';
import type { Structure } from '../structure/types';

export interface ModelDefinition<P extends { family: string }> {
  family: P['family'];
  /** The family's schema; generate() validates with the union of all of them, once. */
  schema: z.ZodType<P>;
  /** Validated Params → Structure. Never validates again. */
  generate(params: P): Structure;
  /** Expected number of points (density × volume) for the forms and the point cap, before any allocation. */
  estimate(params: P): number;
}
