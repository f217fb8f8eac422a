import { describe, expect, it } from 'vitest';
import { determinant, identity, inverse, matVec, multiply, reciprocal, transpose, vecMat, type Mat3 } from '@/lib/math/mat3';
import { dot, norm } from '@/lib/math/vec3';
import { runPython } from '../../helpers/python';

const A: Mat3 = [
  [2.5, -1.25, 0.75],
  [0.5, 3.5, -2],
  [-1.5, 0.25, 4.125],
];
const B: Mat3 = [
  [0.3, 7.1, -2.2],
  [1.9, -0.4, 0.6],
  [5.5, 2.8, -3.3],
];
const v = [0.7, -1.3, 2.9];
/** Hexagonal cell a = 3.21 Å, c = 5.21 Å (a along x, b at 120°). */
const a = 3.21;
const c = 5.21;
const HEX: Mat3 = [
  [a, 0, 0],
  [-a / 2, (a * Math.sqrt(3)) / 2, 0],
  [0, 0, c],
];

const ref = runPython<{ det: number; inv: number[][]; ab: number[][]; mv: number[]; vm: number[]; hexRecip: number[][]; hexDet: number }>(
  `import sys, json, numpy as np
d = json.loads(sys.stdin.read())
A = np.array(d["A"]); B = np.array(d["B"]); v = np.array(d["v"]); H = np.array(d["H"])
print(json.dumps({
  "det": np.linalg.det(A), "inv": np.linalg.inv(A).tolist(), "ab": (A @ B).tolist(),
  "mv": (A @ v).tolist(), "vm": (v @ A).tolist(),
  "hexRecip": np.linalg.inv(H).T.tolist(), "hexDet": np.linalg.det(H),
}))`,
  JSON.stringify({ A, B, v, H: HEX }),
);

const expectMat = (m: number[][], r: number[][], digits = 12) => m.forEach((row, i) => row.forEach((x, k) => expect(x).toBeCloseTo(r[i][k], digits)));

describe('3×3 matrices against numpy (reference library)', () => {
  it('determinant, inverse, product, M·v and v·M match numpy.linalg', () => {
    expect(determinant(A)).toBeCloseTo(ref.det, 12);
    expectMat(inverse(A), ref.inv);
    expectMat(multiply(A, B), ref.ab);
    matVec(A, v).forEach((x, k) => expect(x).toBeCloseTo(ref.mv[k], 12));
    vecMat(v, A).forEach((x, k) => expect(x).toBeCloseTo(ref.vm[k], 12));
  });

  it('reciprocal lattice of a hexagonal cell = rows of inv(M)ᵀ (numpy.linalg.inv)', () => {
    expectMat(reciprocal(HEX), ref.hexRecip, 14);
    expect(determinant(HEX)).toBeCloseTo(ref.hexDet, 12);
  });
});

describe('3×3 matrices against textbook values', () => {
  it('hexagonal reciprocal lattice: |a*| = |b*| = 2/(√3 a), |c*| = 1/c, γ* = 60° (International Tables Vol. B §1.1)', () => {
    const [as, bs, cs] = reciprocal(HEX);
    expect(norm(as)).toBeCloseTo(2 / (Math.sqrt(3) * a), 14);
    expect(norm(bs)).toBeCloseTo(2 / (Math.sqrt(3) * a), 14);
    expect(norm(cs)).toBeCloseTo(1 / c, 14);
    expect((Math.acos(dot(as, bs) / (norm(as) * norm(bs))) * 180) / Math.PI).toBeCloseTo(60, 10);
  });

  it('a_i · a_j* = δ_ij, and M·M⁻¹ = I', () => {
    const r = reciprocal(A);
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expect(dot(A[i], r[j])).toBeCloseTo(i === j ? 1 : 0, 14);
    expectMat(multiply(A, inverse(A)), identity(), 14);
  });

  it('determinant of a permutation is its sign; transpose swaps indices', () => {
    expect(determinant([[0, 1, 0], [1, 0, 0], [0, 0, 1]])).toBe(-1);
    expect(determinant([[0, 1, 0], [0, 0, 1], [1, 0, 0]])).toBe(1);
    expect(transpose(A)[0]).toEqual([A[0][0], A[1][0], A[2][0]]);
    expect(transpose(A)[2][1]).toBe(A[1][2]);
  });

  it('degenerate rows throw, whatever the unit of length: a 10⁻⁵ Å cube inverts, coplanar rows do not', () => {
    expect(() => reciprocal([[1, 0, 0], [0, 1, 0], [1, 1, 0]])).toThrow(/degenerate/);
    expect(() => reciprocal([[1e6, 0, 0], [0, 1e6, 0], [1e6, 1e6, 1e-9]])).toThrow(/degenerate/);
    expect(reciprocal([[1e-5, 0, 0], [0, 1e-5, 0], [0, 0, 1e-5]])[2][2]).toBeCloseTo(1e5, 6);
  });
});
