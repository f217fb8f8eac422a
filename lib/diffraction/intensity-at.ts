/**
 * |F(Q)|² / N at arbitrary Cartesian Q (Å⁻¹, phase Q·r):  F(Q) = Σ_j w_j g_j(|Q|) e^{iQ·r_j}.
 * N is the number of atoms, so a perfectly ordered structure gives |F|²/N ≈ N·g² at a Bragg peak
 * and g² far from any peak (for unit form factors, species X).
 */
import type { Structure } from '../structure/types';
import type { Radiation } from './form-factors';
import { groupAtoms, groupFactor } from './scatterers';
import { qListPartialSums } from './cartesian-sum';

export function intensityAt(s: Structure, q: Float64Array, radiation: Radiation = 'xray'): Float64Array {
  if (q.length % 3 !== 0) throw new Error('q: expected packed qx qy qz triples');
  const n = s.species.length;
  if (n === 0) throw new Error('positions: the structure has no atoms');
  const { groups, groupOf, weight } = groupAtoms(s);
  const m = q.length / 3;
  const re = new Float64Array(groups.length * m);
  const im = new Float64Array(groups.length * m);
  qListPartialSums(s.positions, groupOf, weight, q, re, im);
  const out = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    const qq = Math.hypot(q[3 * i], q[3 * i + 1], q[3 * i + 2]);
    const s2 = (qq / (4 * Math.PI)) ** 2;
    let r = 0;
    let c = 0;
    for (let g = 0; g < groups.length; g++) {
      const f = groupFactor(groups[g], radiation, s2);
      r += f * re[g * m + i];
      c += f * im[g * m + i];
    }
    out[i] = (r * r + c * c) / n;
  }
  return out;
}
