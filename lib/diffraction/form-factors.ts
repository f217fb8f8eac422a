/**
 * Atomic scattering factors for X-rays, neutrons and electrons.
 *
 * All take s² = (sinθ/λ)² = (|Q|/4π)² in Å⁻², with |Q| = 4π sinθ/λ = 2π/d.
 * Numbers: data/scattering-tables.ts (generated from gemmi's copies of International Tables Vol. C
 * Table 6.1.1.4, Sears 1992 and International Tables Vol. C Table 4.3.2.2; see that file's header).
 * Species 0 (an unassigned tiling vertex, element "X") scatters with f = 1 for every radiation.
 */
import { ELECTRON_C4322, ELEMENT_SYMBOLS, NEUTRON_SEARS92_FM, TABLE_ZMAX, XRAY_IT92 } from './data/scattering-tables';
import { NEUTRON_ABSORBING } from './data/neutron-absorbing';

export type Radiation = 'xray' | 'neutron' | 'electron';
export const RADIATIONS: readonly Radiation[] = ['xray', 'neutron', 'electron'];

/** Units of the scattering factor returned for each radiation. */
export const FORM_FACTOR_UNITS: Record<Radiation, string> = {
  xray: 'electrons',
  neutron: 'fm',
  electron: 'Å',
};

function checkZ(z: number, field = 'species'): void {
  if (!Number.isInteger(z) || z < 0 || z > TABLE_ZMAX) {
    throw new Error(`${field}: atomic number ${z} is outside the scattering tables (0..${TABLE_ZMAX})`);
  }
}

/** s² = (sinθ/λ)² from |Q| in Å⁻¹. */
export function s2FromQ(q: number): number {
  const s = q / (4 * Math.PI);
  return s * s;
}

/** X-ray f(s) = Σ a_i exp(−b_i s²) + c (International Tables Vol. C Table 6.1.1.4). */
export function xrayFormFactor(z: number, s2: number): number {
  checkZ(z);
  if (z === 0) return 1;
  const c = XRAY_IT92[z];
  return (
    c[0] * Math.exp(-c[4] * s2) +
    c[1] * Math.exp(-c[5] * s2) +
    c[2] * Math.exp(-c[6] * s2) +
    c[3] * Math.exp(-c[7] * s2) +
    c[8]
  );
}

/** Electron f_e(s) = Σ_{1..5} a_i exp(−b_i s²) in Å (International Tables Vol. C Table 4.3.2.2). */
export function electronFormFactor(z: number, s2: number): number {
  checkZ(z);
  if (z === 0) return 1;
  const c = ELECTRON_C4322[z];
  let f = 0;
  for (let i = 0; i < 5; i++) f += c[i] * Math.exp(-c[i + 5] * s2);
  return f;
}

/** Bound coherent neutron scattering length in fm (Sears 1992); independent of s. */
export function neutronScatteringLength(z: number): number {
  checkZ(z);
  if (z === 0) return 1;
  const b = NEUTRON_SEARS92_FM[z];
  if (b === null) {
    throw new Error(`species: no tabulated neutron scattering length for ${ELEMENT_SYMBOLS[z]} (Z = ${z})`);
  }
  return b;
}

/** Scattering factor of atomic number z for the chosen radiation at s² = (sinθ/λ)². */
export function scatteringFactor(radiation: Radiation, z: number, s2: number): number {
  switch (radiation) {
    case 'xray':
      return xrayFormFactor(z, s2);
    case 'neutron':
      return neutronScatteringLength(z);
    case 'electron':
      return electronFormFactor(z, s2);
    default:
      throw new Error(`radiation: unknown radiation "${String(radiation)}" (use xray, neutron or electron)`);
  }
}

/** Element symbol for an atomic number from the scattering tables ("X" for 0). */
export function tableSymbol(z: number): string {
  checkZ(z);
  return ELEMENT_SYMBOLS[z];
}

/**
 * Ranges of s = sinθ/λ (Å⁻¹) over which the parametrised form factors were fitted:
 * - X-rays: International Tables Vol. C Table 6.1.1.4 (four Gaussians + c) is fitted for 0 ≤ s ≤ 2 Å⁻¹
 *   (ITC §6.1.1.4; beyond it the fit departs from the Hartree–Fock values).
 * - Electrons: Peng, Ren, Dudarev & Whelan, Acta Cryst. A52 (1996) 257, give two five-Gaussian sets, one
 *   fitted over 0–2 Å⁻¹ (ITC Table 4.3.2.2, the one gemmi carries and data/scattering-tables.ts holds) and
 *   one over 0–6 Å⁻¹. The 0–6 set is not in any library installed here (gemmi 0.5.7 has only c4322), so
 *   electron calculations stop at s = 2 Å⁻¹ with a warning instead of extrapolating the 0–2 set.
 * - Neutrons: scattering lengths do not depend on s.
 */
export const FORM_FACTOR_S_MAX: Record<Radiation, number> = { xray: 2, electron: 2, neutron: Infinity };

/** A warning when s = sinθ/λ goes beyond the fit range of the radiation's form factors, else null. */
export function formFactorRangeWarning(radiation: Radiation, sMax: number): string | null {
  const lim = FORM_FACTOR_S_MAX[radiation];
  if (!(sMax > lim * (1 + 1e-9))) return null;
  const table = radiation === 'xray' ? 'International Tables C 6.1.1.4 X-ray fits' : 'Peng et al. (1996) 0–2 Å⁻¹ electron fits';
  return `form factors: sinθ/λ reaches ${sMax.toFixed(3)} Å⁻¹, beyond the ${lim} Å⁻¹ range of the ${table}`;
}

/**
 * Complex bound coherent neutron scattering length [b′, b″] in fm with b = b′ − i b″ (Sears 1992; the
 * imaginary part is nonzero only for the strong absorbers of data/neutron-absorbing.ts: B, Cd, Sm, Eu, Gd, Dy).
 */
export function neutronScatteringLengthComplex(z: number): [number, number] {
  const re = neutronScatteringLength(z);
  return [re, z === 0 ? 0 : (NEUTRON_ABSORBING[z]?.bImag ?? 0)];
}

/** A warning naming the strong neutron absorbers among the atomic numbers, or null. */
export function neutronAbsorptionWarning(zs: Iterable<number>): string | null {
  const hit = [...new Set(zs)].filter((z) => z > 0 && NEUTRON_ABSORBING[z]).sort((a, b) => a - b);
  if (hit.length === 0) return null;
  const list = hit.map((z) => `${ELEMENT_SYMBOLS[z]} (σ_a = ${NEUTRON_ABSORBING[z].sigmaAbs} b)`).join(', ');
  return `neutron absorption: ${list} absorb strongly at 1.798 Å; intensities use complex scattering lengths but no sample absorption correction, and for Sm, Eu, Gd the lengths change with wavelength`;
}
