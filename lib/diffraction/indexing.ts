/**
 * Indexing of icosahedral reflections in the scheme of Cahn, Shechtman & Gratias, J. Mater. Res. 1 (1986) 13:
 * six integers (h/h', k/k', l/l') with Q∥ ∝ (h + h'τ, k + k'τ, l + l'τ) in Cartesian axes along three
 * orthogonal 2-fold axes, and the labels
 *   N = Σ (h² + h'²),  M = Σ (h'² + 2 h h'),   so that |Q∥|² ∝ N + Mτ and |Q⊥|² ∝ N − M/τ
 * (from τ² = τ + 1; the N, M definitions are quoted from memory of that paper). Our perpendicular basis
 * is the Galois conjugate times τ (hyperlattice.ts), so here |Q⊥|² = c²·τ²·(N − M/τ) = c²(τ²N − τM).
 *
 * The Cartesian axes of lib/models/icosahedral/hyperlattice.ts are 2-fold axes (the icosahedron vertices are the
 * cyclic permutations of (0, ±1, ±τ)), so from the six hyperlattice indices n_i (Q∥ = Σ n_i e*_i∥ with
 * e*_i∥ ∝ (1,τ,0), (−1,τ,0), (0,1,τ), (0,−1,τ), (τ,0,1), (τ,0,−1)):
 *   h = n1 − n2, h' = n5 + n6;   k = n3 − n4, k' = n1 + n2;   l = n5 − n6, l' = n3 + n4,
 * and Q∥ = (π / (aR √(2+τ))) · (h + h'τ, k + k'τ, l + l'τ) in Å⁻¹.
 */
import { TAU } from '../math/golden';

export interface CsgIndex {
  /** [h, h', k, k', l, l']. */
  hh: [number, number, number, number, number, number];
  N: number;
  M: number;
  /** "h/h' k/k' l/l'". */
  label: string;
}

export function csgFromHyper(n: ArrayLike<number>): CsgIndex {
  const h = n[0] - n[1];
  const hp = n[4] + n[5];
  const k = n[2] - n[3];
  const kp = n[0] + n[1];
  const l = n[4] - n[5];
  const lp = n[2] + n[3];
  const N = h * h + hp * hp + k * k + kp * kp + l * l + lp * lp;
  const M = hp * hp + kp * kp + lp * lp + 2 * (h * hp + k * kp + l * lp);
  return { hh: [h, hp, k, kp, l, lp], N, M, label: `${h}/${hp} ${k}/${kp} ${l}/${lp}` };
}

/** Inverse map: CSG indices → hyperlattice indices (half-integers when the CSG parities do not match). */
export function hyperFromCsg(hh: ArrayLike<number>): number[] {
  const [h, hp, k, kp, l, lp] = Array.from(hh);
  return [(kp + h) / 2, (kp - h) / 2, (lp + k) / 2, (lp - k) / 2, (hp + l) / 2, (hp - l) / 2];
}

/** |Q∥|² and |Q⊥|² from N, M for quasilattice constant aR: c²(N + Mτ) and c²τ²(N − M/τ), c² = π²/(aR²(2+τ)). */
export function qSquaredFromNM(N: number, M: number, aR: number): { par: number; perp: number } {
  const c = (Math.PI * Math.PI) / (aR * aR * (2 + TAU));
  return { par: c * (N + M * TAU), perp: c * TAU * TAU * (N - M / TAU) };
}
