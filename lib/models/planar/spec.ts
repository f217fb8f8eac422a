/**
 * What a planar cut takes and gives: the spec of a cut of Zⁿ (n = 4 or 5) by a plane, and the vertices and
 * rhombus tiles it yields. Every step of buildPlanar (cut.ts) reads the spec; the result is what the
 * family generators turn into a Structure (structure.ts).
 */

/** Rows a, b of an approximant cell in the plane (edge 1). */
export type PlanarCell = [[number, number], [number, number]];

export interface PlanarSpec {
  /** Hyperlattice dimension (4 or 5). */
  n: number;
  /** Parallel directions e_j, 2×n row-major: x row then y row (unit edges). */
  par: number[][];
  /** Perpendicular map used for the window test (any invertible linear image of the true one), 2×n. */
  perp: number[][];
  /** Perpendicular map written to Structure.perp, 2×n. */
  perpOut: number[][];
  /** Grid offsets γ_j. */
  gamma: number[];
  /** Index levels (Σ K) are part of the window (Penrose) or not (Ammann–Beenker). */
  levels: boolean;
  /** Tile kind of the face spanned by directions j < k. */
  kindOf: (j: number, k: number) => number;
  /** Vertices per unit area (edge 1), for the size estimate made before allocating. */
  density: number;
  /** perp is an integer matrix: the cut is rational (approximant). */
  rational: boolean;
}

export interface PlanarResult {
  /** Parallel positions (edge 1), x y per vertex. */
  xy: Float64Array;
  /** Perpendicular positions (perpOut), x y per vertex. */
  perp: Float64Array;
  /** Hyperlattice index K per vertex, n per vertex. */
  index: Int32Array;
  /** Σ K per vertex. */
  level: Int32Array;
  kind: Uint8Array;
  corners: Uint32Array;
  /** Cell (edge 1) for approximants: rows a, b in the plane. */
  cell?: PlanarCell;
  /** Integer period vectors of the cell (approximants). */
  periods?: [number[], number[]];
}
