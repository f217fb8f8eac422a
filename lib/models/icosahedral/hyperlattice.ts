/**
 * The icosahedral 6D hyperlattice and its projections onto parallel (physical) and perpendicular space.
 *
 * Conventions (every other module — windows, approximants, diffraction — uses these):
 *
 * 1. Parallel basis. e_i∥ = aR · u_i, where u_i are unit vectors along the six five-fold axes of an
 *    icosahedron, one per ± pair. The twelve icosahedron vertices are the cyclic permutations of
 *    (0, ±1, ±τ) (standard construction, e.g. Coxeter, Regular Polytopes); we pick
 *        u1 ∝ ( 1,  τ,  0)   u2 ∝ (−1,  τ,  0)
 *        u3 ∝ ( 0,  1,  τ)   u4 ∝ ( 0, −1,  τ)
 *        u5 ∝ ( τ,  0,  1)   u6 ∝ ( τ,  0, −1)
 *    all divided by √(2+τ) = |(1, τ, 0)|. The 3D Penrose tiling (prolate and oblate rhombohedra with
 *    edge aR) has its edges along exactly ±e_i∥ (Duneau & Katz, PRL 54 (1985) 2688; Elser,
 *    Acta Cryst. A42 (1986) 36 — cited from memory). Flipping the sign of one u_i only translates the
 *    window, so this choice is a convention, not a restriction.
 *
 * 2. Perpendicular basis. e_i⊥ is the Galois conjugate (τ → −1/τ) of e_i∥, multiplied by the positive
 *    number τ so that it is again a unit vector times aR: (1, τ, 0) → (1, −1/τ, 0) ∝ (τ, −1, 0), because
 *    τ²(1 + τ⁻²) = 2 + τ. Hence
 *        e1⊥ ∝ ( τ, −1,  0)   e2⊥ ∝ (−τ, −1,  0)
 *        e3⊥ ∝ ( 0,  τ, −1)   e4⊥ ∝ ( 0, −τ, −1)
 *        e5⊥ ∝ (−1,  0,  τ)   e6⊥ ∝ (−1,  0, −τ)
 *    With |e∥| = |e⊥| = aR, the 6D vectors E_i = (e_i∥, e_i⊥) are mutually orthogonal with |E_i|² = 2aR²
 *    (Σ u_i u_iᵀ = 2·I for six unit vectors of an icosahedral star, and Σ e_i∥ e_i⊥ᵀ = 0): the
 *    primitive hyperlattice is hypercubic with edge √2·aR, 6D cell volume (√2·aR)⁶ = 8·aR⁶.
 *
 * 3. Hyperlattice types (integer coordinates n in the basis E_i):
 *    P = Z⁶; F = { n ∈ Z⁶ : Σ n_i even } (the D6 lattice); I = Z⁶ ∪ (Z⁶ + ½(1,…,1)).
 *    Volume per lattice point: P 8aR⁶, F 16aR⁶, I 4aR⁶.
 *
 * 4. Reciprocal basis (Fourier module). With phase Q·r (no 2π in the exponent) and |Q| = 2π/d, the dual
 *    basis of E_i is E*_i = 2π·E_i/|E_i|² = (π/aR²)·E_i, i.e. e*_i∥ = (π/aR²)·e_i∥ and
 *    e*_i⊥ = (π/aR²)·e_i⊥, so that E*_i·E_j = 2π δ_ij. A Bragg peak h ∈ Z⁶ sits at
 *    Q∥ = Σ h_i e*_i∥ (physical) and Q⊥ = Σ h_i e*_i⊥ (its perpendicular partner).
 *    Allowed h for each hyperlattice, in this primitive reciprocal basis (dual lattices):
 *    P: h ∈ Z⁶;  F (D6): h ∈ Z⁶ ∪ (Z⁶ + ½(1,…,1));  I: h ∈ Z⁶ with Σ h_i even.
 *
 * Matrices are Float64Array(18), row-major 6×3: row i = (x, y, z) of vector i.
 */
import { TAU } from '../../math/golden';

/** The golden mean τ = (1 + √5)/2. */

/** Unnormalised parallel directions (see header), row-major 6×3, entries in {0, ±1, ±τ}. */
const PAR_DIRS: readonly number[] = [1, TAU, 0, -1, TAU, 0, 0, 1, TAU, 0, -1, TAU, TAU, 0, 1, TAU, 0, -1];
/** Galois conjugates of PAR_DIRS times τ. */
const PERP_DIRS: readonly number[] = [TAU, -1, 0, -TAU, -1, 0, 0, TAU, -1, 0, -TAU, -1, -1, 0, TAU, -1, 0, -TAU];

export type HyperlatticeType = 'P' | 'F' | 'I';

export interface IcosahedralBasis {
  /** Quasilattice constant aR in Å: the edge of the rhombohedra. */
  aR: number;
  /** Row i = e_i∥ in Å (6×3). */
  par: Float64Array;
  /** Row i = e_i⊥ in Å (6×3). */
  perp: Float64Array;
}

/**
 * The integer "shape" rows of the icosahedral star with τ replaced by an arbitrary number t:
 * t = τ gives the true directions (times √(2+τ)); t = p/q gives the rationally strained ones used for
 * approximants (see approximant.ts).
 */
export function icosahedralDirections(t: number, which: 'par' | 'perp'): Float64Array {
  const src = which === 'par' ? PAR_DIRS : PERP_DIRS;
  const out = new Float64Array(18);
  for (let k = 0; k < 18; k++) {
    const v = src[k];
    out[k] = v === TAU ? t : v === -TAU ? -t : v;
  }
  return out;
}

/** The six parallel and perpendicular basis vectors for quasilattice constant aR (Å). */
export function icosahedralBasis(aR: number): IcosahedralBasis {
  if (!(aR > 0) || !Number.isFinite(aR)) throw new RangeError(`aR: must be a positive finite length in Å, got ${aR}`);
  const s = aR / Math.sqrt(2 + TAU);
  const par = new Float64Array(18);
  const perp = new Float64Array(18);
  for (let k = 0; k < 18; k++) {
    par[k] = PAR_DIRS[k] * s;
    perp[k] = PERP_DIRS[k] * s;
  }
  return { aR, par, perp };
}

function project(n: ArrayLike<number>, m: Float64Array, out?: Float64Array): Float64Array {
  const o = out ?? new Float64Array(3);
  let x = 0;
  let y = 0;
  let z = 0;
  for (let i = 0; i < 6; i++) {
    const c = n[i];
    x += c * m[3 * i];
    y += c * m[3 * i + 1];
    z += c * m[3 * i + 2];
  }
  o[0] = x;
  o[1] = y;
  o[2] = z;
  return o;
}

/** Parallel-space image Σ n_i e_i∥ (Å) of a 6D point given by its coordinates n in the basis E_i. */
export function toPar(n: ArrayLike<number>, basis: IcosahedralBasis, out?: Float64Array): Float64Array {
  return project(n, basis.par, out);
}

/** Perpendicular-space image Σ n_i e_i⊥ (Å). */
export function toPerp(n: ArrayLike<number>, basis: IcosahedralBasis, out?: Float64Array): Float64Array {
  return project(n, basis.perp, out);
}

/**
 * Inverse of (toPar, toPerp): the 6D coordinates x_i of the point whose images are (par, perp).
 * Because the E_i are orthogonal with |E_i|² = 2aR², x_i = (par·e_i∥ + perp·e_i⊥) / (2aR²).
 */
export function toHyper(par: ArrayLike<number>, perp: ArrayLike<number>, basis: IcosahedralBasis, out?: Float64Array): Float64Array {
  const o = out ?? new Float64Array(6);
  const inv = 1 / (2 * basis.aR * basis.aR);
  for (let i = 0; i < 6; i++) {
    const a = basis.par;
    const b = basis.perp;
    o[i] =
      (par[0] * a[3 * i] + par[1] * a[3 * i + 1] + par[2] * a[3 * i + 2] +
        perp[0] * b[3 * i] + perp[1] * b[3 * i + 1] + perp[2] * b[3 * i + 2]) * inv;
  }
  return o;
}

/** Reciprocal basis: e*_i∥ = (π/aR²)e_i∥, e*_i⊥ = (π/aR²)e_i⊥ (Å⁻¹), so E*_i·E_j = 2π δ_ij (phase Q·r). */
export function reciprocalBasis(aR: number): IcosahedralBasis {
  const b = icosahedralBasis(aR);
  const f = Math.PI / (aR * aR);
  for (let k = 0; k < 18; k++) {
    b.par[k] *= f;
    b.perp[k] *= f;
  }
  return b;
}

/** Is the 6D point n (coordinates in the basis E_i) a node of the hyperlattice of this type? */
export function inHyperlattice(n: ArrayLike<number>, type: HyperlatticeType): boolean {
  let allInt = true;
  let allHalf = true;
  let sum = 0;
  for (let i = 0; i < 6; i++) {
    const v = n[i];
    if (!Number.isInteger(v)) allInt = false;
    if (!Number.isInteger(v - 0.5)) allHalf = false;
    sum += v;
  }
  if (type === 'P') return allInt;
  if (type === 'F') return allInt && sum % 2 === 0;
  return allInt || allHalf;
}

/** Is h an allowed reciprocal-lattice index for this hyperlattice (see header, item 4)? */
export function inReciprocalLattice(h: ArrayLike<number>, type: HyperlatticeType): boolean {
  if (type === 'P') return inHyperlattice(h, 'P');
  if (type === 'F') return inHyperlattice(h, 'I');
  return inHyperlattice(h, 'F');
}

/**
 * The hyperlattice as a union of cosets of a lattice that is walked by `hyperlatticeSteps`:
 * P and F are one coset (origin); I is Z⁶ and Z⁶ + ½(1,…,1), each walked with the Z⁶ steps.
 */
export function hyperlatticeCosets(type: HyperlatticeType): Float64Array[] {
  if (type === 'I') return [new Float64Array(6), new Float64Array(6).fill(0.5)];
  return [new Float64Array(6)];
}

/**
 * Short lattice steps whose graph connects every cut of a coset (see icosahedral.ts for why):
 * P and I: ±e_i (12 steps, the tiling edges); F: ±e_i ± e_j, i < j (60 steps, the D6 roots).
 * Returned as Int8Array rows of 6.
 */
export function hyperlatticeSteps(type: HyperlatticeType): Int8Array[] {
  const steps: Int8Array[] = [];
  if (type !== 'F') {
    for (let i = 0; i < 6; i++) {
      for (const s of [1, -1]) {
        const v = new Int8Array(6);
        v[i] = s;
        steps.push(v);
      }
    }
    return steps;
  }
  for (let i = 0; i < 6; i++) {
    for (let j = i + 1; j < 6; j++) {
      for (const si of [1, -1]) {
        for (const sj of [1, -1]) {
          const v = new Int8Array(6);
          v[i] = si;
          v[j] = sj;
          steps.push(v);
        }
      }
    }
  }
  return steps;
}

/** 6D volume per hyperlattice node (Å⁶): P 8aR⁶, F 16aR⁶, I 4aR⁶ (header, items 2–3). */
export function hyperlatticeCellVolume(type: HyperlatticeType, aR: number): number {
  const v = 8 * aR ** 6;
  return type === 'P' ? v : type === 'F' ? 2 * v : v / 2;
}
