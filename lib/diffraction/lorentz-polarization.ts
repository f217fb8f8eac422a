/**
 * Lorentz–polarization factor for Bragg–Brentano powder diffraction (International Tables Vol. C §6.2.5,
 * polarization after Azaroff, Acta Cryst. 8 (1955) 701, as given in ITC §6.2.2):
 *   X-rays, no monochromator:  Lp = (1 + cos²2θ) / (2 sin²θ cosθ)
 *   X-rays, monochromator at 2θ_m: Lp = (1 + cos²2θ_m cos²2θ) / ((1 + cos²2θ_m) sin²θ cosθ)
 *   neutrons, electrons (unpolarized, no polarization factor): L = 1 / (sin²θ cosθ)
 * The polarization part is normalised so it is 1 at 2θ = 0 in every branch: the monochromator form tends
 * to the unpolarised (1 + cos²2θ)/2 as 2θ_m → 0 (a monochromator at 2θ_m = 0 changes nothing), which is
 * why the plain branch carries the 1/2 (relative intensities do not depend on it).
 * Angles in degrees.
 */
import type { Radiation } from './form-factors';

const DEG = Math.PI / 180;

export function lorentzPolarization(twoThetaDeg: number, radiation: Radiation, monochromator2ThetaDeg?: number): number {
  const th = (twoThetaDeg * DEG) / 2;
  const s = Math.sin(th);
  const lorentz = 1 / (s * s * Math.cos(th));
  if (radiation !== 'xray') return lorentz;
  const c2 = Math.cos(2 * th) ** 2;
  if (monochromator2ThetaDeg === undefined || monochromator2ThetaDeg === 0) return ((1 + c2) / 2) * lorentz;
  const cm = Math.cos(monochromator2ThetaDeg * DEG) ** 2;
  return ((1 + cm * c2) / (1 + cm)) * lorentz;
}

/** Polarization factor alone, (1 + cos²2θ)/2 (or the monochromator form), for continuous (Debye) patterns. */
export function polarization(twoThetaDeg: number, radiation: Radiation, monochromator2ThetaDeg?: number): number {
  if (radiation !== 'xray') return 1;
  const c2 = Math.cos(twoThetaDeg * DEG) ** 2;
  if (monochromator2ThetaDeg === undefined || monochromator2ThetaDeg === 0) return (1 + c2) / 2;
  const cm = Math.cos(monochromator2ThetaDeg * DEG) ** 2;
  return (1 + cm * c2) / (1 + cm);
}

/** Bragg's law: 2θ in degrees for d (Å) and λ (Å), or NaN when λ > 2d. */
export function twoThetaOf(d: number, lambda: number): number {
  const x = lambda / (2 * d);
  return x > 1 ? NaN : (2 * Math.asin(x)) / DEG;
}

/** d = λ / (2 sinθ). */
export function dOfTwoTheta(twoThetaDeg: number, lambda: number): number {
  return lambda / (2 * Math.sin((twoThetaDeg * DEG) / 2));
}

/** |Q| = 4π sinθ / λ in Å⁻¹. */
export function qOfTwoTheta(twoThetaDeg: number, lambda: number): number {
  return (4 * Math.PI * Math.sin((twoThetaDeg * DEG) / 2)) / lambda;
}

/** 2θ in degrees for |Q| (Å⁻¹), NaN when unreachable. */
export function twoThetaOfQ(q: number, lambda: number): number {
  const x = (q * lambda) / (4 * Math.PI);
  return x > 1 ? NaN : (2 * Math.asin(x)) / DEG;
}
