/**
 * The two images of a hyperlattice node K: its parallel position Σ K_j e_j in the tiling plane, and, for
 * the output, its perpendicular position P_out(K − γ) and index level ΣK.
 */
import type { PlanarSpec } from './spec';

/**
 * Parallel position of K into the fields x, y. The search projects every new vertex and the cell
 * reduction every vertex it reduces, so the result goes to fields rather than a fresh pair.
 */
export class ParallelMap {
  x = 0;
  y = 0;
  private readonly n: number;
  private readonly E0: Float64Array;
  private readonly E1: Float64Array;

  constructor(par: number[][]) {
    this.n = par[0].length;
    this.E0 = Float64Array.from(par[0]);
    this.E1 = Float64Array.from(par[1]);
  }

  project(K: ArrayLike<number>): void {
    const { n, E0, E1 } = this;
    let x = 0, y = 0;
    for (let j = 0; j < n; j++) {
      x += E0[j] * K[j];
      y += E1[j] * K[j];
    }
    this.x = x;
    this.y = y;
  }
}

/** Parallel positions, perpendicular positions and index levels of N vertices given by their K (n each). */
export function projectVertices(
  spec: PlanarSpec,
  index: Int32Array,
  N: number,
): { xy: Float64Array; perp: Float64Array; level: Int32Array } {
  const { n, par, perpOut, gamma } = spec;
  const xy = new Float64Array(2 * N);
  const pp = new Float64Array(2 * N);
  const level = new Int32Array(N);
  for (let v = 0; v < N; v++) {
    let x = 0, y = 0, u = 0, w = 0, l = 0;
    for (let j = 0; j < n; j++) {
      const kj = index[v * n + j];
      x += par[0][j] * kj;
      y += par[1][j] * kj;
      u += perpOut[0][j] * (kj - gamma[j]);
      w += perpOut[1][j] * (kj - gamma[j]);
      l += kj;
    }
    xy[2 * v] = x;
    xy[2 * v + 1] = y;
    pp[2 * v] = u;
    pp[2 * v + 1] = w;
    level[v] = l;
  }
  return { xy, perp: pp, level };
}
