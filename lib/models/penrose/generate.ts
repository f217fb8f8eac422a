/**
 * Penrose rhombus tiling from Z⁵ (de Bruijn's pentagrid, 1981, in its cut-and-project form; see
 * planar-canonical.ts for the vertex rule, tiles and the boundary rule).
 *
 * Parallel directions e_j = (cos 2πj/5, sin 2πj/5); perpendicular e⊥_j = (cos 4πj/5, sin 4πj/5) (de Bruijn's
 * choice). For the window test the perpendicular map is taken in the equivalent form
 *   [2, −τ, τ−1, τ−1, −τ ; 0, 1, −τ, τ, −1]   (= 2cos(4πj/5) and sin(4πj/5)·τ/sin 72°)
 * so that τ appears linearly; an approximant p/q replaces τ by p/q and multiplies by q, giving an integer
 * matrix. Faces on e_j, e_k with k − j ≡ ±1 (mod 5) are thick (72°) rhombi, ±2 thin (36°).
 *
 * Output perp coordinates are e⊥ applied to K − γ (for approximants, the same map with τ → p/q), in Å; the
 * fifth coordinate, the index level ΣK_j (1…4 when Σγ = 0), is stored as the site class "index ι".
 */
import type { PenroseParams } from './schema';
import { buildPlanar, type PlanarSpec } from '../planar/cut';
import { planarStructure } from '../planar/structure';
import type { Structure } from '../../structure/types';
import { TAU } from '../../math/golden';

export const PENROSE_KINDS = ['thick', 'thin'];
/** Vertices per unit area at edge 1: thick:thin = τ:1 and one vertex per tile (Euler) → (τ+1)/(τ sin72° + sin36°). */
export const PENROSE_DENSITY = (TAU + 1) / (TAU * Math.sin((2 * Math.PI) / 5) + Math.sin(Math.PI / 5));

export function penroseSpec(gamma: number[], approximant?: { p: number; q: number }): PlanarSpec {
  const n = 5;
  const par = [0, 1].map((r) => Array.from({ length: n }, (_, j) => (r ? Math.sin : Math.cos)((2 * Math.PI * j) / n)));
  const t = approximant ? approximant.p : TAU;
  const q = approximant ? approximant.q : 1;
  const perp = [
    [2 * q, -t, t - q, t - q, -t],
    [0, q, -t, t, -q],
  ];
  const s72 = Math.sin((2 * Math.PI) / 5);
  const tt = t / q;
  const perpOut = [perp[0].map((v) => v / (2 * q)), perp[1].map((v) => (v / q) * (s72 / tt))];
  return {
    n,
    par,
    perp,
    perpOut,
    gamma,
    levels: true,
    kindOf: (j, k) => ((k - j) % 5 === 1 || (k - j) % 5 === 4 ? 0 : 1),
    density: PENROSE_DENSITY,
    rational: approximant !== undefined,
  };
}

/** Penrose rhombus tiling: a patch of radius R (tiles whose centre lies within R) or one approximant cell. */
export function penroseTiling(p: PenroseParams): Structure {
  const gamma = p.gamma ?? [0, 0, 0, 0, 0];
  const spec = penroseSpec(gamma, p.approximant);
  const r = buildPlanar(spec, p.approximant ? { approximant: true } : { radius: p.radius! / p.edge }, p.maxPoints);
  return planarStructure(r, PENROSE_KINDS, p.edge, p, true);
}
