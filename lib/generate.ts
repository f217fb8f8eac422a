/**
 * Params → Structure: the one entry point that forms, the API, exports, the Web Worker and the CLI
 * share. Pure and deterministic: the same Params and engine version give the same bytes.
 */
import type { Structure } from './structure/types';
import { ENGINE_VERSION } from './version';
import { parseModelParams, type ModelParams } from './params/model';
import { fibonacci, fibonacciChain } from './tiling/fibonacci';
import { penroseTiling, PENROSE_DENSITY, penroseSpec } from './tiling/penrose';
import { octagonalTiling, OCTAGONAL_DENSITY, octagonalSpec } from './tiling/octagonal';
import { approximantCell } from './tiling/planar-canonical';
import { decagonalModel } from './tiling/decagonal';
import { generateIcosahedralApproximant, generateIcosahedralPatch, resolveClasses } from './tiling/decorate';
import { estimatePatchCount } from './tiling/icosahedral';
import { estimateApproximantCount } from './tiling/approximant';
import { parseOrder } from './params/icosahedral';

/** Validate (throwing one readable error naming every bad field) and generate. */
export function generate(input: unknown): Structure {
  const params = parseModelParams(input);
  const s = generateParsed(params);
  // Provenance records the whole validated model, family included, so a cut can be rebuilt from it.
  s.provenance = { params, engine: ENGINE_VERSION };
  return s;
}

function generateParsed(p: ModelParams): Structure {
  switch (p.family) {
    case 'fibonacci': {
      const { family: _f, ...chain } = p;
      return fibonacciChain(chain);
    }
    case 'penrose':
    case 'octagonal': {
      const { family, ...planar } = p;
      return family === 'penrose' ? penroseTiling(planar) : octagonalTiling(planar);
    }
    case 'decagonal': {
      const { family: _f, ...deca } = p;
      return decagonalModel(deca);
    }
    case 'icosahedral': {
      if (p.mode === 'patch') {
        const { mode: _m, ...rest } = p;
        return generateIcosahedralPatch(rest);
      }
      const { mode: _m, ...rest } = p;
      const { centring: _c, ...s } = generateIcosahedralApproximant(rest);
      return s;
    }
  }
}

/**
 * Planar patches keep whole tiles whose centre lies inside the radius, so their vertices fill a disc
 * about 0.65 edge wider (fitted to our own Penrose and Ammann–Beenker cuts of radius 3–40 edges:
 * 0.46–0.81; an estimate, not a bound).
 */
const RIM = 0.65;

function planarCellArea(family: 'penrose' | 'octagonal', gamma: number[] | undefined, a: { p: number; q: number }): number {
  const spec = family === 'penrose' ? penroseSpec(gamma ?? [0, 0, 0, 0, 0], a) : octagonalSpec(gamma ?? [0, 0, 0, 0], a);
  const [[ax, ay], [bx, by]] = approximantCell(spec).a;
  return Math.abs(ax * by - ay * bx);
}

/**
 * Expected number of points before generating (density × volume, the model-set density formula),
 * for the forms' estimate and the point cap. Throws on invalid Params like generate().
 */
export function estimateCount(input: unknown): number {
  const p = parseModelParams(input);
  switch (p.family) {
    case 'fibonacci':
      return p.approximant ? fibonacci(p.order + 2) : fibonacci(p.order + 2) + 1;
    case 'penrose':
    case 'octagonal': {
      const density = p.family === 'penrose' ? PENROSE_DENSITY : OCTAGONAL_DENSITY;
      if (p.approximant) return Math.round(density * planarCellArea(p.family, p.gamma, p.approximant));
      return Math.round(density * Math.PI * (p.radius! / p.edge + RIM) ** 2);
    }
    case 'decagonal': {
      const perLayer = p.approximant
        ? PENROSE_DENSITY * planarCellArea('penrose', p.gamma, p.approximant)
        : PENROSE_DENSITY * Math.PI * (p.radius! / p.edge + RIM) ** 2;
      return Math.round(perLayer * p.layers);
    }
    case 'icosahedral': {
      const classes = resolveClasses(p.decoration, p.species);
      if (p.mode === 'patch') {
        return Math.round(estimatePatchCount({ aR: p.aR, radius: p.radius, lattice: p.lattice, offset: p.offset, classes }));
      }
      const { p: pp, q } = parseOrder(p.order);
      return Math.round(estimateApproximantCount({ p: pp, q, aR: p.aR, lattice: p.lattice, offset: p.offset, classes }));
    }
  }
}
