import type { ModelDefinition } from '../types';
import { planarCount } from '../planar/estimate';
import { penroseModelSchema, type PenroseParams } from './schema';
import { penroseSpec, penroseTiling } from './generate';

export const penroseModel: ModelDefinition<PenroseParams> = {
  family: 'penrose',
  schema: penroseModelSchema,
  generate: penroseTiling,
  estimate: (p) => Math.round(planarCount(penroseSpec(p.gamma ?? [0, 0, 0, 0, 0], p.approximant), p)),
};
