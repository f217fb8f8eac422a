/**
 * The minimum image in a 3D periodic cell: of all displacements d − (n·a + m·b + l·c), n m l integers, the
 * shortest. Two atoms that sit on opposite faces of an approximant cell are neighbours across the face; a
 * distance measured between them means something only in this form (the minimum image convention of
 * periodic simulations, e.g. Allen & Tildesley, Computer Simulation of Liquids, §1.5 — cited from memory).
 *
 * How the search is bounded, for any cell. Let x be the lattice point nearest to d and r = d − x. Then r lies
 * in the Voronoi cell of the origin: |r·g| ≤ |g|²/2 for every lattice vector g, in particular for the basis
 * rows b_i. Write r = Σ f_j b_j; with the Gram matrix G_ij = b_i·b_j this is G·f = (r·b_i), so
 *     |f_j| ≤ β_j = Σ_i |(G⁻¹)_ji| · G_ii / 2.
 * The coefficients of x are d's own coordinates φ minus f, so each lies within β_j of φ_j, and only the
 * integers in those three intervals need to be tried. The bound holds in any basis; reducing the basis
 * first (LLL) keeps the β_j near ½, so a cubic or orthorhombic cell tries at most 2 × 2 × 2 points and a
 * badly skewed cell not many more.
 */
import type { Cell } from '../math/cell';
import { determinant, inverse, type Mat3 } from '../math/mat3';
import { dot, type Vec3 } from '../math/vec3';

export interface PeriodicImage {
  /** The shortest displacement d − t, in Å. */
  vector: Vec3;
  /** The lattice translation t removed, as integer multiples [n m l] of the cell rows a, b, c. */
  shift: Vec3;
}

/** LLL-reduce three rows (δ = 3/4): size-reduce each row against the earlier ones, swap while the Lovász condition fails. */
function lllReduce(rows: Cell): Cell {
  // Lenstra, Lenstra & Lovász, Math. Ann. 261 (1982) 515; the textbook form of Cohen, A Course in
  // Computational Algebraic Number Theory (1993), Alg. 2.6.3. Three vectors: Gram–Schmidt is redone from
  // scratch after every change, which costs nothing here and keeps the code plain.
  const b: Vec3[] = rows.map((r) => [r[0], r[1], r[2]] as Vec3);
  const gramSchmidt = () => {
    const star: Vec3[] = [];
    const mu = [
      [0, 0, 0],
      [0, 0, 0],
      [0, 0, 0],
    ];
    const len2: number[] = [];
    for (let i = 0; i < 3; i++) {
      const v: Vec3 = [...b[i]];
      for (let j = 0; j < i; j++) {
        mu[i][j] = dot(b[i], star[j]) / len2[j];
        for (let d = 0; d < 3; d++) v[d] -= mu[i][j] * star[j][d];
      }
      star.push(v);
      len2.push(dot(v, v));
    }
    return { mu, len2 };
  };
  let k = 1;
  for (let guard = 0; k < 3 && guard < 10_000; guard++) {
    for (let j = k - 1; j >= 0; j--) {
      const q = Math.round(gramSchmidt().mu[k][j]);
      if (q !== 0) for (let d = 0; d < 3; d++) b[k][d] -= q * b[j][d];
    }
    const { mu, len2 } = gramSchmidt();
    if (len2[k] >= (0.75 - mu[k][k - 1] ** 2) * len2[k - 1]) k++;
    else {
      [b[k], b[k - 1]] = [b[k - 1], b[k]];
      k = Math.max(k - 1, 1);
    }
  }
  return [b[0], b[1], b[2]];
}

/** A 3D period lattice and the minimum image of displacements in it. */
export class PeriodicCell {
  /** The cell as given (rows a, b, c, Å). */
  readonly cell: Cell;
  /** An LLL-reduced basis of the same lattice. */
  readonly reduced: Cell;
  private readonly toReduced: Mat3;
  private readonly toCell: Mat3;
  private readonly bound: Vec3;

  constructor(cell: Cell) {
    this.cell = cell;
    const scale = Math.max(...cell.map((r) => Math.abs(r[0]) + Math.abs(r[1]) + Math.abs(r[2])));
    if (!(Math.abs(determinant(cell)) > 1e-12 * scale ** 3)) throw new RangeError('cell: the three cell vectors are coplanar');
    this.reduced = lllReduce(cell);
    this.toReduced = inverse(this.reduced);
    this.toCell = inverse(cell);
    const g = this.reduced.map((u) => this.reduced.map((v) => dot(u, v))) as Mat3;
    const gi = inverse(g);
    this.bound = [0, 1, 2].map((j) => [0, 1, 2].reduce((s, i) => s + (Math.abs(gi[j][i]) * g[i][i]) / 2, 0)) as Vec3;
  }

  /** Coordinates of d in the basis `m⁻¹` belongs to: d = Σ f_i m_i. */
  private static coords(d: Vec3, inv: Mat3): Vec3 {
    return [0, 1, 2].map((j) => d[0] * inv[0][j] + d[1] * inv[1][j] + d[2] * inv[2][j]) as Vec3;
  }

  /** The shortest image of displacement d and the lattice translation that gives it. */
  nearest(d: Vec3): PeriodicImage {
    const phi = PeriodicCell.coords(d, this.toReduced);
    const r = this.reduced;
    const lo = phi.map((p, j) => Math.ceil(p - this.bound[j] - 1e-9));
    const hi = phi.map((p, j) => Math.floor(p + this.bound[j] + 1e-9));
    let best: Vec3 = [d[0], d[1], d[2]];
    let bestLen = Infinity;
    for (let n0 = lo[0]; n0 <= hi[0]; n0++) {
      for (let n1 = lo[1]; n1 <= hi[1]; n1++) {
        for (let n2 = lo[2]; n2 <= hi[2]; n2++) {
          const v: Vec3 = [0, 1, 2].map((k) => d[k] - n0 * r[0][k] - n1 * r[1][k] - n2 * r[2][k]) as Vec3;
          const len = dot(v, v);
          // Exact ties (d half-way between two images) keep the first candidate met: deterministic.
          if (len < bestLen) {
            bestLen = len;
            best = v;
          }
        }
      }
    }
    const t = PeriodicCell.coords([d[0] - best[0], d[1] - best[1], d[2] - best[2]], this.toCell).map(Math.round) as Vec3;
    // + 0 turns a −0 from rounding into 0, so shifts compare and print cleanly.
    return { vector: best, shift: t.map((x) => x + 0) as Vec3 };
  }

  /** The shortest image of d, in Å. */
  minimumImage(d: Vec3): Vec3 {
    return this.nearest(d).vector;
  }
}
