import type { ModelDefinition } from '../types';
import { chainModelSchema, type ChainParams } from './schema';
import { fibonacci, fibonacciChain } from './generate';

export const chainModel: ModelDefinition<ChainParams> = {
  family: 'fibonacci',
  schema: chainModelSchema,
  generate: fibonacciChain,
  // F(n+2) segments: as many vertices in one period, one more for the open chain.
  estimate: (p) => (p.approximant ? fibonacci(p.order + 2) : fibonacci(p.order + 2) + 1),
};
