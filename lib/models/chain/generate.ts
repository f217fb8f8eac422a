/**
 * The Fibonacci chain: by substitution and by cut-and-project from Z², and its periodic approximants.
 *
 * Substitution σ: L → LS, S → L. σⁿ(L) has F(n+2) letters, F(n+1) of them L and F(n) S
 * (the lengths obey the Fibonacci recurrence because |σⁿ⁺¹(L)| = |σⁿ(L)| + |σⁿ⁻¹(L)|).
 *
 * Cut-and-project. A vertex is the hyperlattice point (n_L, n_S) ∈ Z² (counts of L and S steps from the
 * first vertex). Parallel position x = n_L·ℓ + n_S·s (ℓ long, s short, in Å). Perpendicular coordinate,
 * in units of s:   y = n_S − n_L·κ   with κ = 1/τ (quasiperiodic) or κ = F(n)/F(n+1) (approximant of
 * order n, where τ is replaced by F(n+1)/F(n)). This is the Galois-conjugate embedding of Z[τ]
 * (x = n_L τ + n_S ↦ x* = n_L τ' + n_S with τ' = −1/τ), the standard Fibonacci model set
 * (Baake & Grimm, Aperiodic Order vol. 1, 2013, Ch. 7). The lengths ℓ and s only place the points; the
 * L/S sequence is fixed by κ, so a ratio ℓ/s ≠ τ gives the same sequence with other lengths.
 *
 * Window, half-open:  W = [−1 + φ, κ + φ)  with φ the phason offset. Its length 1 + κ equals
 * |S*| + |L*|, the projection of the unit square, so from a vertex with y ∈ W exactly one of the two
 * steps y + 1 (S) or y − κ (L) stays in W: S iff y + 1 < κ + φ. The walk visits the cut in order,
 * so the work is linear in the output. With φ = 0 the chain from x = 0 is the substitution fixed point
 * σ^∞(L) = LSLLSLSL… (checked in the tests); a vertex whose y lands exactly on the upper end is rejected
 * and one on the lower end accepted — that is the whole boundary rule.
 *
 * Exactness. The test "y + 1 < κ + φ" is a sign test on A − B·τ with integers A, B when φ = 0
 * (decided exactly by squaring), and on an integer fraction for the approximants. A non-zero φ is a
 * user double; then the comparison is made in doubles with y held as exact integers until the last step.
 */
import { checkPointCap } from '../point-cap';
import type { ChainParams } from './schema';
import { ENGINE_VERSION } from '../../version';
import type { Structure } from '../../structure/types';
import { TAU } from '../../math/golden';

/** Height of the b and c axes given to chain approximant cells so exports work; only a is meaningful. */
export const CHAIN_PADDING = 10;

/** Fibonacci number F(n), F(0) = 0, F(1) = 1 (OEIS A000045). Exact for n ≤ 78. */
export function fibonacci(n: number): number {
  if (!Number.isInteger(n) || n < 0 || n > 78) throw new RangeError(`n: must be an integer 0..78, got ${n}`);
  let a = 0, b = 1;
  for (let i = 0; i < n; i++) [a, b] = [b, a + b];
  return a;
}

/** σⁿ(L) as bytes, 1 = L and 0 = S (the 0/1 convention of OEIS A005614). */
export function fibonacciWord(order: number, maxPoints = 2_000_000): Uint8Array {
  if (!Number.isInteger(order) || order < 0 || order > 60) throw new RangeError(`order: must be an integer 0..60, got ${order}`);
  checkPointCap(fibonacci(order + 2), maxPoints, `the word of order ${order}`);
  const out = new Uint8Array(fibonacci(order + 2));
  out[0] = 1;
  let len = 1;
  // Applying σ to a prefix w gives σ(w), whose first |w| letters are w again (σ(L) starts with L), so the
  // word can grow in place from its end: read letters back to front, write images back to front.
  for (let k = 0; k < order; k++) {
    let ones = 0;
    for (let i = 0; i < len; i++) ones += out[i];
    const next = len + ones;
    let w = next;
    for (let i = len - 1; i >= 0; i--) {
      if (out[i] === 1) {
        out[--w] = 0;
        out[--w] = 1;
      } else {
        out[--w] = 1;
      }
    }
    len = next;
  }
  return out;
}

/** sign(A − B·τ) for integers, exactly: A − Bτ = ((2A − B) − B√5)/2. */
function signAminusBtau(A: number, B: number): number {
  const u = 2 * A - B;
  // sign(u − B√5)
  if (B === 0) return Math.sign(u);
  if (B < 0) return u >= 0 ? 1 : (u * u > 5 * B * B ? -1 : 1);
  return u <= 0 ? -1 : (u * u > 5 * B * B ? 1 : -1);
}

interface StepRule {
  /** Is the step S taken from the vertex (nL, nS)? */
  shortStep(nL: number, nS: number): boolean;
  /** Perpendicular coordinate of (nL, nS) in units of s. */
  perp(nL: number, nS: number): number;
}

function quasiRule(phi: number): StepRule {
  const kappa = 1 / TAU;
  return {
    // y + 1 < κ + φ with y = nS − nL(τ − 1):  (nS + nL + 1) − (nL + 1)τ + 1 ... written as A − Bτ < φ.
    shortStep(nL, nS) {
      const A = nS + nL + 2;
      const B = nL + 1;
      if (phi === 0) return signAminusBtau(A, B) < 0;
      return A - B * TAU < phi;
    },
    perp: (nL, nS) => nS - nL * kappa,
  };
}

function approxRule(order: number, phi: number): StepRule {
  const P = fibonacci(order + 1), Q = fibonacci(order);
  // κ = Q/P; scaled by P everything is an integer: Y = nS·P − nL·Q, window [−P, Q) + φP.
  return {
    shortStep(nL, nS) {
      const Y1 = (nS + 1) * P - nL * Q;
      return phi === 0 ? Y1 < Q : Y1 - Q < phi * P;
    },
    perp: (nL, nS) => nS - (nL * Q) / P,
  };
}

/** Window test for the start vertex (same half-open rule, in doubles — only used off the exact path). */
function firstVertex(kappa: number, lambda: number, phi: number): [number, number] {
  const lo = -1 + phi, hi = kappa + phi;
  // Origin is a vertex iff lo ≤ 0 < hi; this is exact for φ = 0.
  if (lo <= 0 && 0 < hi) return [0, 0];
  // Otherwise the first vertex at parallel position ≥ 0 (abstract units s = 1, ℓ = λ): gaps are ≤ λ, so
  // it lies in [0, λ). par − y = nL(λ + κ) bounds nL.
  let best: [number, number] | null = null;
  let bestPar = Infinity;
  const nLmin = Math.floor(-hi / (lambda + kappa)) - 1;
  const nLmax = Math.ceil((lambda - lo) / (lambda + kappa)) + 1;
  for (let nL = nLmin; nL <= nLmax; nL++) {
    for (let nS = Math.ceil(lo + nL * kappa) - 1; nS <= Math.floor(hi + nL * kappa) + 1; nS++) {
      const y = nS - nL * kappa;
      const par = nL * lambda + nS;
      if (y >= lo && y < hi && par >= 0 && par < bestPar) {
        bestPar = par;
        best = [nL, nS];
      }
    }
  }
  if (!best) throw new Error('offset: internal error, no start vertex found');
  return best;
}

/**
 * Fibonacci chain as a Structure (dim 1, points on x, tiles "L"/"S" with 2 corners, perp in Å units of s).
 *
 * Quasiperiodic (approximant = false): F(order+2) segments from the first vertex at x ≥ 0, moved to x = 0;
 * F(order+2) + 1 vertices, no cell.
 * Approximant: one period of F(order+2) vertices in [0, a), a = F(order+1)·ℓ + F(order)·s, and the cell
 * [[a,0,0],[0,10,0],[0,0,10]] — only a is meaningful; b = c = CHAIN_PADDING Å so that periodic exports
 * work. The last segment runs from the last vertex to vertex 0 of the next cell.
 */
export function fibonacciChain(p: ChainParams): Structure {
  const { order, approximant, offset: phi, long: ell, ratio, maxPoints } = p;
  const s = ell / ratio;
  const nTiles = fibonacci(order + 2);
  const nPoints = approximant ? nTiles : nTiles + 1;
  checkPointCap(nPoints, maxPoints, `the chain of order ${order}`);

  const rule = approximant ? approxRule(order, phi) : quasiRule(phi);
  const kappa = approximant ? fibonacci(order) / fibonacci(order + 1) : 1 / TAU;
  const lambda = approximant ? fibonacci(order + 1) / Math.max(1, fibonacci(order)) : TAU;
  const [nL0, nS0] = firstVertex(kappa, lambda, phi);

  const positions = new Float64Array(3 * nPoints);
  const perp = new Float64Array(nPoints);
  const kind = new Uint8Array(nTiles);
  const corners = new Uint32Array(2 * nTiles);
  let nL = nL0, nS = nS0;
  for (let i = 0; i < nPoints; i++) {
    positions[3 * i] = (nL - nL0) * ell + (nS - nS0) * s;
    perp[i] = rule.perp(nL, nS) * s;
    if (i < nTiles) {
      const short = rule.shortStep(nL, nS);
      kind[i] = short ? 1 : 0;
      corners[2 * i] = i;
      corners[2 * i + 1] = approximant && i === nTiles - 1 ? 0 : i + 1;
      if (short) nS++;
      else nL++;
    }
  }
  const period = fibonacci(order + 1) * ell + fibonacci(order) * s;
  return {
    positions,
    species: new Uint16Array(nPoints),
    perp,
    perpDim: 1,
    dim: 1,
    ...(approximant
      ? { cell: [[period, 0, 0], [0, CHAIN_PADDING, 0], [0, 0, CHAIN_PADDING]] as Structure['cell'] }
      : {}),
    tiles: { kinds: ['L', 'S'], kind, cornersPerTile: 2, corners },
    provenance: { params: p, engine: ENGINE_VERSION },
  };
}
