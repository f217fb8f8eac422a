/**
 * TEMPORARY shim of lib/generate.ts (`generate(params)`, `estimateCount(params)`), used by the workspace
 * until the lead's dispatcher lands. It only calls the engines' public functions.
 */
import type { Structure } from '../structure/types';
import { fibonacciChain } from '../tiling/fibonacci';
import { estimateApproximantCount, icosahedralApproximant } from '../tiling/approximant';
import { estimatePatchCount, icosahedralPatch } from '../tiling/icosahedral';
import type { CutClass } from '../tiling/icosa-cut';
import { shimModelSchema, type ShimModelParams } from './shim-params';
import type { Vec3 } from '../structure/types';

type Ico = Extract<ShimModelParams, { family: 'icosahedral' }>;

function classesOf(p: Ico): CutClass[] | undefined {
  if (p.classes.length === 0) return p.windowScale === 1 ? undefined : [{ name: 'vertex', position: [0, 0, 0, 0, 0, 0], window: { kind: 'hypercube', scale: p.windowScale }, species: 0 }];
  return p.classes.map((c) => ({ name: c.name, position: c.position, window: c.window, species: c.species, occupancy: c.occupancy }));
}

function spec(p: Ico) {
  return { p: p.p, q: p.q, aR: p.aR, radius: p.radius, lattice: p.lattice, offset: p.offset as Vec3, maxPoints: p.maxPoints, classes: classesOf(p), params: p };
}

export function generate(input: unknown): Structure {
  const params = shimModelSchema.parse(input);
  if (params.family === 'fibonacci') {
    const { family: _family, ...chain } = params;
    return fibonacciChain(chain);
  }
  return params.kind === 'approximant' ? icosahedralApproximant(spec(params)) : icosahedralPatch(spec(params));
}

export function estimateCount(input: unknown): number {
  const params = shimModelSchema.parse(input);
  if (params.family === 'fibonacci') {
    const F = [0, 1];
    for (let i = 2; i <= params.order + 2; i++) F.push(F[i - 1] + F[i - 2]);
    return F[params.order + 2] + (params.approximant ? 0 : 1);
  }
  return params.kind === 'approximant' ? estimateApproximantCount(spec(params)) : estimatePatchCount(spec(params));
}
