/**
 * A tile of a chain or planar tiling as one connected shape. A periodic cut (an approximant) stores each
 * vertex once, wrapped into the cell, so a tile that crosses the cell edge has corners on opposite sides of
 * the cell; joined as stored they make a sliver across the whole cell. Unwrapping walks the tile from its
 * first corner and takes every step by the periodicity: that is how the exported coordinates are meant
 * to be read under periodic boundaries.
 */
import type { Structure, TileSet } from '../structure/types';
import { Lattice2 } from './lattice2';

/** How a cut repeats, as the tiling views need it. */
export type Periodicity =
  | { kind: 'none' }
  /** A periodic chain along x with this period (Å). */
  | { kind: 'chain'; period: number }
  /** A periodic planar tiling with this in-plane lattice. */
  | { kind: 'plane'; lattice: Lattice2 };

/** The periodicity of a chain or planar cut: none without a cell; the a axis (1D) or the a, b plane (2D). */
export function periodicityOf(s: Pick<Structure, 'cell' | 'dim' | 'tiles'>): Periodicity {
  if (!s.cell || !s.tiles) return { kind: 'none' };
  const [a, b] = s.cell;
  if (s.tiles.cornersPerTile === 2) return { kind: 'chain', period: Math.hypot(a[0], a[1], a[2]) };
  return { kind: 'plane', lattice: new Lattice2([a[0], a[1]], [b[0], b[1]]) };
}

/**
 * Length of the step from x to x + dx walked forward along a periodic chain: dx modulo the period, in
 * (0, period]. Not the minimum image: at orders 0 and 1 a long segment is more than half the period
 * (ℓ/(ℓ + s) = 1/τ ≈ 0.62 for the ideal ratio, and order 0 has one segment that is the whole period, from a
 * vertex to its own image), so "nearest" would pick the wrong way round. Chain segments are stored in
 * walk order (lib/models/chain/generate.ts: the last one runs from the last vertex to vertex 0 of the next
 * cell), which makes the forward step the right one at every order.
 */
export function forwardSpan(dx: number, period: number): number {
  const r = dx - period * Math.floor(dx / period);
  // Within rounding of 0 or of the period the step is one whole period (a segment is never empty).
  return r <= 1e-9 * period || r >= period * (1 - 1e-9) ? period : r;
}

/**
 * Corners of tile `ti`, unwrapped, into out: x y per corner (cornersPerTile pairs; y = 0 for chains).
 * The first corner stays where it is stored; each next corner is the previous one plus the step to it —
 * the forward span for chains, the minimum image of the edge for planar tilings. Edges, not corner-to-first
 * vectors, are imaged because an edge is the shortest vector in a tile: a unit edge is always its own
 * minimum image once the shortest period exceeds two edges (true of every planar approximant Tauforge
 * makes: the smallest, the octagonal 2/1, has periods of 1 + √2 edges), while a thin rhombus' long
 * diagonal (1.9 edges) would already be read the wrong way round in that cell.
 */
export function unwrapTile(
  positions: ArrayLike<number>,
  tiles: Pick<TileSet, 'corners' | 'cornersPerTile'>,
  ti: number,
  periodicity: Periodicity,
  out: { [i: number]: number; length: number },
): void {
  const k = tiles.cornersPerTile;
  const c = tiles.corners;
  const v0 = c[k * ti];
  out[0] = positions[3 * v0];
  out[1] = positions[3 * v0 + 1];
  for (let j = 1; j < k; j++) {
    const prev = c[k * ti + j - 1];
    const v = c[k * ti + j];
    const dx = positions[3 * v] - positions[3 * prev];
    const dy = positions[3 * v + 1] - positions[3 * prev + 1];
    if (periodicity.kind === 'chain') {
      out[2 * j] = out[2 * j - 2] + forwardSpan(dx, periodicity.period);
      out[2 * j + 1] = 0;
    } else if (periodicity.kind === 'plane') {
      periodicity.lattice.minimumImage(dx, dy, out, 2 * j);
      out[2 * j] += out[2 * j - 2];
      out[2 * j + 1] += out[2 * j - 1];
    } else {
      out[2 * j] = positions[3 * v];
      out[2 * j + 1] = positions[3 * v + 1];
    }
  }
}
