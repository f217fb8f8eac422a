/**
 * Canonical cut-and-project rhombus tilings of the plane from Zⁿ (n = 4 Ammann–Beenker, n = 5 Penrose),
 * quasiperiodic patches and periodic approximant cells.
 *
 * Vertex rule (de Bruijn 1981, Proc. K. Ned. Akad. Wet. A 84, 39–66; the multigrid dual): K ∈ Zⁿ is a
 * vertex iff K − γ − y ∈ [0,1]ⁿ for some y in the cut plane E. Projecting along E this reads
 *     P(K − γ) ∈ P([0,1]ⁿ ∩ {Σλ = ΣK − Σγ})      (index levels, n = 5)
 *     P(K − γ) ∈ P([0,1]ⁿ)                        (no index constraint, n = 4)
 * with P the 2×n perpendicular map. The windows are convex polygons; their boundaries follow the half-open
 * rule of window.ts, which equals an infinitesimal phason shift, so singular γ (e.g. γ = 0) still
 * give a valid tiling. Penrose levels whose slice has zero area (ΣK − Σγ ∈ {0, 5}) hold no vertices.
 *
 * Edges and tiles. In a non-singular cut two vertices differing by a unit vector δ_j are joined by an edge,
 * and the face (K; j, k) is a tile iff its four corners K, K+δ_j, K+δ_j+δ_k, K+δ_k are vertices (the four
 * meshes of the dual grid around one grid crossing). The half-open rule is such a cut, so tiles are found
 * by testing corners; vertices are found by breadth-first search over ±δ_j steps — linear in the output.
 * Vertices are deduplicated exactly by their integer index K.
 *
 * Approximants. Replacing the irrational (τ or √2) by a convergent makes P an integer matrix. The lattice
 * T = {t ∈ Zⁿ : P t = 0, Σt = 0 (n = 5)} has rank 2, every t ∈ T maps the vertex set onto itself, and its
 * parallel images span the cell. Parallel positions keep the exact directions e_j, so the tiles are the
 * same unit rhombi; only the cut is tilted (a linear phason strain).
 */
import { integerKernel, reduceBasis2 } from './lattice';
import { checkPointCap } from '../point-cap';
import type { PlanarCell, PlanarResult, PlanarSpec } from './spec';
import { WindowTable } from './window-table';
import { ParallelMap, projectVertices } from './projection';
import { CellRegion, DiscRegion } from './region';
import { searchVertices, startVertex } from './search';
import { TilingOutput } from './output';
import { faceTable } from './faces';
import { patchTiles } from './tiles-patch';
import { cellTiles } from './tiles-cell';

export type { PlanarCell, PlanarResult, PlanarSpec } from './spec';

/**
 * Period lattice of a rational cut: integer periods t1, t2 (P t = 0, and Σt = 0 with index levels) and their
 * parallel images a, b (edge 1), Lagrange–Gauss reduced.
 */
export function approximantCell(spec: PlanarSpec): { t: [number[], number[]]; a: PlanarCell } {
  const { n, perp, par } = spec;
  if (!spec.rational) throw new Error('approximant: the cut is not rational');
  const rows = perp.map((r) => r.slice());
  if (spec.levels) rows.push(new Array(n).fill(1));
  const ker = integerKernel(rows, n);
  if (ker.length !== 2) throw new Error(`approximant: period lattice has rank ${ker.length}, expected 2`);
  const px = (K: number[]): [number, number] => {
    let x = 0, y = 0;
    for (let j = 0; j < n; j++) {
      x += par[0][j] * K[j];
      y += par[1][j] * K[j];
    }
    return [x, y];
  };
  return reduceBasis2(ker[0], ker[1], px);
}

/**
 * The tiling of a planar cut: a patch of radius R (edge 1) about the origin, or one approximant cell.
 * One module per step: the level windows (window-table.ts); the search region with the point-cap check and,
 * for a cell, the reduction to representatives (region.ts); start vertex and breadth-first search with its
 * neighbour table (search.ts); the tiles (tiles-patch.ts or tiles-cell.ts, with faces.ts) into growing
 * buffers (output.ts); the positions of the output vertices (projection.ts).
 */
export function buildPlanar(
  spec: PlanarSpec,
  extent: { radius: number } | { approximant: true },
  maxPoints: number,
): PlanarResult {
  const win = new WindowTable(spec);
  const proj = new ParallelMap(spec.par);
  const region = 'radius' in extent
    ? new DiscRegion(spec.density, extent.radius, maxPoints)
    : new CellRegion(spec.density, approximantCell(spec), proj, maxPoints);
  const start = startVertex(spec.gamma, win, proj);
  const search = searchVertices(start, win, proj, region, maxPoints);

  const out = new TilingOutput(spec.n, search.size, Math.min(region.estimate, maxPoints));
  const faces = faceTable(spec);
  if (region instanceof CellRegion) cellTiles(search, win, faces, region, out);
  else patchTiles(search, win, faces, region.radius, out);

  const N = out.vertexCount;
  checkPointCap(N, maxPoints, 'the tiling');
  const index = out.index();
  const { xy, perp, level } = projectVertices(spec, index, N);
  const { kind, corners } = out.tiles();
  const cell = region instanceof CellRegion ? region : undefined;
  return { xy, perp, index, level, kind, corners, cell: cell?.cell, periods: cell?.periods };
}
