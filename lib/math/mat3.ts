/**
 * 3×3 matrices as three rows [[m00, m01, m02], [m10, m11, m12], [m20, m21, m22]]. A cell is the matrix
 * whose rows are the lattice vectors a, b, c, so a point with fractional coordinates f sits at r = f·M
 * (row vector times matrix), the convention of International Tables Vol. B §1.1 and of ase's Cell.
 * Operation orders are fixed (see vec3.ts): determinants and reciprocal vectors feed output bytes.
 */
import { cross, dot, norm, type Vec3 } from './vec3';

/** Rows of a 3×3 matrix. */
export type Mat3 = [Vec3, Vec3, Vec3];

export function identity(): Mat3 {
  return [
    [1, 0, 0],
    [0, 1, 0],
    [0, 0, 1],
  ];
}

/**
 * det M by cofactor expansion along the first row,
 * m00(m11m22 − m12m21) − m01(m10m22 − m12m20) + m02(m10m21 − m11m20).
 * For a cell this is the signed volume a·(b×c) (bit for bit: x − y = −(y − x) in IEEE arithmetic).
 */
export function determinant(m: ArrayLike<ArrayLike<number>>): number {
  const [a, b, c] = [m[0], m[1], m[2]];
  return a[0] * (b[1] * c[2] - b[2] * c[1]) - a[1] * (b[0] * c[2] - b[2] * c[0]) + a[2] * (b[0] * c[1] - b[1] * c[0]);
}

export function transpose(m: Mat3): Mat3 {
  return [
    [m[0][0], m[1][0], m[2][0]],
    [m[0][1], m[1][1], m[2][1]],
    [m[0][2], m[1][2], m[2][2]],
  ];
}

/** A·B: (AB)ᵢⱼ = Σₖ Aᵢₖ Bₖⱼ, summed k = 0, 1, 2. */
export function multiply(a: Mat3, b: Mat3): Mat3 {
  const row = (r: Vec3): Vec3 => [
    r[0] * b[0][0] + r[1] * b[1][0] + r[2] * b[2][0],
    r[0] * b[0][1] + r[1] * b[1][1] + r[2] * b[2][1],
    r[0] * b[0][2] + r[1] * b[1][2] + r[2] * b[2][2],
  ];
  return [row(a[0]), row(a[1]), row(a[2])];
}

/** M·v (column vector): component i is row i · v. Rotations act this way on Cartesian points. */
export function matVec(m: Mat3, v: ArrayLike<number>): Vec3 {
  return [dot(m[0], v), dot(m[1], v), dot(m[2], v)];
}

/**
 * v·M (row vector): v₀·row₀ + v₁·row₁ + v₂·row₂. With M a cell and v fractional coordinates this is the
 * Cartesian point; with M the reciprocal basis and v = (h, k, l) it is the reciprocal vector G_hkl.
 */
export function vecMat(v: ArrayLike<number>, m: Mat3): Vec3 {
  return [
    v[0] * m[0][0] + v[1] * m[1][0] + v[2] * m[2][0],
    v[0] * m[0][1] + v[1] * m[1][1] + v[2] * m[2][1],
    v[0] * m[0][2] + v[1] * m[1][2] + v[2] * m[2][2],
  ];
}

/**
 * Reciprocal basis, rows a* = (b × c)/V, b* = (c × a)/V, c* = (a × b)/V with V = det M, so that
 * a_i · a_j* = δ_ij (crystallographers' convention without 2π; International Tables Vol. B §1.1.2).
 * Equal to (M⁻¹)ᵀ. Throws when the rows are (nearly) linearly dependent: |V| ≤ 1e-12·|a||b||c|, a test
 * that does not depend on the unit of length (|V| ≤ |a||b||c| by Hadamard's inequality).
 */
export function reciprocal(m: Mat3): Mat3 {
  const [a, b, c] = m;
  const v = determinant(m);
  if (!(Math.abs(v) > 1e-12 * norm(a) * norm(b) * norm(c))) throw new RangeError('cell vectors are degenerate (zero volume)');
  const bc = cross(b, c);
  const ca = cross(c, a);
  const ab = cross(a, b);
  return [
    [bc[0] / v, bc[1] / v, bc[2] / v],
    [ca[0] / v, ca[1] / v, ca[2] / v],
    [ab[0] / v, ab[1] / v, ab[2] / v],
  ];
}

/** M⁻¹ = adj(M)/det M, the transpose of the reciprocal basis (its columns are b×c, c×a, a×b over det M). */
export function inverse(m: Mat3): Mat3 {
  return transpose(reciprocal(m));
}
