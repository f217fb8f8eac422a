/**
 * The vertices of a planar cut inside a search region, found by breadth-first search over the unit steps
 * ±δ_j of Zⁿ from one vertex near the origin: in a non-singular cut two vertices differing by δ_j are
 * joined by an edge (de Bruijn 1981, the multigrid dual), so the vertices in the region connected to the
 * start are reached in time linear in their number. Vertices are deduplicated exactly by their integer K.
 */
import { IntVectorSet } from '../../math/int-vector-set';
import type { ParallelMap } from './projection';
import type { SearchRegion } from './region';
import type { WindowTable } from './window-table';

/** The index range of the search: |K_j| < 2^⌊52/n⌋⁻¹, what its earlier packed-double key allowed. */
export function planarBound(n: number) {
  const bound = 2 ** Math.floor(52 / n) / 2;
  return { bound, boundMessage: `radius: the patch is too large (hyperlattice index beyond ±${bound - 1})` };
}

/**
 * A vertex near the origin, among K_j ∈ ⌈γ_j⌉ + {−1, 0, 1} (the mesh of the dual grid at the origin is one
 * of them): the closest to the origin, ties by lexicographic K (the first in this order), so the start and
 * with it the search order depend on the cut only.
 */
export function startVertex(gamma: number[], win: WindowTable, proj: ParallelMap): Int32Array {
  const n = gamma.length;
  let start: Int32Array | null = null;
  let best = Infinity;
  const cand = new Int32Array(n);
  for (let code = 0; code < 3 ** n; code++) {
    let c = code;
    for (let j = 0; j < n; j++) {
      cand[j] = Math.ceil(gamma[j]) + (c % 3) - 1;
      c = Math.floor(c / 3);
    }
    if (!win.contains(cand)) continue;
    proj.project(cand);
    const d = Math.round((proj.x * proj.x + proj.y * proj.y) * 1e9);
    if (d < best) {
      best = d;
      start = cand.slice();
    }
  }
  if (!start) throw new Error('gamma: no vertex found near the origin (internal error)');
  return start;
}

/**
 * Searched vertices in search order with their parallel positions and the neighbour table. Step s changes
 * K_{s>>1} by +1 (s even) or −1 (s odd); nb[2n·v + s] records what lies there: a searched vertex's index,
 * −1 (not a vertex: outside the window) or −2 (a vertex outside the search region). The tile passes read
 * their corner tests from this table. While searching, −4 marks "not yet known".
 */
export class VertexSearch {
  readonly n: number;
  /** Searched K, n per vertex in search order (seen.coords), and their lookup. */
  readonly seen: IntVectorSet;
  nb: Int32Array;
  vx: Float64Array;
  vy: Float64Array;

  constructor(n: number, expected: number) {
    this.n = n;
    this.seen = new IntVectorSet(n, expected, planarBound(n));
    const cap = this.seen.coords.length / n;
    this.nb = new Int32Array(2 * n * cap).fill(-4);
    this.vx = new Float64Array(cap);
    this.vy = new Float64Array(cap);
  }

  get size(): number {
    return this.seen.size;
  }

  /** Append K (not searched yet) at parallel position (x, y), growing the tables; its index. */
  add(K: Int32Array, x: number, y: number): number {
    const i = this.seen.insert(K);
    if (i >= this.vx.length) {
      const m = 2 * this.vx.length;
      const nb2 = new Int32Array(2 * this.n * m).fill(-4);
      nb2.set(this.nb);
      this.nb = nb2;
      const x2 = new Float64Array(m), y2 = new Float64Array(m);
      x2.set(this.vx);
      y2.set(this.vy);
      this.vx = x2;
      this.vy = y2;
    }
    this.vx[i] = x;
    this.vy[i] = y;
    return i;
  }
}

/**
 * Breadth-first search from `start` over ±δ_j within the region. An edge found from one end is written into
 * the other end's row too, so each edge is looked up once. The set is sized from the region's estimate
 * (capped by the point cap); a search growing far past the cap means the estimate is broken.
 */
export function searchVertices(
  start: Int32Array,
  win: WindowTable,
  proj: ParallelMap,
  region: SearchRegion,
  maxPoints: number,
): VertexSearch {
  const n = start.length, n2 = 2 * n;
  const half = planarBound(n).bound;
  const limit = 4 * maxPoints + 1000;
  const search = new VertexSearch(n, Math.min(Math.ceil(1.2 * region.estimate) + 64, limit));
  const seen = search.seen;
  proj.project(start);
  search.add(start, proj.x, proj.y);
  const K = new Int32Array(n);
  for (let head = 0; head < seen.size; head++) {
    const pts = seen.coords;
    for (let j = 0; j < n; j++) K[j] = pts[head * n + j];
    for (let s = 0; s < n2; s++) {
      if (search.nb[head * n2 + s] !== -4) continue;
      // K = head ± δ_{s>>1}; the step is undone at the end of the iteration.
      const dj = s >> 1, step = s & 1 ? -1 : 1;
      const kj = (K[dj] += step);
      // Only K_{s>>1} moved, and the head was in range: its range check stands for the whole of K. The
      // searched set holds window points only, so outside the window there is nothing to look up.
      if (kj < -half || kj >= half) seen.indexOf(K);
      let r = -1;
      if (win.contains(K)) {
        r = seen.indexOf(K);
        if (r < 0) {
          proj.project(K);
          r = region.contains(proj.x, proj.y) ? search.add(K, proj.x, proj.y) : -2;
        }
      }
      search.nb[head * n2 + s] = r;
      if (r > head) search.nb[r * n2 + (s ^ 1)] = head;
      K[dj] -= step;
    }
    if (seen.size > limit) throw new Error('maxPoints: search grew past the estimate (internal error)');
  }
  return search;
}
