import type { ModelDefinition } from '../types';
import { icosahedralModelSchema, type IcosahedralParams } from './schema';
import { estimateIcosahedral, generateIcosahedral } from './generate';

export const icosahedralModel: ModelDefinition<IcosahedralParams> = {
  family: 'icosahedral',
  schema: icosahedralModelSchema,
  generate: generateIcosahedral,
  estimate: estimateIcosahedral,
};
