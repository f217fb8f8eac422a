/**
 * Kinematic structure factors of periodic structures on integer (h, k, l):
 *
 *   F(h) = Σ_g g_g(s) · Σ_{j∈g} w_j exp(2πi h·x_j),   s = sinθ/λ = 1/(2d),  |Q| = 2π/d,  phase Q·r = 2π h·x
 *
 * (International Tables Vol. B §1.2; g_g includes exp(−B s²)). The per-group sums come from hkl-sum.ts.
 * Reciprocal vectors b_i with a_i · b_j = δ_ij (no 2π, lib/math reciprocal()), so G = h b1 + k b2 + l b3
 * has |G| = 1/d and Q = 2π G; fractional x_i = r · b_i.
 */
import { toFractional } from '../math/frac';
import { reciprocal, vecMat, type Mat3 } from '../math/mat3';
import { norm } from '../math/vec3';
import type { Structure } from '../structure/types';
import type { Radiation } from './form-factors';
import { groupAtoms, groupFactor } from './scatterers';
import { hklPartialSums, rowsFromSortedHkl } from './hkl-sum';

export interface HklFactors {
  /** Packed h k l, sorted by h, k, l. */
  hkl: Int32Array;
  /** d-spacing in Å. */
  d: Float64Array;
  re: Float64Array;
  im: Float64Array;
  /** |F|². */
  f2: Float64Array;
}

/**
 * All (h, k, l) ≠ 0 with d ≥ dMin, sorted by h, k, l. For 1D and 2D models (dim < 3) the indices of
 * the missing directions are held at 0 (the extra cell vectors are only padding there).
 */
export function enumerateHkl(s: Structure, dMin: number): Int32Array {
  if (!s.cell) throw new Error('cell: the structure is not periodic; use the Debye or zone-axis routes for patches');
  if (!(dMin > 0) || !Number.isFinite(dMin)) throw new Error(`dMin: must be a positive length in Å, got ${dMin}`);
  const recip = reciprocal(s.cell);
  const dim = s.dim ?? 3;
  const gMax = 1 / dMin;
  // |h| = |a1 · G| ≤ |a1| |G|.
  const lim = s.cell.map((a) => Math.floor(norm(a) * gMax + 1e-9));
  const hMax = lim[0];
  const kMax = dim >= 2 ? lim[1] : 0;
  const lMax = dim >= 3 ? lim[2] : 0;
  const total = (2 * hMax + 1) * (2 * kMax + 1) * (2 * lMax + 1);
  if (total > 5e7) throw new Error(`dMin: ${dMin} Å asks for about ${total} reflections; use a larger dMin`);
  const out: number[] = [];
  const g2max = gMax * gMax * (1 + 1e-12);
  for (let h = -hMax; h <= hMax; h++) {
    for (let k = -kMax; k <= kMax; k++) {
      for (let l = -lMax; l <= lMax; l++) {
        if (h === 0 && k === 0 && l === 0) continue;
        const g = vecMat([h, k, l], recip);
        if (g[0] * g[0] + g[1] * g[1] + g[2] * g[2] <= g2max) out.push(h, k, l);
      }
    }
  }
  return Int32Array.from(out);
}

/** Structure factors for a sorted hkl list (see enumerateHkl). */
export function structureFactorsHkl(s: Structure, hkl: Int32Array, radiation: Radiation): HklFactors {
  if (!s.cell) throw new Error('cell: the structure is not periodic');
  const recip = reciprocal(s.cell);
  const frac = toFractional(s.cell, s.positions);
  const { groups, groupOf, weight } = groupAtoms(s);
  const rows = rowsFromSortedHkl(hkl);
  const m = rows.count;
  const gre = new Float64Array(groups.length * m);
  const gim = new Float64Array(groups.length * m);
  hklPartialSums(frac, groupOf, weight, rows, gre, gim);
  return combineGroups(hkl, recip, groups, radiation, gre, gim);
}

/** F = Σ_g g_g(s) G_g for each reflection, from group partial sums (also used by the worker path). */
export function combineGroups(
  hkl: Int32Array,
  recip: Mat3,
  groups: ReturnType<typeof groupAtoms>['groups'],
  radiation: Radiation,
  gre: Float64Array,
  gim: Float64Array,
): HklFactors {
  const m = hkl.length / 3;
  const d = new Float64Array(m);
  const re = new Float64Array(m);
  const im = new Float64Array(m);
  const f2 = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    const g = norm(vecMat(hkl.subarray(3 * i, 3 * i + 3), recip));
    d[i] = 1 / g;
    const s2 = (g * g) / 4;
    let r = 0;
    let q = 0;
    for (let c = 0; c < groups.length; c++) {
      const f = groupFactor(groups[c], radiation, s2);
      r += f * gre[c * m + i];
      q += f * gim[c * m + i];
    }
    re[i] = r;
    im[i] = q;
    f2[i] = r * r + q * q;
  }
  return { hkl, d, re, im, f2 };
}
