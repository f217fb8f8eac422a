/**
 * Canonical cut-and-project rhombus tilings of the plane from Zⁿ (n = 4 Ammann–Beenker, n = 5 Penrose),
 * quasiperiodic patches and periodic approximant cells.
 *
 * Vertex rule (de Bruijn 1981, Proc. K. Ned. Akad. Wet. A 84, 39–66; the multigrid dual): K ∈ Zⁿ is a
 * vertex iff K − γ − y ∈ [0,1]ⁿ for some y in the cut plane E. Projecting along E this reads
 *     P(K − γ) ∈ P([0,1]ⁿ ∩ {Σλ = ΣK − Σγ})      (index levels, n = 5)
 *     P(K − γ) ∈ P([0,1]ⁿ)                        (no index constraint, n = 4)
 * with P the 2×n perpendicular map. The windows are convex polygons; their boundaries follow the half-open
 * rule of planar-window.ts, which equals an infinitesimal phason shift, so singular γ (e.g. γ = 0) still
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
import { convexPolygon, polygonContains, type Polygon } from './planar-window';
import { integerKernel, reduceBasis2 } from './planar-lattice';
import { checkPointCap } from './planar-parse';

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
  cell?: [[number, number], [number, number]];
  /** Integer period vectors of the cell (approximants). */
  periods?: [number[], number[]];
}

/** Slices of [0,1]ⁿ at Σλ = c projected by P: convex hull of the projected slice corners. */
function sliceWindow(P: number[][], n: number, c: number | null): Polygon | null {
  const pts: number[] = [];
  const push = (lam: number[]) => {
    let x = 0, y = 0;
    for (let j = 0; j < n; j++) {
      x += P[0][j] * lam[j];
      y += P[1][j] * lam[j];
    }
    pts.push(x, y);
  };
  for (let mask = 0; mask < 1 << n; mask++) {
    const lam = Array.from({ length: n }, (_, j) => (mask >> j) & 1);
    const ones = lam.reduce((a, b) => a + b, 0);
    if (c === null) {
      push(lam);
      continue;
    }
    // Corners of a hypersimplex-like slice: all coordinates 0/1 except at most one in [0,1].
    const f = c - ones;
    if (Math.abs(f) < 1e-12) push(lam);
    else if (f > 0 && f < 1) {
      for (let j = 0; j < n; j++) {
        if (lam[j] === 0) {
          const l2 = lam.slice();
          l2[j] = f;
          push(l2);
        }
      }
    }
  }
  if (pts.length < 6) return null;
  const w = convexPolygon(pts);
  return w && w.area > 1e-12 ? w : null;
}

/** Numeric key of K: base 2^b digits with offset, exact in a double. */
function keyer(n: number) {
  const bits = Math.floor(52 / n);
  const base = 2 ** bits;
  const half = base / 2;
  return {
    half,
    key(K: ArrayLike<number>): number {
      let k = 0;
      for (let j = n - 1; j >= 0; j--) {
        const v = K[j] + half;
        if (v < 0 || v >= base) {
          throw new RangeError(`radius: the patch is too large (hyperlattice index beyond ±${half - 1})`);
        }
        k = k * base + v;
      }
      return k;
    },
  };
}

/**
 * Period lattice of a rational cut: integer periods t1, t2 (P t = 0, and Σt = 0 with index levels) and their
 * parallel images a, b (edge 1), Lagrange–Gauss reduced.
 */
export function approximantCell(spec: PlanarSpec): { t: [number[], number[]]; a: [[number, number], [number, number]] } {
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

export function buildPlanar(
  spec: PlanarSpec,
  extent: { radius: number } | { approximant: true },
  maxPoints: number,
): PlanarResult {
  const { n, par, perp, gamma } = spec;
  const sumGamma = gamma.reduce((a, b) => a + b, 0);
  let pg0 = 0, pg1 = 0;
  for (let j = 0; j < n; j++) {
    pg0 += perp[0][j] * gamma[j];
    pg1 += perp[1][j] * gamma[j];
  }
  const windows = new Map<number, Polygon | null>();
  const windowFor = (level: number): Polygon | null => {
    if (!spec.levels) level = 0;
    let w = windows.get(level);
    if (w === undefined) {
      const c = level - sumGamma;
      w = spec.levels ? (c > 0 && c < n ? sliceWindow(perp, n, c) : null) : sliceWindow(perp, n, null);
      windows.set(level, w);
    }
    return w;
  };
  const inV = (K: ArrayLike<number>): boolean => {
    let lev = 0, x = -pg0, y = -pg1;
    for (let j = 0; j < n; j++) {
      lev += K[j];
      x += perp[0][j] * K[j];
      y += perp[1][j] * K[j];
    }
    const w = windowFor(lev);
    return w !== null && polygonContains(w, x, y);
  };
  const px = (K: ArrayLike<number>) => {
    let x = 0, y = 0;
    for (let j = 0; j < n; j++) {
      x += par[0][j] * K[j];
      y += par[1][j] * K[j];
    }
    return [x, y] as [number, number];
  };

  // Region to search and the cell, if any.
  let cell: [[number, number], [number, number]] | undefined;
  let periods: [number[], number[]] | undefined;
  let inRegion: (x: number, y: number) => boolean;
  let reduce: ((K: Int32Array) => void) | undefined;
  if ('radius' in extent) {
    const R = extent.radius;
    checkPointCap(spec.density * Math.PI * (R + 1) ** 2, maxPoints, `a patch of radius ${R}`);
    const R2 = (R + 2) ** 2;
    inRegion = (x, y) => x * x + y * y <= R2;
  } else {
    const red = approximantCell(spec);
    periods = red.t;
    cell = red.a;
    const [[ax, ay], [bx, by]] = cell;
    const det = ax * by - ay * bx;
    checkPointCap(spec.density * Math.abs(det), maxPoints, 'the approximant cell');
    // Fractional coordinates f = x·B⁻¹ with B rows a, b.
    const frac = (x: number, y: number): [number, number] => [(x * by - y * bx) / det, (ay * x - ax * y) / -det];
    const mA = 2.5 / Math.hypot(ax, ay) / Math.abs(Math.sin(Math.atan2(by, bx) - Math.atan2(ay, ax)));
    const mB = 2.5 / Math.hypot(bx, by) / Math.abs(Math.sin(Math.atan2(by, bx) - Math.atan2(ay, ax)));
    inRegion = (x, y) => {
      const [f, g] = frac(x, y);
      return f >= -mA && f <= 1 + mA && g >= -mB && g <= 1 + mB;
    };
    const [t1, t2] = periods;
    // Representative of K modulo T: fractional coordinates in [−1e-9, 1 − 1e-9). Exact algebraic positions
    // never sit within 1e-9 of that shifted edge, so translates of one vertex always pick the same one.
    reduce = (K) => {
      const [x, y] = px(K);
      const [f, g] = frac(x, y);
      const i = Math.floor(f + 1e-9), k = Math.floor(g + 1e-9);
      if (i === 0 && k === 0) return;
      for (let j = 0; j < n; j++) K[j] -= i * t1[j] + k * t2[j];
    };
  }

  // Start: a vertex near the origin, among K_j ∈ ⌈γ_j⌉ + {−1, 0, 1} (the mesh of the dual grid at the
  // origin is one of them); the closest to the origin, ties by lexicographic K.
  const { key } = keyer(n);
  let start: Int32Array | null = null;
  let best = Infinity;
  const cand = new Int32Array(n);
  for (let code = 0; code < 3 ** n; code++) {
    let c = code;
    for (let j = 0; j < n; j++) {
      cand[j] = Math.ceil(gamma[j]) + (c % 3) - 1;
      c = Math.floor(c / 3);
    }
    if (!inV(cand)) continue;
    const [x, y] = px(cand);
    const d = Math.round((x * x + y * y) * 1e9);
    if (d < best) {
      best = d;
      start = cand.slice();
    }
  }
  if (!start) throw new Error('gamma: no vertex found near the origin (internal error)');

  // Breadth-first search over ±δ_j within the region.
  const seen = new Map<number, number>();
  let idx: number[] = [];
  const push = (K: Int32Array) => {
    seen.set(key(K), idx.length / n);
    for (let j = 0; j < n; j++) idx.push(K[j]);
  };
  push(start);
  const K = new Int32Array(n);
  for (let head = 0; head < idx.length / n; head++) {
    for (let s = 0; s < 2 * n; s++) {
      for (let j = 0; j < n; j++) K[j] = idx[head * n + j];
      K[s >> 1] += s & 1 ? -1 : 1;
      if (seen.has(key(K)) || !inV(K)) continue;
      const [x, y] = px(K);
      if (!inRegion(x, y)) continue;
      push(K);
    }
    if (idx.length / n > 4 * maxPoints + 1000) throw new Error('maxPoints: search grew past the estimate (internal error)');
  }

  // Tiles. Quasiperiodic: faces with centre within R. Approximant: faces whose base K is a cell representative.
  const reps = new Map<number, number>();
  const outIdx: number[] = [];
  const kinds: number[] = [];
  const corners: number[] = [];
  const A = new Int32Array(n), B = new Int32Array(n), C = new Int32Array(n);
  const vertexOf = (V: Int32Array): number => {
    const W = V.slice();
    if (reduce) reduce(W);
    const k = key(W);
    let i = reps.get(k);
    if (i === undefined) {
      i = outIdx.length / n;
      reps.set(k, i);
      for (let j = 0; j < n; j++) outIdx.push(W[j]);
    }
    return i;
  };
  let bases: number[] = idx;
  if (reduce) {
    // Cell representatives among the searched vertices, in search order.
    const keep = new Map<number, number>();
    const list: number[] = [];
    const W = new Int32Array(n);
    for (let v = 0; v < idx.length / n; v++) {
      for (let j = 0; j < n; j++) W[j] = idx[v * n + j];
      reduce(W);
      const k = key(W);
      if (keep.has(k)) continue;
      keep.set(k, list.length);
      for (let j = 0; j < n; j++) list.push(W[j]);
    }
    bases = list;
  }
  idx = [];
  const R = 'radius' in extent ? extent.radius : 0;
  for (let v = 0; v < bases.length / n; v++) {
    for (let j = 0; j < n; j++) K[j] = bases[v * n + j];
    if (reduce) vertexOf(K);
    for (let a = 0; a < n; a++) {
      for (let b = a + 1; b < n; b++) {
        A.set(K);
        A[a]++;
        C.set(A);
        C[b]++;
        B.set(K);
        B[b]++;
        if (!inV(A) || !inV(B) || !inV(C)) continue;
        if (!reduce) {
          const [x, y] = px(K);
          const cx = x + (par[0][a] + par[0][b]) / 2, cy = y + (par[1][a] + par[1][b]) / 2;
          if (cx * cx + cy * cy > R * R) continue;
        }
        kinds.push(spec.kindOf(a, b));
        // Corners counter-clockwise: K, K+δ_a, K+δ_a+δ_b, K+δ_b when det(e_a, e_b) > 0, else reversed.
        if (par[0][a] * par[1][b] - par[1][a] * par[0][b] > 0) corners.push(vertexOf(K), vertexOf(A), vertexOf(C), vertexOf(B));
        else corners.push(vertexOf(K), vertexOf(B), vertexOf(C), vertexOf(A));
      }
    }
  }

  const N = outIdx.length / n;
  checkPointCap(N, maxPoints, 'the tiling');
  const xy = new Float64Array(2 * N);
  const pp = new Float64Array(2 * N);
  const level = new Int32Array(N);
  for (let v = 0; v < N; v++) {
    let x = 0, y = 0, u = 0, w = 0, l = 0;
    for (let j = 0; j < n; j++) {
      const kj = outIdx[v * n + j];
      x += par[0][j] * kj;
      y += par[1][j] * kj;
      u += spec.perpOut[0][j] * (kj - gamma[j]);
      w += spec.perpOut[1][j] * (kj - gamma[j]);
      l += kj;
    }
    xy[2 * v] = x;
    xy[2 * v + 1] = y;
    pp[2 * v] = u;
    pp[2 * v + 1] = w;
    level[v] = l;
  }
  return {
    xy,
    perp: pp,
    index: Int32Array.from(outIdx),
    level,
    kind: Uint8Array.from(kinds),
    corners: Uint32Array.from(corners),
    cell,
    periods,
  };
}
