/**
 * Powder pattern of a periodic structure: all reflections in the 2θ range, merged into families
 * (equal d and |F|, merge.ts) and the families at one d into one line, I = Σ m·|F|²·Lp (Lp from
 * lorentz-polarization.ts), 2θ from Bragg's law λ = 2d sinθ.
 * Line intensities are scaled so the largest line is 100; the profile uses the same scale (integrated areas).
 *
 * Resolution: reflections with d < dMin are left out, dMin = max(λ / 2 sin θ_max, the user's dMin).
 * Electrons (λ ≈ 0.02–0.04 Å) reach d of a few hundredths of an Å at modest 2θ, so for them a dMin is
 * required (default ELECTRON_DEFAULT_DMIN) and the form-factor range caps it (form-factors.ts).
 * A dMin that would ask for more than MAX_REFLECTIONS reflections of the cell is refused with the
 * finest dMin that the cell allows.
 */
import type { Structure } from '../structure/types';
import { determinant } from '../math/mat3';
import type { Radiation } from './form-factors';
import { enumerateHklRange, structureFactorsHkl } from './structure-factor';
import { mergeReflections, type MergedReflection } from './merge';
import { axisSymmetry } from './sf-symmetry';
import { hklOrbits, hklSignGroup } from './hkl-orbits';
import { groupAtoms } from './scatterers';
import { toFractional } from '../math/frac';
import { lorentzPolarization, twoThetaOf } from './lorentz-polarization';
import { powderProfile, type ProfileShape } from './profile';
import { formFactorRangeWarning, FORM_FACTOR_S_MAX, neutronAbsorptionWarning } from './form-factors';
import { hasComplexNeutronLength, neutronFactorsHkl } from './neutron-structure-factor';

export interface PowderFamily {
  hkl: [number, number, number];
  multiplicity: number;
  /** |F|² per reflection of the family. */
  f2: number;
}

export interface PowderPeak {
  twoTheta: number;
  d: number;
  /** |Q| = 2π/d in Å⁻¹. */
  q: number;
  /** Representative index of the strongest family at this d. */
  hkl: [number, number, number];
  /** Total multiplicity of the line (all families at this d). */
  multiplicity: number;
  /** Multiplicity-weighted mean |F|² per reflection (form-factor units squared). */
  f2: number;
  /** Σ m·|F|²·Lp scaled so that the largest line is 100. */
  intensity: number;
  /** Reflection families (equal d and |F|) that make up the line, strongest first. */
  families: PowderFamily[];
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
  /** Resolution limit in Å: reflections with d < dMin are left out. Electrons default to ELECTRON_DEFAULT_DMIN. */
  dMin?: number;
  profile?: ProfileShape & { step: number; background?: number[] };
}

export interface PowderResult {
  peaks: PowderPeak[];
  profile?: { twoTheta: Float64Array; intensity: Float64Array };
  /** The d limit used, Å. */
  dMin: number;
  /** Things the user must see: form factors beyond their fit range, lines cut by the resolution limit. */
  warnings: string[];
}

/** Electron powder patterns stop here unless the user sets a dMin (Å); s = 1/(2d) = 1 Å⁻¹. */
export const ELECTRON_DEFAULT_DMIN = 0.5;
/** Largest number of reflections one powder run enumerates. */
export const MAX_REFLECTIONS = 2e7;

function checkRange(o: PowderOptions): void {
  if (!(o.wavelength > 0)) throw new Error(`wavelength: must be positive, got ${o.wavelength}`);
  if (!(o.twoThetaMin >= 0 && o.twoThetaMax <= 180 && o.twoThetaMax > o.twoThetaMin)) {
    throw new Error(`range: need 0 ≤ start < end ≤ 180 degrees, got ${o.twoThetaMin}:${o.twoThetaMax}`);
  }
  if (o.dMin !== undefined && !(o.dMin > 0 && Number.isFinite(o.dMin))) throw new Error(`dMin: must be a positive length in Å, got ${o.dMin}`);
}

/** Reflections in the sphere |G| ≤ 1/dMin: about (4π/3)·V/dMin³ (V = cell volume), all of them counted. */
export function reflectionEstimate(s: Structure, dMin: number): number {
  if (!s.cell) return 0;
  const dim = s.dim ?? 3;
  const v = Math.abs(determinant(s.cell));
  if (dim === 3) return ((4 * Math.PI) / 3) * (v / dMin ** 3);
  return (2 * Math.PI) / dMin ** dim; // rough for 1D/2D; these never come near the limit
}

/** The d limit of a run and the warnings it brings (see the header). */
export function powderDMin(s: Structure, o: PowderOptions, lambda = o.wavelength): { dMin: number; warnings: string[] } {
  checkRange(o);
  const warnings: string[] = [];
  const thMax = (Math.min(o.twoThetaMax, 179.999) * Math.PI) / 360;
  const braggLimit = lambda / (2 * Math.sin(thMax));
  let dMin = Math.max(braggLimit, o.dMin ?? 0);
  if (o.radiation === 'electron' && o.dMin === undefined && ELECTRON_DEFAULT_DMIN > dMin) {
    dMin = ELECTRON_DEFAULT_DMIN;
    warnings.push(
      `resolution: electron powder stops at d = ${ELECTRON_DEFAULT_DMIN} Å (2θ = ${twoThetaOf(dMin, lambda).toFixed(3)}°) unless you set d min (--d-min); the range asked for reaches d = ${braggLimit.toPrecision(3)} Å`,
    );
  }
  const fit = formFactorRangeWarning(o.radiation, 1 / (2 * dMin));
  if (fit) {
    if (o.radiation === 'electron') {
      // Only the 0–2 Å⁻¹ fit set is available (see form-factors.ts): cap rather than extrapolate.
      dMin = 1 / (2 * FORM_FACTOR_S_MAX.electron);
      warnings.push(`${fit}; reflections with d < ${dMin} Å are left out`);
    } else warnings.push(fit);
  }
  if (o.radiation === 'neutron') {
    const zs: number[] = [];
    for (const v of s.species) zs.push(v);
    for (const c of s.siteClasses ?? []) for (const z of Object.keys(c.mix ?? {})) zs.push(Number(z));
    const abs = neutronAbsorptionWarning(zs);
    if (abs) warnings.push(abs);
  }
  const n = reflectionEstimate(s, dMin);
  if (n > MAX_REFLECTIONS) {
    const v = s.cell ? Math.abs(determinant(s.cell)) : 0;
    const finest = Math.cbrt(((4 * Math.PI) / 3) * (v / MAX_REFLECTIONS));
    throw new Error(
      `dMin: d down to ${dMin.toPrecision(3)} Å asks for about ${n.toPrecision(3)} reflections of this ${v.toFixed(0)} Å³ cell (limit ${MAX_REFLECTIONS.toExponential(0)}); set dMin to at least ${finest.toPrecision(3)} Å or narrow the 2θ range`,
    );
  }
  return { dMin, warnings };
}

/** Relative d tolerance within which families are one powder line. */
const LINE_D_TOL = 1e-5;

/** A powder line before the wavelength enters: its d, families, total multiplicity and Σ m·|F|². */
export interface PowderLine {
  d: number;
  multiplicity: number;
  mf2: number;
  families: PowderFamily[];
}

/**
 * The lines of a pattern down to dMin, independent of the wavelength. Structure factors are computed for one
 * reflection of each orbit under the structure's axis-sign symmetry and Friedel's law (hkl-orbits.ts; at least
 * one of each pair ±h, F(−h) = F(h)* for real scattering factors) and merged with the orbit sizes as weights
 * (merge.ts); neutrons with complex scattering lengths (absorbers) break Friedel's law and take the full list.
 */
export function powderLines(s: Structure, o: Pick<PowderOptions, 'radiation'>, dMin: number): PowderLine[] {
  let merged: MergedReflection[];
  if (o.radiation === 'neutron' && hasComplexNeutronLength(s)) {
    merged = mergeReflections(neutronFactorsHkl(s, enumerateHklRange(s, dMin, false)));
  } else {
    const { groupOf, weight } = groupAtoms(s);
    const sym = axisSymmetry(toFractional(s.cell!, s.positions), groupOf, weight);
    const orbits = hklOrbits(s, dMin, hklSignGroup(s, sym, true), sym.transHalf);
    const f = structureFactorsHkl(s, orbits.hkl, o.radiation, { symmetry: sym });
    merged = mergeReflections(f, { images: orbits.signs, multiplicity: orbits.multiplicity });
  }
  const lines: PowderLine[] = [];
  // merged is sorted by d descending, families of one d next to each other.
  let i = 0;
  while (i < merged.length) {
    let j = i + 1;
    while (j < merged.length && Math.abs(merged[j].d - merged[i].d) <= LINE_D_TOL * merged[i].d) j++;
    let m = 0;
    let mf2 = 0;
    let dSum = 0;
    const families: PowderFamily[] = [];
    for (let t = i; t < j; t++) {
      const r = merged[t];
      m += r.multiplicity;
      mf2 += r.multiplicity * r.f2;
      dSum += r.multiplicity * r.d;
      families.push({ hkl: r.hkl, multiplicity: r.multiplicity, f2: r.f2 });
    }
    i = j;
    const d = dSum / m;
    if (d < dMin * (1 - 1e-9)) continue;
    families.sort((a, b) => b.multiplicity * b.f2 - a.multiplicity * a.f2);
    lines.push({ d, multiplicity: m, mf2, families });
  }
  return lines;
}

/** The lines at one wavelength: 2θ in the range, Σ m·|F|²·Lp (not yet scaled). */
export function peaksOfLines(lines: PowderLine[], o: PowderOptions, lambda = o.wavelength): PowderPeak[] {
  const peaks: PowderPeak[] = [];
  for (const l of lines) {
    const tt = twoThetaOf(l.d, lambda);
    if (!(tt >= o.twoThetaMin && tt <= o.twoThetaMax) || tt === 0) continue;
    const raw = l.mf2 * lorentzPolarization(tt, o.radiation, o.monochromator2Theta);
    peaks.push({
      twoTheta: tt,
      d: l.d,
      q: (2 * Math.PI) / l.d,
      hkl: l.families[0].hkl,
      multiplicity: l.multiplicity,
      f2: l.mf2 / l.multiplicity,
      intensity: raw,
      families: l.families.map((f) => ({ ...f })),
    });
  }
  return peaks;
}

export function powderPeaks(s: Structure, o: PowderOptions, lambda = o.wavelength, dMinIn?: number): PowderPeak[] {
  const dMin = dMinIn ?? powderDMin(s, o, lambda).dMin;
  return peaksOfLines(powderLines(s, o, dMin), o, lambda);
}

function scaleTo100(peaks: PowderPeak[], ref?: number): number {
  let max = ref ?? 0;
  if (ref === undefined) for (const p of peaks) max = Math.max(max, p.intensity);
  const k = max > 0 ? 100 / max : 1;
  for (const p of peaks) p.intensity *= k;
  return k;
}

export function braggPowder(s: Structure, o: PowderOptions): PowderResult {
  const { dMin, warnings } = powderDMin(s, o);
  // One set of structure factors serves both lines of a doublet (same reflections, same d limit).
  const lines = powderLines(s, o, dMin);
  const peaks = peaksOfLines(lines, o);
  let max = 0;
  for (const p of peaks) max = Math.max(max, p.intensity);
  scaleTo100(peaks, max);
  if (!o.profile) return { peaks, dMin, warnings };
  const list = peaks.map((p) => ({ twoTheta: p.twoTheta, intensity: p.intensity }));
  if (o.wavelength2 !== undefined) {
    if (!(o.wavelength2 > 0)) throw new Error(`wavelength2: must be positive, got ${o.wavelength2}`);
    const ratio = o.ratio2 ?? 0.5;
    if (!(ratio >= 0 && ratio <= 1)) throw new Error(`ratio2: must be between 0 and 1, got ${ratio}`);
    // Same d limit as the first line: both lines come from the same reflections.
    const second = peaksOfLines(lines, o, o.wavelength2);
    scaleTo100(second, max);
    for (const p of second) list.push({ twoTheta: p.twoTheta, intensity: p.intensity * ratio });
  }
  const profile = powderProfile(list, { ...o.profile, start: o.twoThetaMin, stop: o.twoThetaMax });
  return { peaks, profile, dMin, warnings };
}
