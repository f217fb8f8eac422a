/**
 * Radiation wavelengths in Å.
 *
 * X-ray characteristic lines: International Tables for Crystallography Vol. C (2004), Table 4.2.2.1
 * (Kα1, Kα2 peak wavelengths; values of Deslattes & Henins as tabulated there, from memory of that table).
 * Kα2/Kα1 intensity ratio: the ratio of the K–L2 to K–L3 radiative rates of xraylib 4 (its radiative-rate
 * table, RadRate(Z, KL2_LINE)/RadRate(Z, KL3_LINE)), ≈ 0.51–0.53, near the 1:2 of the 2p1/2 : 2p3/2
 * occupancies; copied here to 4 digits and checked against xraylib in tests/unit/diffraction.
 * "Kα" is the weighted mean (2·Kα1 + Kα2)/3 — common practice for unresolved doublets.
 * Electrons: relativistic de Broglie wavelength λ = h / √(2 m₀ e V (1 + eV / 2 m₀ c²)), CODATA 2018 constants.
 * Neutrons: the wavelength the user gives.
 */

export interface XrayLine {
  ka1: number;
  ka2: number;
  /** I(Kα2)/I(Kα1). */
  ratio: number;
}

export const XRAY_LINES: Record<'Cr' | 'Co' | 'Cu' | 'Mo' | 'Ag', XrayLine> = {
  Cr: { ka1: 2.28970, ka2: 2.293606, ratio: 0.5093 },
  Co: { ka1: 1.788965, ka2: 1.792850, ratio: 0.5113 },
  Cu: { ka1: 1.540593, ka2: 1.544414, ratio: 0.5132 },
  Mo: { ka1: 0.709317, ka2: 0.713607, ratio: 0.5244 },
  Ag: { ka1: 0.5594075, ka2: 0.563798, ratio: 0.5295 },
};

// CODATA 2018 exact / recommended values (SI).
const PLANCK_H = 6.62607015e-34; // J s (exact)
const ELECTRON_MASS = 9.1093837015e-31; // kg
const ELEMENTARY_CHARGE = 1.602176634e-19; // C (exact)
const SPEED_OF_LIGHT = 299792458; // m/s (exact)

/** Relativistic electron wavelength in Å for an accelerating voltage in volts. */
export function electronWavelength(volts: number): number {
  if (!(volts > 0) || !Number.isFinite(volts)) {
    throw new Error(`voltage: must be a positive number of volts, got ${volts}`);
  }
  const eV = ELEMENTARY_CHARGE * volts;
  const mc2 = ELECTRON_MASS * SPEED_OF_LIGHT * SPEED_OF_LIGHT;
  const p = Math.sqrt(2 * ELECTRON_MASS * eV * (1 + eV / (2 * mc2)));
  return (PLANCK_H / p) * 1e10;
}

/**
 * Resolve a wavelength spec: a line name ("CuKa1", "MoKa2", "CoKa"), "<n>kV" (electrons), or a number in Å.
 * Returns λ in Å; throws naming the field on anything else.
 */
export function parseWavelength(spec: string | number, field = 'wavelength'): number {
  if (typeof spec === 'number') {
    if (!(spec > 0) || !Number.isFinite(spec)) throw new Error(`${field}: must be a positive length in Å, got ${spec}`);
    return spec;
  }
  const t = spec.trim();
  const line = /^(Cr|Co|Cu|Mo|Ag)\s*K(?:a|α|alpha)([12]?)$/i.exec(t);
  if (line) {
    const el = (line[1][0].toUpperCase() + line[1].slice(1).toLowerCase()) as keyof typeof XRAY_LINES;
    const l = XRAY_LINES[el];
    if (line[2] === '1') return l.ka1;
    if (line[2] === '2') return l.ka2;
    return (2 * l.ka1 + l.ka2) / 3;
  }
  const kv = /^([0-9]*\.?[0-9]+(?:e[+-]?\d+)?)\s*kV$/i.exec(t);
  if (kv) return electronWavelength(Number(kv[1]) * 1000);
  const num = /^[0-9]*\.?[0-9]+(?:e[+-]?\d+)?$/i.test(t) ? Number(t) : NaN;
  if (num > 0 && Number.isFinite(num)) return num;
  throw new Error(
    `${field}: "${spec}" is not a wavelength; use a line (CuKa1, CuKa2, CuKa, MoKa1, CoKa1, CrKa1, AgKa1), "<n>kV" for electrons, or a length in Å`,
  );
}

/** The Kα2 line that goes with a Kα1 line name ("CuKa1"): its wavelength and I(Kα2)/I(Kα1), else undefined. */
export function kalpha2Of(spec: string | number): { wavelength: number; ratio: number } | undefined {
  if (typeof spec !== 'string') return undefined;
  const m = /^(Cr|Co|Cu|Mo|Ag)\s*K(?:a|α|alpha)1$/i.exec(spec.trim());
  if (!m) return undefined;
  const el = (m[1][0].toUpperCase() + m[1].slice(1).toLowerCase()) as keyof typeof XRAY_LINES;
  return { wavelength: XRAY_LINES[el].ka2, ratio: XRAY_LINES[el].ratio };
}

/** Photon energy in keV ↔ wavelength in Å: λ = hc / E, hc = 12.398419843 keV·Å (CODATA 2018). */
export const HC_KEV_ANGSTROM = 12.398419843320026;
