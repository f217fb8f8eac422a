import { describe, expect, it } from 'vitest';
import { icosahedralBasis, toPar, toPerp, toHyper, reciprocalBasis, inHyperlattice, inReciprocalLattice, hyperlatticeSteps, hyperlatticeCellVolume } from '../../../../lib/models/icosahedral/hyperlattice';
import { TAU } from '../../../../lib/math/golden';

const dot = (m: Float64Array, i: number, n: Float64Array, j: number) =>
  m[3 * i] * n[3 * j] + m[3 * i + 1] * n[3 * j + 1] + m[3 * i + 2] * n[3 * j + 2];

describe('icosahedral hyperlattice basis', () => {
  const aR = 4.6;
  const b = icosahedralBasis(aR);

  it('τ is the golden mean, τ² = τ + 1 (OEIS A001622: 1.6180339887…)', () => {
    expect(TAU).toBeCloseTo(1.6180339887498949, 15);
    expect(TAU * TAU).toBeCloseTo(TAU + 1, 14);
  });

  it('the six parallel vectors are five-fold axes: any two meet at arccos(1/√5) = 63.435° (icosahedron geometry, handbook value)', () => {
    for (let i = 0; i < 6; i++) {
      expect(Math.sqrt(dot(b.par, i, b.par, i))).toBeCloseTo(aR, 12);
      expect(Math.sqrt(dot(b.perp, i, b.perp, i))).toBeCloseTo(aR, 12);
      for (let j = i + 1; j < 6; j++) {
        expect(Math.abs(dot(b.par, i, b.par, j)) / aR ** 2).toBeCloseTo(1 / Math.sqrt(5), 12);
        expect(Math.abs(dot(b.perp, i, b.perp, j)) / aR ** 2).toBeCloseTo(1 / Math.sqrt(5), 12);
      }
    }
  });

  it('perp is the Galois conjugate: e_i∥·e_j∥ = c·aR²/√5 ⇒ e_i⊥·e_j⊥ = −c·aR²/√5 (conjugation flips √5; Elser 1986, from memory)', () => {
    for (let i = 0; i < 6; i++)
      for (let j = i + 1; j < 6; j++) expect(dot(b.perp, i, b.perp, j)).toBeCloseTo(-dot(b.par, i, b.par, j), 12);
  });

  it('E_i = (e∥, e⊥) are orthogonal with |E|² = 2aR² (hypercubic lattice), and toHyper inverts the projections', () => {
    for (let i = 0; i < 6; i++)
      for (let j = 0; j < 6; j++) {
        const g = dot(b.par, i, b.par, j) + dot(b.perp, i, b.perp, j);
        expect(g).toBeCloseTo(i === j ? 2 * aR * aR : 0, 10);
      }
    const n = [3, -1, 4, 1, -5, 9];
    const h = toHyper(toPar(n, b), toPerp(n, b), b);
    for (let i = 0; i < 6; i++) expect(h[i]).toBeCloseTo(n[i], 12);
  });

  it('reciprocal basis is dual with the 2π convention: E*_i·E_j = 2π δ_ij', () => {
    const r = reciprocalBasis(aR);
    for (let i = 0; i < 6; i++)
      for (let j = 0; j < 6; j++)
        expect(dot(r.par, i, b.par, j) + dot(r.perp, i, b.perp, j)).toBeCloseTo(i === j ? 2 * Math.PI : 0, 10);
  });

  it('lattice types: F = D6 (even sum), I = Z⁶ ∪ Z⁶+½; reciprocal of F is I-type and vice versa (Conway & Sloane, SPLAG ch. 4, from memory)', () => {
    expect(inHyperlattice([1, 1, 0, 0, 0, 0], 'F')).toBe(true);
    expect(inHyperlattice([1, 0, 0, 0, 0, 0], 'F')).toBe(false);
    expect(inHyperlattice([0.5, 0.5, 0.5, 0.5, 0.5, 0.5], 'I')).toBe(true);
    expect(inHyperlattice([0.5, 0.5, 0.5, 0.5, 0.5, 0], 'I')).toBe(false);
    expect(inReciprocalLattice([0.5, 0.5, 0.5, 0.5, 0.5, 0.5], 'F')).toBe(true);
    expect(inReciprocalLattice([1, 0, 0, 0, 0, 0], 'I')).toBe(false);
    expect(hyperlatticeSteps('P')).toHaveLength(12);
    expect(hyperlatticeSteps('F')).toHaveLength(60); // |D6 roots| = 2·6·5 = 60
    expect(hyperlatticeCellVolume('F', 1) / hyperlatticeCellVolume('I', 1)).toBe(4);
  });

  it('rejects a bad aR naming the field', () => {
    expect(() => icosahedralBasis(-1)).toThrow(/aR/);
  });
});
