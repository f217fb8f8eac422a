/**
 * The face (K; a, b), a < b, is the rhombus K, K+δ_a, K+δ_a+δ_b, K+δ_b (de Bruijn 1981: the four meshes of
 * the dual grid around one grid crossing). Its kind, corner order and centre offset depend on (a, b) only,
 * so the tile passes read them from n×n tables filled once.
 */
import type { PlanarSpec } from './spec';

export interface FaceTable {
  n: number;
  /** Tile kind of face (a, b) at a·n + b. */
  kind: Int32Array;
  /** 1 when det(e_a, e_b) > 0: the corners K, K+δ_a, K+δ_a+δ_b, K+δ_b run counter-clockwise; else reversed. */
  ccw: Uint8Array;
  /** Centre of face (a, b) relative to K: (e_a + e_b)/2, x and y. */
  midX: Float64Array;
  midY: Float64Array;
}

export function faceTable(spec: PlanarSpec): FaceTable {
  const { n, par } = spec;
  const kind = new Int32Array(n * n), ccw = new Uint8Array(n * n);
  const midX = new Float64Array(n * n), midY = new Float64Array(n * n);
  for (let a = 0; a < n; a++) {
    for (let b = a + 1; b < n; b++) {
      kind[a * n + b] = spec.kindOf(a, b);
      ccw[a * n + b] = par[0][a] * par[1][b] - par[1][a] * par[0][b] > 0 ? 1 : 0;
      midX[a * n + b] = (par[0][a] + par[0][b]) / 2;
      midY[a * n + b] = (par[1][a] + par[1][b]) / 2;
    }
  }
  return { n, kind, ccw, midX, midY };
}
