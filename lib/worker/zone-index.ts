/**
 * Six-index labels and |Q⊥| for spots of an icosahedral zone pattern. A spot's Q∥ (Å⁻¹, Cartesian axes of
 * lib/tiling/hyperlattice.ts, which are 2-fold axes) is written, per component, as c·(h + h'τ) with
 * c = π/(aR√(2+τ)) (Cahn, Shechtman & Gratias 1986, as in lib/diffraction/indexing.ts); of all integer pairs
 * within the spot's position tolerance we keep the one with the smallest perpendicular part c·(τh − h'),
 * because the window transform makes small-|Q⊥| reflections the strong ones. From τ² = τ + 1,
 * Σ(τh − h')² = τ²N − τM, the |Q⊥|² of indexing.ts's qSquaredFromNM.
 */
import { TAU } from '../tiling/hyperlattice';
import { csgFromHyper, hyperFromCsg } from '../diffraction/indexing';

export interface SpotIndex {
  label: string;
  /** [h, h', k, k', l, l'] */
  hh: number[];
  qPerp: number;
  /** |Q∥ − Q∥(index)|, Å⁻¹. */
  miss: number;
}

export function indexScale(aR: number): number {
  return Math.PI / (aR * Math.sqrt(2 + TAU));
}

/** Index Q∥ (Å⁻¹); tol in Å⁻¹ per component; lattice parity of the P hyperlattice (integer 6D indices). */
export function indexIcosahedralSpot(q: [number, number, number], aR: number, tol: number, maxIndex = 12): SpotIndex | null {
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
        if (!hyperFromCsg(hh).every(Number.isInteger)) continue;
        const qPerp = Math.hypot(x.perp, y.perp, z.perp);
        if (!best || qPerp < best.qPerp) best = { label: csgFromHyper(hyperFromCsg(hh)).label, hh, qPerp, miss: Math.hypot(x.miss, y.miss, z.miss) };
      }
  return best;
}
