/**
 * The model registry: every family's schema, generator and estimate, and the one way in —
 * generate(params) validates once and dispatches. The CLI, the API, exports, the Web Worker and the
 * server all build Params and call generate(); the Params recorded in a Structure (and in every file
 * written from it) regenerate it byte for byte with the same engine version.
 *
 * Adding a family: a folder lib/models/<family>/ with schema.ts, its generator and an index.ts
 * exporting a ModelDefinition, its schema in the union of params.ts, and one line in MODELS below
 * (the type checker fails until both are there).
 */
import type { Structure } from '../structure/types';
import { ENGINE_VERSION } from '../version';
import { parseModelParams, type Family, type ParamsOf } from './params';
import type { ModelDefinition } from './types';
import { chainModel } from './chain';
import { penroseModel } from './penrose';
import { octagonalModel } from './octagonal';
import { decagonalModelDefinition } from './decagonal';
import { icosahedralModel } from './icosahedral';

export const MODELS: { [F in Family]: ModelDefinition<ParamsOf<F>> } = {
  fibonacci: chainModel,
  penrose: penroseModel,
  octagonal: octagonalModel,
  icosahedral: icosahedralModel,
  decagonal: decagonalModelDefinition,
};

function definition<F extends Family>(p: ParamsOf<F>): ModelDefinition<ParamsOf<F>> {
  return MODELS[p.family as F];
}

/** Validate (throwing one readable error naming every bad field) and generate. */
export function generate(input: unknown): Structure {
  const params = parseModelParams(input);
  const s = definition(params).generate(params);
  // The whole validated model, family included, so a cut can be rebuilt from it.
  s.model = params;
  s.provenance = { params, engine: ENGINE_VERSION };
  return s;
}

/**
 * Expected number of points before generating (density × volume, the model-set density formula),
 * for the forms' estimate and the point cap. Throws on invalid Params like generate().
 */
export function estimateCount(input: unknown): number {
  const params = parseModelParams(input);
  return definition(params).estimate(params);
}

export { FAMILIES, modelParamsSchema, parseModelParams } from './params';
export type { Family, ModelParams, ModelParamsInput, ParamsOf } from './params';
export type { ModelDefinition } from './types';
