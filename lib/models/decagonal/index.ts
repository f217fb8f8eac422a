import type { ModelDefinition } from '../types';
import { decagonalModelSchema, type DecagonalParams } from './schema';
import { decagonalCount, decagonalModel } from './generate';

export const decagonalModelDefinition: ModelDefinition<DecagonalParams> = {
  family: 'decagonal',
  schema: decagonalModelSchema,
  generate: decagonalModel,
  estimate: (p) => Math.round(decagonalCount(p)),
};
