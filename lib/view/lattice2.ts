/**
 * A 2D period lattice (the in-plane cell of a planar approximant) and the minimum image of a displacement
 * in it: of all the displacements d − i·a − j·b (i, j integers) the shortest. Tiles and vertex
 * neighbourhoods of a periodic tiling are stored with their corners wrapped into one cell, so every
 * vector between two corners has to be read this way before it means anything.
 */

export type Vec2 = [number, number];

export class Lattice2 {
  /** The cell as given (rows a, b), for drawing the cell and its translates. */
  readonly a: Vec2;
  readonly b: Vec2;
  /** A Lagrange–Gauss reduced basis of the same lattice, for the minimum-image search. */
  readonly u: Vec2;
  readonly v: Vec2;
  /** det(a, b): the signed cell area. */
  readonly det: number;
  private readonly detUV: number;

  constructor(a: Vec2, b: Vec2) {
    const det = a[0] * b[1] - a[1] * b[0];
    if (!(Math.abs(det) > 1e-12 * (a[0] * a[0] + a[1] * a[1] + b[0] * b[0] + b[1] * b[1]))) {
      throw new RangeError('cell: the two cell vectors are parallel');
    }
    this.a = [a[0], a[1]];
    this.b = [b[0], b[1]];
    this.det = det;
    // Lagrange–Gauss reduction (Cohen, A Course in Computational Algebraic Number Theory, 1993, Alg. 1.3.14):
    // afterwards |u| ≤ |v| and |u·v| ≤ |u|²/2.
    let u: Vec2 = [a[0], a[1]];
    let v: Vec2 = [b[0], b[1]];
    for (let it = 0; it < 200; it++) {
      if (v[0] * v[0] + v[1] * v[1] < u[0] * u[0] + u[1] * u[1]) [u, v] = [v, u];
      const mu = Math.round((u[0] * v[0] + u[1] * v[1]) / (u[0] * u[0] + u[1] * u[1]));
      if (mu === 0) break;
      v = [v[0] - mu * u[0], v[1] - mu * u[1]];
    }
    this.u = u;
    this.v = v;
    this.detUV = u[0] * v[1] - u[1] * v[0];
  }

  /** Fractional coordinates (f, g) of (x, y) in the given cell: (x, y) = f·a + g·b. */
  fractional(x: number, y: number): Vec2 {
    const [ax, ay] = this.a;
    const [bx, by] = this.b;
    return [(x * by - y * bx) / this.det, (ax * y - ay * x) / this.det];
  }

  /**
   * Minimum image of (dx, dy), written to out[o], out[o + 1].
   *
   * Why nine candidates are enough: write the shortest image r = d − (m·u + n·v) = f·u + g·v. It lies in
   * the Voronoi cell, so |r·u| ≤ |u|²/2 and |r·v| ≤ |v|²/2. With μ = u·v/|u|² and ν = u·v/|v|² (both at
   * most ½ in size for a reduced basis) that reads f + μg = α, νf + g = β with |α|, |β| ≤ ½, so
   * |f|, |g| ≤ (½ + ¼)/(1 − ¼) = 1. The coefficients m, n of the nearest lattice point are therefore within 1
   * of d's own fractional coordinates, hence within 1 of their rounded values.
   */
  minimumImage(dx: number, dy: number, out: { [i: number]: number }, o = 0): void {
    const [ux, uy] = this.u;
    const [vx, vy] = this.v;
    const m0 = Math.round((dx * vy - dy * vx) / this.detUV);
    const n0 = Math.round((ux * dy - uy * dx) / this.detUV);
    let bx = dx, by = dy, best = Infinity;
    for (let m = m0 - 1; m <= m0 + 1; m++) {
      for (let n = n0 - 1; n <= n0 + 1; n++) {
        const x = dx - m * ux - n * vx;
        const y = dy - m * uy - n * vy;
        const r2 = x * x + y * y;
        // Ties (a point exactly half-way) go to the first candidate met, so the answer is deterministic.
        if (r2 < best) {
          best = r2;
          bx = x;
          by = y;
        }
      }
    }
    out[o] = bx;
    out[o + 1] = by;
  }

  /** Length of the shortest non-zero lattice vector (|u| of the reduced basis). */
  shortest(): number {
    return Math.hypot(this.u[0], this.u[1]);
  }
}
