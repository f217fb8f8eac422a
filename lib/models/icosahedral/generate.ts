/**
 * Validated icosahedral Params → Structure: a ball (patch.ts) or one cubic approximant cell
 * (approximant.ts), each site class cut with its own occupation domain, then clusters and merging
 * (decorate.ts).
 */
import type { Structure } from '../../structure/types';
import type { IcosahedralApproximantParams, IcosahedralParams, IcosahedralPatchParams } from './schema';
import { parseOrder } from './schema';
import { applyClusters, decoratedCount, resolveClasses } from './decorate';
import { checkPointCap } from '../point-cap';
import { estimatePatchCount, icosahedralPatch } from './patch';
import { estimateApproximantCount, icosahedralApproximant, type Centring } from './approximant';

export function generateIcosahedral(p: IcosahedralParams): Structure {
  if (p.mode === 'patch') return generateIcosahedralPatch(p);
  const { centring: _c, ...s } = generateIcosahedralApproximant(p);
  return s;
}

/**
 * Expected number of atoms: the model-set density of each site class times the volume, and for every class
 * that carries clusters, its expected points times the atoms per cluster (before merging, which only removes
 * atoms). A small window in a small cell can hold more points than its density says; applyClusters checks the
 * cap again on the real number of centres.
 */
export function estimateIcosahedral(p: IcosahedralParams): number {
  const classes = resolveClasses(p.decoration, p.species);
  const { p: pp, q } = p.mode === 'approximant' ? parseOrder(p.order) : { p: 0, q: 0 };
  const one = (cl: (typeof classes)[number]) =>
    p.mode === 'patch'
      ? estimatePatchCount({ aR: p.aR, radius: p.radius, lattice: p.lattice, offset: p.offset, classes: [cl] })
      : estimateApproximantCount({ p: pp, q, aR: p.aR, lattice: p.lattice, offset: p.offset, classes: [cl] });
  const perClass = new Map<string, number>();
  let total = 0;
  for (const cl of classes) {
    const n = one(cl);
    perClass.set(cl.name, (perClass.get(cl.name) ?? 0) + n);
    total += n;
  }
  return Math.round(decoratedCount(perClass, total, p.decoration));
}

/** Refuse before cutting when the decorated estimate is over the point cap. */
function checkDecoratedCap(p: IcosahedralParams, what: string): void {
  if (p.decoration?.clusters?.length) checkPointCap(estimateIcosahedral(p), p.maxPoints, `${what} with its clusters`);
}

/** Validated patch Params → Structure. */
export function generateIcosahedralPatch(params: IcosahedralPatchParams): Structure {
  checkDecoratedCap(params, `a patch of radius ${params.radius} Å`);
  return applyClusters(generateIcosahedralPatchCut(params), params.decoration, { maxPoints: params.maxPoints, aR: params.aR });
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
  checkDecoratedCap(params, `the ${params.order} cell`);
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
  return Object.assign(applyClusters(cut, params.decoration, { maxPoints: params.maxPoints, aR: params.aR }), { centring: cut.centring });
}
