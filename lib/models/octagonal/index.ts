import type { ModelDefinition } from '../types';
import { planarCount } from '../planar/estimate';
import { octagonalModelSchema, type OctagonalParams } from './schema';
import { octagonalSpec, octagonalTiling } from './generate';

export const octagonalModel: ModelDefinition<OctagonalParams> = {
  family: 'octagonal',
  schema: octagonalModelSchema,
  generate: octagonalTiling,
  estimate: (p) => Math.round(planarCount(octagonalSpec(p.gamma ?? [0, 0, 0, 0], p.approximant), p)),
};
