/**
 * Powder pattern of a periodic structure: all reflections in the 2θ range, merged with multiplicity,
 * I = m·|F|²·Lp (Lp from lorentz-polarization.ts), 2θ from Bragg's law λ = 2d sinθ.
 * Peak intensities are scaled so the largest is 100; the profile uses the same scale (integrated areas).
 */
import type { Structure } from '../structure/types';
import type { Radiation } from './form-factors';
import { enumerateHkl, structureFactorsHkl } from './structure-factor';
import { mergeReflections } from './merge';
import { lorentzPolarization, twoThetaOf } from './lorentz-polarization';
import { powderProfile, type ProfileShape } from './profile';

export interface PowderPeak {
  twoTheta: number;
  d: number;
  /** |Q| = 2π/d in Å⁻¹. */
  q: number;
  hkl: [number, number, number];
  multiplicity: number;
  /** |F|² per reflection (form-factor units squared). */
  f2: number;
  /** m·|F|²·Lp scaled so that the largest peak is 100. */
  intensity: number;
}

export interface PowderOptions {
  wavelength: number;
  radiation: Radiation;
  twoThetaMin: number;
  twoThetaMax: number;
  /** Diffracted-beam monochromator angle 2θ_m in degrees (X-rays only); 0 or absent = none. */
  monochromator2Theta?: number;
  /** Second line (e.g. Kα2) drawn in the profile only, with this intensity ratio to the first. */
  wavelength2?: number;
  ratio2?: number;
  profile?: ProfileShape & { step: number; background?: number[] };
}

export interface PowderResult {
  peaks: PowderPeak[];
  profile?: { twoTheta: Float64Array; intensity: Float64Array };
}

function checkRange(o: PowderOptions): void {
  if (!(o.wavelength > 0)) throw new Error(`wavelength: must be positive, got ${o.wavelength}`);
  if (!(o.twoThetaMin >= 0 && o.twoThetaMax <= 180 && o.twoThetaMax > o.twoThetaMin)) {
    throw new Error(`range: need 0 ≤ start < end ≤ 180 degrees, got ${o.twoThetaMin}:${o.twoThetaMax}`);
  }
}

export function powderPeaks(s: Structure, o: PowderOptions, lambda = o.wavelength): PowderPeak[] {
  checkRange(o);
  const thMax = (Math.min(o.twoThetaMax, 179.999) * Math.PI) / 360;
  const dMin = lambda / (2 * Math.sin(thMax));
  const hkl = enumerateHkl(s, dMin);
  const f = structureFactorsHkl(s, hkl, o.radiation);
  const merged = mergeReflections(f);
  const peaks: PowderPeak[] = [];
  for (const r of merged) {
    const tt = twoThetaOf(r.d, lambda);
    if (!(tt >= o.twoThetaMin && tt <= o.twoThetaMax) || tt === 0) continue;
    const raw = r.multiplicity * r.f2 * lorentzPolarization(tt, o.radiation, o.monochromator2Theta);
    peaks.push({ twoTheta: tt, d: r.d, q: (2 * Math.PI) / r.d, hkl: r.hkl, multiplicity: r.multiplicity, f2: r.f2, intensity: raw });
  }
  return peaks;
}

function scaleTo100(peaks: PowderPeak[], ref?: number): number {
  let max = ref ?? 0;
  if (ref === undefined) for (const p of peaks) max = Math.max(max, p.intensity);
  const k = max > 0 ? 100 / max : 1;
  for (const p of peaks) p.intensity *= k;
  return k;
}

export function braggPowder(s: Structure, o: PowderOptions): PowderResult {
  const peaks = powderPeaks(s, o);
  let max = 0;
  for (const p of peaks) max = Math.max(max, p.intensity);
  scaleTo100(peaks, max);
  if (!o.profile) return { peaks };
  const list = peaks.map((p) => ({ twoTheta: p.twoTheta, intensity: p.intensity }));
  if (o.wavelength2 !== undefined) {
    const ratio = o.ratio2 ?? 0.5;
    const second = powderPeaks(s, o, o.wavelength2);
    scaleTo100(second, max);
    for (const p of second) list.push({ twoTheta: p.twoTheta, intensity: p.intensity * ratio });
  }
  const profile = powderProfile(list, { ...o.profile, start: o.twoThetaMin, stop: o.twoThetaMax });
  return { peaks, profile };
}
