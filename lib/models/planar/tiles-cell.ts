/**
 * Tiles of an approximant cell: one per class of faces modulo the period lattice T. Faces are taken at
 * the cell representatives K of the searched vertices, and every corner is numbered by its own
 * representative, so a tile crossing the cell boundary refers to the vertices inside the cell. The corner
 * tests come from the neighbour table when the representative was searched (it nearly always is), else
 * from the window.
 */
import { IntVectorSet } from '../../math/int-vector-set';
import type { FaceTable } from './faces';
import type { TilingOutput } from './output';
import type { CellRegion } from './region';
import { planarBound, type VertexSearch } from './search';
import type { WindowTable } from './window-table';

/** Output numbers of cell vertices: one per representative, assigned on first use. */
class CellVertices {
  private readonly n: number;
  private readonly region: CellRegion;
  private readonly out: TilingOutput;
  private readonly search: VertexSearch;
  private readonly reps: IntVectorSet;
  private readonly repOut: number[] = [];
  /** Output number of searched vertex i's representative, −1 until first asked (vertexOf is idempotent). */
  private readonly repOf: Int32Array;
  private readonly W: Int32Array;
  private readonly S: Int32Array;

  constructor(search: VertexSearch, region: CellRegion, out: TilingOutput) {
    this.n = search.n;
    this.region = region;
    this.out = out;
    this.search = search;
    this.reps = new IntVectorSet(search.n, Math.max(64, Math.ceil(region.estimate)), planarBound(search.n));
    this.repOf = new Int32Array(search.size).fill(-1);
    this.W = new Int32Array(search.n);
    this.S = new Int32Array(search.n);
  }

  /** Output number of the representative of V (V is left as it is). */
  vertexOf(V: Int32Array): number {
    const W = this.W;
    W.set(V);
    this.region.reduce(W);
    let i = this.reps.indexOf(W);
    if (i < 0) {
      i = this.reps.insert(W);
      this.repOut.push(this.out.emit(W, 0));
    }
    return this.repOut[i];
  }

  /** vertexOf for searched vertex i, cached. */
  searched(i: number): number {
    let o = this.repOf[i];
    if (o < 0) {
      const n = this.n, S = this.S, vpts = this.search.seen.coords;
      for (let j = 0; j < n; j++) S[j] = vpts[i * n + j];
      o = this.repOf[i] = this.vertexOf(S);
    }
    return o;
  }
}

/** Cell representatives of the searched vertices, in search order. */
function representatives(search: VertexSearch, region: CellRegion): IntVectorSet {
  const n = search.n, nV = search.size, vpts = search.seen.coords;
  const keep = new IntVectorSet(n, Math.max(64, Math.ceil(region.estimate)), planarBound(n));
  const W = new Int32Array(n);
  for (let v = 0; v < nV; v++) {
    for (let j = 0; j < n; j++) W[j] = vpts[v * n + j];
    region.reduce(W);
    if (keep.indexOf(W) < 0) keep.insert(W);
  }
  return keep;
}

/** Append the cell's tiles to `out`, bases in order of the representatives, corners counter-clockwise. */
export function cellTiles(
  search: VertexSearch,
  win: WindowTable,
  faces: FaceTable,
  region: CellRegion,
  out: TilingOutput,
): void {
  const n = search.n, n2 = 2 * n;
  const { nb, seen } = search;
  const keep = representatives(search, region);
  const verts = new CellVertices(search, region, out);
  const K = new Int32Array(n), A = new Int32Array(n), B = new Int32Array(n), C = new Int32Array(n);
  for (let v = 0; v < keep.size; v++) {
    for (let j = 0; j < n; j++) K[j] = keep.coords[v * n + j];
    // The base is numbered first, before any of its tiles' other corners.
    verts.vertexOf(K);
    const sv = seen.indexOf(K);
    for (let a = 0; a < n; a++) {
      for (let b = a + 1; b < n; b++) {
        const kd = faces.kind[a * n + b];
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
          if (ic === -3 && !win.contains(C)) continue;
          // Corners counter-clockwise (faces.ts); output numbers are assigned in that call order.
          const oK = verts.vertexOf(K);
          if (faces.ccw[a * n + b]) {
            const oA = ia >= 0 ? verts.searched(ia) : verts.vertexOf(A);
            const oC = ic >= 0 ? verts.searched(ic) : verts.vertexOf(C);
            const oB = ib >= 0 ? verts.searched(ib) : verts.vertexOf(B);
            out.pushTile(kd, oK, oA, oC, oB);
          } else {
            const oB = ib >= 0 ? verts.searched(ib) : verts.vertexOf(B);
            const oC = ic >= 0 ? verts.searched(ic) : verts.vertexOf(C);
            const oA = ia >= 0 ? verts.searched(ia) : verts.vertexOf(A);
            out.pushTile(kd, oK, oB, oC, oA);
          }
          continue;
        }
        A.set(K);
        A[a]++;
        C.set(A);
        C[b]++;
        B.set(K);
        B[b]++;
        if (!win.contains(A) || !win.contains(B) || !win.contains(C)) continue;
        if (faces.ccw[a * n + b]) out.pushTile(kd, verts.vertexOf(K), verts.vertexOf(A), verts.vertexOf(C), verts.vertexOf(B));
        else out.pushTile(kd, verts.vertexOf(K), verts.vertexOf(B), verts.vertexOf(C), verts.vertexOf(A));
      }
    }
  }
}
