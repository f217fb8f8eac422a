/**
 * Ammann–Beenker (octagonal) tiling from Z⁴, the canonical cut with the octagon window P([0,1]⁴)
 * (Beenker 1982, TH Eindhoven report 82-WSK-04; see planar-canonical.ts for rule, tiles, boundary rule).
 *
 * Parallel e_j = (cos jπ/4, sin jπ/4), perpendicular e⊥_j = (cos 3jπ/4, sin 3jπ/4), j = 0…3; the window is the
 * regular octagon of edge 1 spanned by the e⊥_j. Window test uses 2·e⊥ = [2, −√2, 0, √2 ; 0, √2, −2, √2];
 * an approximant p/q of 1+√2 replaces √2 by p/q − 1 and multiplies by q (integer matrix). Faces on e_j, e_k
 * with k − j = 2 are squares, the others 45° rhombi.
 */
import type { OctagonalParams } from './schema';
import { buildPlanar, type PlanarSpec } from '../planar/cut';
import { planarStructure } from '../planar/structure';
import type { Structure } from '../../structure/types';

export const OCTAGONAL_KINDS = ['square', 'rhombus'];
const SQRT2 = Math.SQRT2;
/** Vertices per unit area at edge 1: squares:rhombi = 1:√2, one vertex per tile → (1+√2)/(1 + √2·sin45°) = (1+√2)/2. */
export const OCTAGONAL_DENSITY = (1 + SQRT2) / 2;

export function octagonalSpec(gamma: number[], approximant?: { p: number; q: number }): PlanarSpec {
  const n = 4;
  const par = [0, 1].map((r) => Array.from({ length: n }, (_, j) => (r ? Math.sin : Math.cos)((Math.PI * j) / 4)));
  const q = approximant ? approximant.q : 1;
  const s = approximant ? approximant.p - approximant.q : SQRT2; // q·√2
  const perp = [
    [2 * q, -s, 0, s],
    [0, s, -2 * q, s],
  ];
  const perpOut = perp.map((row) => row.map((v) => v / (2 * q)));
  return {
    n,
    par,
    perp,
    perpOut,
    gamma,
    levels: false,
    kindOf: (j, k) => (k - j === 2 ? 0 : 1),
    density: OCTAGONAL_DENSITY,
    rational: approximant !== undefined,
  };
}

/** Ammann–Beenker tiling: a patch of radius R (tiles whose centre lies within R) or one approximant cell. */
export function octagonalTiling(p: OctagonalParams): Structure {
  const gamma = p.gamma ?? [0, 0, 0, 0];
  const spec = octagonalSpec(gamma, p.approximant);
  const r = buildPlanar(spec, p.approximant ? { approximant: true } : { radius: p.radius! / p.edge }, p.maxPoints);
  return planarStructure(r, OCTAGONAL_KINDS, p.edge, p, false);
}
