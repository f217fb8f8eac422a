/**
 * Structure factors of one reflection of each Friedel pair ±h, for powder patterns of large cells.
 *
 * With real scattering factors F(−h) = F(h)* (Friedel's law, International Tables Vol. B §1.2), so |F|² of
 * the pair is computed once and counted twice: half the reflections of enumerateHkl, none lost. The sums
 * take the fast grid route for large cells (structure-factor.ts `auto`, sf-grid.ts), or the exact direct
 * sum with method 'direct'. A powder calculation merges these further into reflection families.
 */
import type { Structure } from '../structure/types';
import type { Radiation } from './form-factors';
import { enumerateHklRange, structureFactorsHkl, type HklFactors, type StructureFactorOptions } from './structure-factor';

export interface FriedelFactors extends HklFactors {
  /** 2 for every listed reflection (itself and −h). */
  multiplicity: Int32Array;
}

/** All reflections with d ≥ dMin, one of each Friedel pair (h > 0, or h = 0 and k > 0, or h = k = 0 and l > 0). */
export function friedelUniqueFactors(s: Structure, dMin: number, radiation: Radiation, opts: StructureFactorOptions = {}): FriedelFactors {
  const hkl = enumerateHklRange(s, dMin, true);
  const f = structureFactorsHkl(s, hkl, radiation, opts);
  return { ...f, multiplicity: new Int32Array(hkl.length / 3).fill(2) };
}
