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
import { convexPolygon, type Polygon } from './window';
import { integerKernel, reduceBasis2 } from './lattice';
import { checkPointCap } from '../point-cap';
import { IntVectorSet } from '../../math/int-vector-set';

/** The index range of the search: |K_j| < 2^⌊52/n⌋⁻¹, what its earlier packed-double key allowed. */
function planarBound(n: number) {
  const bound = 2 ** Math.floor(52 / n) / 2;
  return { bound, boundMessage: `radius: the patch is too large (hyperlattice index beyond ±${bound - 1})` };
}

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
  // Windows by index level. With levels only ΣK ∈ (Σγ, Σγ + n) has a slice of positive width, so the
  // levels lo … lo + n + 1 (lo = ⌊Σγ⌋) cover every non-empty window; all others are null.
  const lo = spec.levels ? Math.floor(sumGamma) : 0;
  const wins: (Polygon | null)[] = [];
  for (let level = lo; level <= (spec.levels ? lo + n + 1 : lo); level++) {
    const c = level - sumGamma;
    wins.push(spec.levels ? (c > 0 && c < n ? sliceWindow(perp, n, c) : null) : sliceWindow(perp, n, null));
  }
  // Edges of all windows in flat arrays (window w: edges wOff[w] … wOff[w+1]; none when it is null).
  const nW = wins.length, levels = spec.levels;
  const wOff = new Int32Array(nW + 1);
  for (let w = 0; w < nW; w++) wOff[w + 1] = wOff[w] + (wins[w]?.support.length ?? 0);
  const WN = new Float64Array(2 * wOff[nW]), WS = new Float64Array(wOff[nW]), WT = new Float64Array(wOff[nW]);
  const WC = new Uint8Array(wOff[nW]);
  for (let w = 0; w < nW; w++) {
    const p = wins[w];
    if (!p) continue;
    WN.set(p.normals, 2 * wOff[w]);
    WS.set(p.support, wOff[w]);
    WC.set(p.closed, wOff[w]);
    WT.fill(p.tol, wOff[w], wOff[w + 1]);
  }
  const P0 = Float64Array.from(perp[0]), P1 = Float64Array.from(perp[1]);
  const E0 = Float64Array.from(par[0]), E1 = Float64Array.from(par[1]);
  const inV = (K: ArrayLike<number>): boolean => {
    let lev = 0, x = -pg0, y = -pg1;
    for (let j = 0; j < n; j++) {
      lev += K[j];
      x += P0[j] * K[j];
      y += P1[j] * K[j];
    }
    const w = levels ? lev - lo : 0;
    if (w < 0 || w >= nW) return false;
    // polygonContains (planar-window.ts) on the flattened edges of window w.
    for (let e = wOff[w], end = wOff[w + 1]; e < end; e++) {
      const d = WN[2 * e] * x + WN[2 * e + 1] * y - WS[e];
      if (d > WT[e]) return false;
      if (d >= -WT[e] && !WC[e]) return false;
    }
    return wOff[w + 1] > wOff[w];
  };
  // Parallel position of K into (pxX, pxY); no allocation.
  let pxX = 0, pxY = 0;
  const px = (K: ArrayLike<number>): void => {
    let x = 0, y = 0;
    for (let j = 0; j < n; j++) {
      x += E0[j] * K[j];
      y += E1[j] * K[j];
    }
    pxX = x;
    pxY = y;
  };

  // Region to search and the cell, if any.
  let cell: [[number, number], [number, number]] | undefined;
  let periods: [number[], number[]] | undefined;
  let inRegion: (x: number, y: number) => boolean;
  let reduce: ((K: Int32Array) => void) | undefined;
  let estimate: number;
  if ('radius' in extent) {
    const R = extent.radius;
    estimate = spec.density * Math.PI * (R + 1) ** 2;
    checkPointCap(estimate, maxPoints, `a patch of radius ${R}`);
    const R2 = (R + 2) ** 2;
    inRegion = (x, y) => x * x + y * y <= R2;
  } else {
    const red = approximantCell(spec);
    periods = red.t;
    cell = red.a;
    const [[ax, ay], [bx, by]] = cell;
    const det = ax * by - ay * bx;
    estimate = spec.density * Math.abs(det);
    checkPointCap(estimate, maxPoints, 'the approximant cell');
    // Fractional coordinates f = x·B⁻¹ with B rows a, b.
    const mA = 2.5 / Math.hypot(ax, ay) / Math.abs(Math.sin(Math.atan2(by, bx) - Math.atan2(ay, ax)));
    const mB = 2.5 / Math.hypot(bx, by) / Math.abs(Math.sin(Math.atan2(by, bx) - Math.atan2(ay, ax)));
    inRegion = (x, y) => {
      const f = (x * by - y * bx) / det, g = (ay * x - ax * y) / -det;
      return f >= -mA && f <= 1 + mA && g >= -mB && g <= 1 + mB;
    };
    const t1 = Int32Array.from(periods[0]), t2 = Int32Array.from(periods[1]);
    // Representative of K modulo T: fractional coordinates in [−1e-9, 1 − 1e-9). Exact algebraic positions
    // never sit within 1e-9 of that shifted edge, so translates of one vertex always pick the same one.
    reduce = (K) => {
      px(K);
      const f = (pxX * by - pxY * bx) / det, g = (ay * pxX - ax * pxY) / -det;
      const i = Math.floor(f + 1e-9), k = Math.floor(g + 1e-9);
      if (i === 0 && k === 0) return;
      for (let j = 0; j < n; j++) K[j] -= i * t1[j] + k * t2[j];
    };
  }

  // Start: a vertex near the origin, among K_j ∈ ⌈γ_j⌉ + {−1, 0, 1} (the mesh of the dual grid at the
  // origin is one of them); the closest to the origin, ties by lexicographic K.
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
    px(cand);
    const d = Math.round((pxX * pxX + pxY * pxY) * 1e9);
    if (d < best) {
      best = d;
      start = cand.slice();
    }
  }
  if (!start) throw new Error('gamma: no vertex found near the origin (internal error)');

  // Breadth-first search over ±δ_j within the region. Step s changes K_{s>>1} by +1 (s even) or −1 (s odd);
  // nb[2n·v + s] records what lies there: a searched vertex's index, −1 (not a vertex: outside the window)
  // or −2 (a vertex outside the search region). The tile pass reads its corner tests from this table.
  // An edge found from one end is written into the other end's row too (−4 marks "not yet known"), so each
  // edge is looked up once.
  const n2 = 2 * n;
  const half = 2 ** Math.floor(52 / n) / 2;
  const seen = new IntVectorSet(n, Math.min(Math.ceil(1.2 * estimate) + 64, 4 * maxPoints + 1000), planarBound(n));
  let nb = new Int32Array(n2 * (seen.coords.length / n)).fill(-4);
  let vx = new Float64Array(seen.coords.length / n), vy = new Float64Array(seen.coords.length / n);
  const add = (K: Int32Array): number => {
    const i = seen.insert(K);
    if (i >= vx.length) {
      const m = 2 * vx.length;
      const nb2 = new Int32Array(n2 * m).fill(-4);
      nb2.set(nb);
      nb = nb2;
      const x2 = new Float64Array(m), y2 = new Float64Array(m);
      x2.set(vx);
      y2.set(vy);
      vx = x2;
      vy = y2;
    }
    vx[i] = pxX;
    vy[i] = pxY;
    return i;
  };
  px(start);
  add(start);
  const K = new Int32Array(n);
  for (let head = 0; head < seen.size; head++) {
    const pts = seen.coords;
    for (let j = 0; j < n; j++) K[j] = pts[head * n + j];
    for (let s = 0; s < n2; s++) {
      if (nb[head * n2 + s] !== -4) continue;
      // K = head ± δ_{s>>1}; the step is undone at the end of the iteration.
      const dj = s >> 1, step = s & 1 ? -1 : 1;
      const kj = (K[dj] += step);
      // Only K_{s>>1} moved, and the head was in range: its range check stands for the whole of K. The
      // searched set holds window points only, so outside the window there is nothing to look up.
      if (kj < -half || kj >= half) seen.indexOf(K);
      let r = -1;
      if (inV(K)) {
        r = seen.indexOf(K);
        if (r < 0) {
          px(K);
          r = inRegion(pxX, pxY) ? add(K) : -2;
        }
      }
      nb[head * n2 + s] = r;
      if (r > head) nb[r * n2 + (s ^ 1)] = head;
      K[dj] -= step;
    }
    if (seen.size > 4 * maxPoints + 1000) throw new Error('maxPoints: search grew past the estimate (internal error)');
  }
  const nV = seen.size;
  const vpts = seen.coords;

  // Output vertices in order of first use as a tile corner: outOf[v] for searched vertices, `extra` (with
  // extraOut) for the rare corner outside the search region.
  let outIdx = new Int32Array(n * Math.max(16, nV));
  let nOut = 0;
  const emit = (V: ArrayLike<number>, o: number): number => {
    if ((nOut + 1) * n > outIdx.length) {
      const b = new Int32Array(2 * outIdx.length);
      b.set(outIdx);
      outIdx = b;
    }
    for (let j = 0; j < n; j++) outIdx[nOut * n + j] = V[o + j];
    return nOut++;
  };
  const kindAB = new Int32Array(n * n), ccwAB = new Uint8Array(n * n);
  for (let a = 0; a < n; a++) {
    for (let b = a + 1; b < n; b++) {
      kindAB[a * n + b] = spec.kindOf(a, b);
      ccwAB[a * n + b] = par[0][a] * par[1][b] - par[1][a] * par[0][b] > 0 ? 1 : 0;
    }
  }
  // About one tile per vertex (Euler), so the estimate rarely needs a regrow.
  let kinds = new Uint8Array(Math.max(1024, Math.ceil(1.1 * Math.min(estimate, maxPoints))));
  let corners = new Uint32Array(4 * kinds.length);
  let nT = 0;
  const pushTile = (kd: number, c0: number, c1: number, c2: number, c3: number) => {
    if (nT >= kinds.length) {
      const k2 = new Uint8Array(2 * kinds.length);
      k2.set(kinds);
      kinds = k2;
      const c2a = new Uint32Array(2 * corners.length);
      c2a.set(corners);
      corners = c2a;
    }
    kinds[nT] = kd;
    corners[4 * nT] = c0;
    corners[4 * nT + 1] = c1;
    corners[4 * nT + 2] = c2;
    corners[4 * nT + 3] = c3;
    nT++;
  };
  const A = new Int32Array(n), B = new Int32Array(n), C = new Int32Array(n);

  if (!reduce) {
    // Quasiperiodic: faces with centre within R, bases in search order.
    const R = (extent as { radius: number }).radius;
    const outOf = new Int32Array(nV).fill(-1);
    const extra = new IntVectorSet(n, 64, planarBound(n));
    const extraOut: number[] = [];
    const outSearched = (v: number): number => {
      let o = outOf[v];
      if (o < 0) o = outOf[v] = emit(vpts, v * n);
      return o;
    };
    const outOther = (V: Int32Array): number => {
      const v = seen.indexOf(V);
      if (v >= 0) return outSearched(v);
      let e = extra.indexOf(V);
      if (e < 0) {
        e = extra.insert(V);
        extraOut.push(emit(V, 0));
      }
      return extraOut[e];
    };
    // Output index of corner K_v + δ_d1 (+ δ_d2 when d2 ≥ 0), searched index i or −2 / −3 when not searched.
    const corner = (i: number, v: number, V: Int32Array, d1: number, d2: number): number => {
      if (i >= 0) return outSearched(i);
      for (let j = 0; j < n; j++) V[j] = vpts[v * n + j];
      V[d1]++;
      if (d2 >= 0) V[d2]++;
      return outOther(V);
    };
    for (let v = 0; v < nV; v++) {
      const row = v * n2;
      for (let a = 0; a < n; a++) {
        const ia = nb[row + 2 * a];
        if (ia === -1) continue;
        for (let b = a + 1; b < n; b++) {
          const ib = nb[row + 2 * b];
          if (ib === -1) continue;
          // C = K + δ_a + δ_b: known from either neighbour's row when that neighbour was searched.
          const ic = ia >= 0 ? nb[ia * n2 + 2 * b] : ib >= 0 ? nb[ib * n2 + 2 * a] : -3;
          if (ic === -1) continue;
          if (ic === -3) {
            for (let j = 0; j < n; j++) C[j] = vpts[v * n + j];
            C[a]++;
            C[b]++;
            if (!inV(C)) continue;
          }
          const cx = vx[v] + (par[0][a] + par[0][b]) / 2, cy = vy[v] + (par[1][a] + par[1][b]) / 2;
          if (cx * cx + cy * cy > R * R) continue;
          // Corners counter-clockwise: K, K+δ_a, K+δ_a+δ_b, K+δ_b when det(e_a, e_b) > 0, else reversed.
          // Output indices are assigned in that call order.
          const oK = outSearched(v);
          let oA: number, oB: number, oC: number;
          if (ccwAB[a * n + b]) {
            oA = corner(ia, v, A, a, -1);
            oC = ic >= 0 ? outSearched(ic) : corner(-1, v, C, a, b);
            oB = corner(ib, v, B, b, -1);
            pushTile(kindAB[a * n + b], oK, oA, oC, oB);
          } else {
            oB = corner(ib, v, B, b, -1);
            oC = ic >= 0 ? outSearched(ic) : corner(-1, v, C, a, b);
            oA = corner(ia, v, A, a, -1);
            pushTile(kindAB[a * n + b], oK, oB, oC, oA);
          }
        }
      }
    }
  } else {
    // Approximant: faces whose base K is a cell representative; vertices are cell representatives too.
    const red = reduce;
    const reps = new IntVectorSet(n, Math.max(64, Math.ceil(estimate)), planarBound(n));
    const repOut: number[] = [];
    const W = new Int32Array(n);
    const vertexOf = (V: Int32Array): number => {
      W.set(V);
      red(W);
      let i = reps.indexOf(W);
      if (i < 0) {
        i = reps.insert(W);
        repOut.push(emit(W, 0));
      }
      return repOut[i];
    };
    // Cell representatives among the searched vertices, in search order.
    const keep = new IntVectorSet(n, Math.max(64, Math.ceil(estimate)), planarBound(n));
    for (let v = 0; v < nV; v++) {
      for (let j = 0; j < n; j++) W[j] = vpts[v * n + j];
      red(W);
      if (keep.indexOf(W) < 0) keep.insert(W);
    }
    // Output index of searched vertex i's representative, cached (vertexOf is idempotent).
    const repOf = new Int32Array(nV).fill(-1);
    const vertexOfSearched = (i: number): number => {
      let o = repOf[i];
      if (o < 0) {
        for (let j = 0; j < n; j++) C[j] = vpts[i * n + j];
        o = repOf[i] = vertexOf(C);
      }
      return o;
    };
    for (let v = 0; v < keep.size; v++) {
      for (let j = 0; j < n; j++) K[j] = keep.coords[v * n + j];
      vertexOf(K);
      // Corner tests from the neighbour table when the representative was searched (it nearly always is).
      const sv = seen.indexOf(K);
      for (let a = 0; a < n; a++) {
        for (let b = a + 1; b < n; b++) {
          const kd = kindAB[a * n + b];
          if (sv >= 0) {
            const row = sv * n2;
            const ia = nb[row + 2 * a], ib = nb[row + 2 * b];
            if (ia === -1 || ib === -1) continue;
            const ic = ia >= 0 ? nb[ia * n2 + 2 * b] : ib >= 0 ? nb[ib * n2 + 2 * a] : -3;
            if (ic === -1) continue;
            A.set(K);
            A[a]++;
            C.set(A);
            C[b]++;
            B.set(K);
            B[b]++;
            if (ic === -3 && !inV(C)) continue;
            const oK = vertexOf(K);
            if (ccwAB[a * n + b]) {
              const oA = ia >= 0 ? vertexOfSearched(ia) : vertexOf(A);
              const oC = ic >= 0 ? vertexOfSearched(ic) : vertexOf(C);
              const oB = ib >= 0 ? vertexOfSearched(ib) : vertexOf(B);
              pushTile(kd, oK, oA, oC, oB);
            } else {
              const oB = ib >= 0 ? vertexOfSearched(ib) : vertexOf(B);
              const oC = ic >= 0 ? vertexOfSearched(ic) : vertexOf(C);
              const oA = ia >= 0 ? vertexOfSearched(ia) : vertexOf(A);
              pushTile(kd, oK, oB, oC, oA);
            }
            continue;
          }
          A.set(K);
          A[a]++;
          C.set(A);
          C[b]++;
          B.set(K);
          B[b]++;
          if (!inV(A) || !inV(B) || !inV(C)) continue;
          if (ccwAB[a * n + b]) pushTile(kd, vertexOf(K), vertexOf(A), vertexOf(C), vertexOf(B));
          else pushTile(kd, vertexOf(K), vertexOf(B), vertexOf(C), vertexOf(A));
        }
      }
    }
  }

  const N = nOut;
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
    index: outIdx.slice(0, n * N),
    level,
    kind: kinds.slice(0, nT),
    corners: corners.slice(0, 4 * nT),
    cell,
    periods,
  };
}
