/**
 * The Params of one model: what a project revision stores, what forms edit, what the API validates.
 * A discriminated union on `family`; each family's own schema lives in its own module.
 * (Provisional: families are checked here by name until each engine's schema is wired in.)
 */
import { z } from 'zod';

export const FAMILIES = ['fibonacci', 'penrose', 'octagonal', 'icosahedral', 'decagonal'] as const;
export type Family = (typeof FAMILIES)[number];

export const modelParamsSchema = z
  .object({ family: z.enum(FAMILIES, { message: `family must be one of ${FAMILIES.join(', ')}` }) })
  .passthrough();

export type ModelParams = z.infer<typeof modelParamsSchema>;
