/**
 * Six-index labels and |Q⊥| for spots of an icosahedral zone pattern. A spot's Q∥ (Å⁻¹, Cartesian axes of
 * lib/models/icosahedral/hyperlattice.ts, which are 2-fold axes) is written, per component, as c·(h + h'τ) with
 * c = π/(aR√(2+τ)) (Cahn, Shechtman & Gratias 1986, as in lib/diffraction/indexing.ts); of all integer pairs
 * within the spot's position tolerance we keep the one with the smallest perpendicular part c·(τh − h'),
 * because the window transform makes small-|Q⊥| reflections the strong ones. From τ² = τ + 1,
 * Σ(τh − h')² = τ²N − τM, the |Q⊥|² of indexing.ts's qSquaredFromNM.
 */
import { TAU } from '../math/golden';
import { csgFromHyper, hyperFromCsg } from '../diffraction/indexing';

export interface SpotIndex {
  label: string;
  /** [h, h', k, k', l, l'] */
  hh: number[];
  /**
   * Six hyperlattice indices in the conventional cell: P and I as they are (I: Σ even); F in the doubled
   * cell (2× the primitive reciprocal indices), so the F rule reads "all even or all odd".
   */
  hyper: number[];
  qPerp: number;
  /** |Q∥ − Q∥(index)|, Å⁻¹. */
  miss: number;
}

export function indexScale(aR: number): number {
  return Math.PI / (aR * Math.sqrt(2 + TAU));
}

/**
 * Does the CSG index belong to a reflection of the hyperlattice type (lib/models/icosahedral/hyperlattice.ts,
 * item 4, dual lattices in the primitive reciprocal basis)? P: h ∈ Z⁶; F (D6 in real space): h ∈ Z⁶ or
 * Z⁶ + ½(1,…,1); I: h ∈ Z⁶ with Σh even.
 */
function allowed(h: number[], lattice: 'P' | 'F' | 'I'): boolean {
  const int = h.every(Number.isInteger);
  if (lattice === 'P') return int;
  if (lattice === 'I') return int && h.reduce((a, b) => a + b, 0) % 2 === 0;
  return int || h.every((v) => Number.isInteger(v - 0.5));
}

/**
 * Index Q∥ (Å⁻¹); tol in Å⁻¹ per component; only indices the hyperlattice type allows (the F superstructure
 * reflections have half-integer primitive indices, odd ones in the conventional cell; I removes Σh odd).
 */
export function indexIcosahedralSpot(q: [number, number, number], aR: number, tol: number, maxIndex = 12, lattice: 'P' | 'F' | 'I' = 'P'): SpotIndex | null {
  const c = indexScale(aR);
  const per: { h: number; hp: number; perp: number; miss: number }[][] = q.map((qc) => {
    const v = qc / c;
    const out: { h: number; hp: number; perp: number; miss: number }[] = [];
    for (let hp = -maxIndex; hp <= maxIndex; hp++) {
      const h = Math.round(v - hp * TAU);
      const miss = Math.abs(h + hp * TAU - v) * c;
      if (miss <= tol) out.push({ h, hp, perp: (TAU * h - hp) * c, miss });
    }
    return out.sort((a, b) => Math.abs(a.perp) - Math.abs(b.perp)).slice(0, 6);
  });
  let best: SpotIndex | null = null;
  for (const x of per[0])
    for (const y of per[1])
      for (const z of per[2]) {
        const hh = [x.h, x.hp, y.h, y.hp, z.h, z.hp];
        const h = hyperFromCsg(hh);
        if (!allowed(h, lattice)) continue;
        const qPerp = Math.hypot(x.perp, y.perp, z.perp);
        const hyper = lattice === 'F' ? h.map((v) => 2 * v) : h;
        if (!best || qPerp < best.qPerp) best = { label: csgFromHyper(h).label, hh, hyper, qPerp, miss: Math.hypot(x.miss, y.miss, z.miss) };
      }
  return best;
}

/**
 * Four-index labels and |Q⊥| for spots of an Ammann–Beenker (octagonal) tiling of edge a, in the basis of
 * lib/models/octagonal/generate.ts and lib/diffraction/hyperspace.ts: Q∥ = (π/a) Σ h_j (cos jπ/4, sin jπ/4), so
 *   qx·a/π = h0 + (h1 − h3)/√2,   qy·a/π = h2 + (h1 + h3)/√2,
 * and, with e⊥_j = (cos 3jπ/4, sin 3jπ/4), Q⊥·a/π = (h0 − (h1 − h3)/√2, −h2 + (h1 + h3)/√2): each component
 * m + n/√2 of Q∥ has the Galois conjugate m − n/√2 as its perpendicular part (up to sign). As for the
 * icosahedral case, among the pairs within tol we keep the index with the smallest |Q⊥|; the two √2
 * parts n_x = h1 − h3 and n_y = h1 + h3 must have equal parity.
 */
export interface OctagonalSpotIndex {
  label: string;
  /** [h0, h1, h2, h3] */
  h: number[];
  qPerp: number;
  /** |Q∥ − Q∥(index)|, Å⁻¹. */
  miss: number;
}

export function indexOctagonalSpot(q: [number, number], edge: number, tol: number, maxIndex = 12): OctagonalSpotIndex | null {
  const c = Math.PI / edge;
  const r = Math.SQRT1_2;
  const per = q.map((qc) => {
    const v = qc / c;
    const out: { m: number; n: number; perp: number; miss: number }[] = [];
    for (let n = -maxIndex; n <= maxIndex; n++) {
      const m = Math.round(v - n * r);
      const miss = Math.abs(m + n * r - v) * c;
      if (miss <= tol) out.push({ m, n, perp: (m - n * r) * c, miss });
    }
    return out.sort((a, b) => Math.abs(a.perp) - Math.abs(b.perp)).slice(0, 6);
  });
  let best: OctagonalSpotIndex | null = null;
  for (const x of per[0]) {
    for (const y of per[1]) {
      if ((x.n - y.n) % 2 !== 0) continue;
      const h = [x.m, (x.n + y.n) / 2, y.m, (y.n - x.n) / 2].map((v) => v + 0); // no −0
      const qPerp = Math.hypot(x.perp, y.perp);
      if (!best || qPerp < best.qPerp) best = { label: h.join(' '), h, qPerp, miss: Math.hypot(x.miss, y.miss) };
    }
  }
  return best;
}
