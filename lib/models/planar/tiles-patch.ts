/**
 * Tiles of a quasiperiodic patch: every face (K; a, b) with K searched, all four corners vertices and its
 * centre K + (e_a + e_b)/2 within the radius. In a non-singular cut (the half-open window rule is one) a
 * face is a tile iff its four corners are vertices (de Bruijn 1981), so tiles are found by corner tests,
 * read from the neighbour table where the search already made them.
 */
import { IntVectorSet } from '../../math/int-vector-set';
import type { FaceTable } from './faces';
import type { TilingOutput } from './output';
import { planarBound, type VertexSearch } from './search';
import type { WindowTable } from './window-table';

/**
 * Output numbers of patch vertices, assigned on first use: outOf[v] for searched vertices, and a small set
 * (with extraOut) for the rare corner the search did not reach.
 */
class PatchVertices {
  private readonly n: number;
  private readonly search: VertexSearch;
  private readonly out: TilingOutput;
  private readonly outOf: Int32Array;
  private readonly extra: IntVectorSet;
  private readonly extraOut: number[] = [];

  constructor(search: VertexSearch, out: TilingOutput) {
    this.n = search.n;
    this.search = search;
    this.out = out;
    this.outOf = new Int32Array(search.size).fill(-1);
    this.extra = new IntVectorSet(search.n, 64, planarBound(search.n));
  }

  /** Output number of searched vertex v. */
  searched(v: number): number {
    let o = this.outOf[v];
    if (o < 0) o = this.outOf[v] = this.out.emit(this.search.seen.coords, v * this.n);
    return o;
  }

  /** Output number of vertex V, searched or not. */
  other(V: Int32Array): number {
    const v = this.search.seen.indexOf(V);
    if (v >= 0) return this.searched(v);
    let e = this.extra.indexOf(V);
    if (e < 0) {
      e = this.extra.insert(V);
      this.extraOut.push(this.out.emit(V, 0));
    }
    return this.extraOut[e];
  }

  /**
   * Output number of corner K_v + δ_d1 (+ δ_d2 when d2 ≥ 0): i is its searched index, or −2 / −3 when it
   * was not searched, and then V (scratch) receives its K.
   */
  corner(i: number, v: number, V: Int32Array, d1: number, d2: number): number {
    if (i >= 0) return this.searched(i);
    const n = this.n, vpts = this.search.seen.coords;
    for (let j = 0; j < n; j++) V[j] = vpts[v * n + j];
    V[d1]++;
    if (d2 >= 0) V[d2]++;
    return this.other(V);
  }
}

/** Append the patch's tiles to `out`, bases in search order, corners counter-clockwise. */
export function patchTiles(
  search: VertexSearch,
  win: WindowTable,
  faces: FaceTable,
  radius: number,
  out: TilingOutput,
): void {
  const n = search.n, n2 = 2 * n, nV = search.size;
  const { nb, vx, vy } = search;
  const vpts = search.seen.coords;
  const R = radius;
  const verts = new PatchVertices(search, out);
  const A = new Int32Array(n), B = new Int32Array(n), C = new Int32Array(n);
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
          if (!win.contains(C)) continue;
        }
        const cx = vx[v] + faces.midX[a * n + b], cy = vy[v] + faces.midY[a * n + b];
        if (cx * cx + cy * cy > R * R) continue;
        // Corners counter-clockwise: K, K+δ_a, K+δ_a+δ_b, K+δ_b when det(e_a, e_b) > 0, else reversed.
        // Output numbers are assigned in that call order.
        const oK = verts.searched(v);
        let oA: number, oB: number, oC: number;
        if (faces.ccw[a * n + b]) {
          oA = verts.corner(ia, v, A, a, -1);
          oC = ic >= 0 ? verts.searched(ic) : verts.corner(-1, v, C, a, b);
          oB = verts.corner(ib, v, B, b, -1);
          out.pushTile(faces.kind[a * n + b], oK, oA, oC, oB);
        } else {
          oB = verts.corner(ib, v, B, b, -1);
          oC = ic >= 0 ? verts.searched(ic) : verts.corner(-1, v, C, a, b);
          oA = verts.corner(ia, v, A, a, -1);
          out.pushTile(faces.kind[a * n + b], oK, oB, oC, oA);
        }
      }
    }
  }
}
