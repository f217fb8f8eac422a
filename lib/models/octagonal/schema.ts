/** Parameters of the Ammann–Beenker tiling (generate.ts): a patch or a 1+√2-convergent approximant cell. */
import type { z } from 'zod';
import { SILVER_MEAN } from '../../math/convergents';
import { planarSchema } from '../planar/schema';

export const octagonalModelSchema = planarSchema({
  family: 'octagonal',
  directions: 4,
  irrational: SILVER_MEAN,
  irrationalName: '1+√2 (Pell ratios)',
  minQ: 1,
});
export type OctagonalParams = z.infer<typeof octagonalModelSchema>;
