/**
 * Validated icosahedral Params → Structure: a ball (patch.ts) or one cubic approximant cell
 * (approximant.ts), each site class cut with its own occupation domain, then clusters and merging
 * (decorate.ts).
 */
import type { Structure } from '../../structure/types';
import type { IcosahedralApproximantParams, IcosahedralParams, IcosahedralPatchParams } from './schema';
import { parseOrder } from './schema';
import { applyClusters, resolveClasses } from './decorate';
import { estimatePatchCount, icosahedralPatch } from './patch';
import { estimateApproximantCount, icosahedralApproximant, type Centring } from './approximant';

export function generateIcosahedral(p: IcosahedralParams): Structure {
  if (p.mode === 'patch') return generateIcosahedralPatch(p);
  const { centring: _c, ...s } = generateIcosahedralApproximant(p);
  return s;
}

/** Expected number of points of the cut (before clusters), from the model-set density of each class. */
export function estimateIcosahedral(p: IcosahedralParams): number {
  const classes = resolveClasses(p.decoration, p.species);
  if (p.mode === 'patch') {
    return Math.round(estimatePatchCount({ aR: p.aR, radius: p.radius, lattice: p.lattice, offset: p.offset, classes }));
  }
  const { p: pp, q } = parseOrder(p.order);
  return Math.round(estimateApproximantCount({ p: pp, q, aR: p.aR, lattice: p.lattice, offset: p.offset, classes }));
}

/** Validated patch Params → Structure. */
export function generateIcosahedralPatch(params: IcosahedralPatchParams): Structure {
  return applyClusters(generateIcosahedralPatchCut(params), params.decoration);
}

function generateIcosahedralPatchCut(params: IcosahedralPatchParams): Structure {
  return icosahedralPatch({
    aR: params.aR,
    radius: params.radius,
    centre: params.centre,
    lattice: params.lattice,
    offset: params.offset,
    maxPoints: params.maxPoints,
    classes: resolveClasses(params.decoration, params.species),
    params,
  });
}

/** Validated approximant Params → one cubic cell (Structure with cell) and its detected centring. */
export function generateIcosahedralApproximant(params: IcosahedralApproximantParams): Structure & { centring: Centring } {
  const { p, q } = parseOrder(params.order);
  const cut = icosahedralApproximant({
    p,
    q,
    aR: params.aR,
    lattice: params.lattice,
    offset: params.offset,
    maxPoints: params.maxPoints,
    classes: resolveClasses(params.decoration, params.species),
    params,
  });
  return Object.assign(applyClusters(cut, params.decoration), { centring: cut.centring });
}
