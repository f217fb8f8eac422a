/**
 * Neutron structure factors with complex scattering lengths b = b′ − i b″ (Sears 1992; form-factors.ts):
 *   F(h) = Σ_g b_g e^{−B_g s²} G_g(h),  G_g from hkl-sum.ts, b_g = Σ_z x_z b_z
 * so Re F = Σ b′ Re G + b″ Im G and Im F = Σ b′ Im G − b″ Re G (× the Debye–Waller factor). With every
 * b″ = 0 this is structure-factor.ts's F; the absorbers (B, Cd, Sm, Eu, Gd, Dy) change |F|² wherever
 * their real parts nearly cancel against other atoms'.
 */
import { toFractional } from '../math/frac';
import { reciprocal, vecMat } from '../math/mat3';
import { norm } from '../math/vec3';
import type { Structure } from '../structure/types';
import { neutronScatteringLengthComplex } from './form-factors';
import { hklPartialSums, rowsFromSortedHkl } from './hkl-sum';
import { groupAtoms } from './scatterers';
import type { HklFactors } from './structure-factor';

/** Does the structure hold an atom whose neutron scattering length has an imaginary part? */
export function hasComplexNeutronLength(s: Structure): boolean {
  const { groups } = groupAtoms(s);
  return groups.some((g) => g.parts.some(([z]) => neutronScatteringLengthComplex(z)[1] !== 0));
}

export function neutronFactorsHkl(s: Structure, hkl: Int32Array): HklFactors {
  if (!s.cell) throw new Error('cell: the structure is not periodic');
  const recip = reciprocal(s.cell);
  const frac = toFractional(s.cell, s.positions);
  const { groups, groupOf, weight } = groupAtoms(s);
  const rows = rowsFromSortedHkl(hkl);
  const m = rows.count;
  const gre = new Float64Array(groups.length * m);
  const gim = new Float64Array(groups.length * m);
  hklPartialSums(frac, groupOf, weight, rows, gre, gim);
  const b = groups.map((g) => {
    let re = 0;
    let im = 0;
    for (const [z, x] of g.parts) {
      const [r, i] = neutronScatteringLengthComplex(z);
      re += x * r;
      im += x * i;
    }
    return [re, im, g.biso] as const;
  });
  const d = new Float64Array(m);
  const re = new Float64Array(m);
  const im = new Float64Array(m);
  const f2 = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    const gl = norm(vecMat(hkl.subarray(3 * i, 3 * i + 3), recip));
    d[i] = 1 / gl;
    const s2 = (gl * gl) / 4;
    let r = 0;
    let q = 0;
    for (let c = 0; c < groups.length; c++) {
      const [br, bi, biso] = b[c];
      const dw = biso ? Math.exp(-biso * s2) : 1;
      const Gr = gre[c * m + i];
      const Gi = gim[c * m + i];
      r += dw * (br * Gr + bi * Gi);
      q += dw * (br * Gi - bi * Gr);
    }
    re[i] = r;
    im[i] = q;
    f2[i] = r * r + q * q;
  }
  return { hkl, d, re, im, f2 };
}
