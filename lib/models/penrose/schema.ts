/** Parameters of the Penrose rhombus tiling (generate.ts): a patch or a τ-convergent approximant cell. */
import type { z } from 'zod';
import { GOLDEN_MEAN } from '../../math/convergents';
import { planarSchema } from '../planar/schema';

export const penroseModelSchema = planarSchema({
  family: 'penrose',
  directions: 5,
  irrational: GOLDEN_MEAN,
  irrationalName: 'τ (F(n+1)/F(n))',
  minQ: 1,
});
export type PenroseParams = z.infer<typeof penroseModelSchema>;
