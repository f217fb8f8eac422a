/**
 * The acceptance window of a planar cut, one convex polygon per index level, flattened for the vertex test.
 *
 * Vertex rule (de Bruijn 1981, Proc. K. Ned. Akad. Wet. A 84, 39–66): K ∈ Zⁿ is a vertex iff
 * K − γ − y ∈ [0,1]ⁿ for some y in the cut plane E, i.e. iff P(K − γ) lies in the projection by P of
 * [0,1]ⁿ ∩ {Σλ = ΣK − Σγ} (with index levels, n = 5) or of [0,1]ⁿ (without, n = 4). The test runs once per
 * step of the search and once per untested tile corner, so the edges of all level windows sit in flat typed
 * arrays instead of Polygon objects.
 */
import { convexPolygon, type Polygon } from './window';
import type { PlanarSpec } from './spec';

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
 * Windows by index level with the point-in-window test `contains(K)`. With levels only ΣK ∈ (Σγ, Σγ + n)
 * has a slice of positive area, so the levels lo … lo + n + 1 (lo = ⌊Σγ⌋) cover every non-empty window and
 * all others are empty; Penrose levels ΣK − Σγ ∈ {0, 5} hold no vertices. Without levels there is one window.
 */
export class WindowTable {
  private readonly n: number;
  private readonly levels: boolean;
  /** Lowest tabled level ⌊Σγ⌋ (0 without levels). */
  private readonly lo: number;
  /** Number of tabled windows. */
  private readonly nW: number;
  /** Window w has edges wOff[w] … wOff[w+1] − 1 (none when its slice is empty). */
  private readonly wOff: Int32Array;
  /** Per edge: unit outward normal (x y), support value, tolerance, closed flag (window.ts). */
  private readonly WN: Float64Array;
  private readonly WS: Float64Array;
  private readonly WT: Float64Array;
  private readonly WC: Uint8Array;
  /** Rows of P, and P γ, so that P(K − γ) = P K − P γ without a temporary. */
  private readonly P0: Float64Array;
  private readonly P1: Float64Array;
  private readonly pg0: number;
  private readonly pg1: number;

  constructor(spec: PlanarSpec) {
    const { n, perp, gamma } = spec;
    const sumGamma = gamma.reduce((a, b) => a + b, 0);
    let pg0 = 0, pg1 = 0;
    for (let j = 0; j < n; j++) {
      pg0 += perp[0][j] * gamma[j];
      pg1 += perp[1][j] * gamma[j];
    }
    const lo = spec.levels ? Math.floor(sumGamma) : 0;
    const wins: (Polygon | null)[] = [];
    for (let level = lo; level <= (spec.levels ? lo + n + 1 : lo); level++) {
      const c = level - sumGamma;
      wins.push(spec.levels ? (c > 0 && c < n ? sliceWindow(perp, n, c) : null) : sliceWindow(perp, n, null));
    }
    const nW = wins.length;
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
    this.n = n;
    this.levels = spec.levels;
    this.lo = lo;
    this.nW = nW;
    this.wOff = wOff;
    this.WN = WN;
    this.WS = WS;
    this.WT = WT;
    this.WC = WC;
    this.P0 = Float64Array.from(perp[0]);
    this.P1 = Float64Array.from(perp[1]);
    this.pg0 = pg0;
    this.pg1 = pg1;
  }

  /** K is a vertex of the cut: P(K − γ) lies in the window of level ΣK, half-open as in window.ts. */
  contains(K: ArrayLike<number>): boolean {
    const { n, P0, P1, wOff, WN, WS, WT, WC } = this;
    let lev = 0, x = -this.pg0, y = -this.pg1;
    for (let j = 0; j < n; j++) {
      lev += K[j];
      x += P0[j] * K[j];
      y += P1[j] * K[j];
    }
    const w = this.levels ? lev - this.lo : 0;
    if (w < 0 || w >= this.nW) return false;
    // polygonContains (window.ts) on the flattened edges of window w.
    for (let e = wOff[w], end = wOff[w + 1]; e < end; e++) {
      const d = WN[2 * e] * x + WN[2 * e + 1] * y - WS[e];
      if (d > WT[e]) return false;
      if (d >= -WT[e] && !WC[e]) return false;
    }
    return wOff[w + 1] > wOff[w];
  }
}
