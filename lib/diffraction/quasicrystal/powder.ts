/**
 * Powder pattern of a decorated icosahedral quasicrystal: the reflections of structure-factor.ts grouped
 * into icosahedral stars (star.ts: orbits of the 6D index vector under m-3-5, 120 operations), each line
 *   I = Σ_{h in star} |F(h)/N|² · Lp(2θ)
 * (Lp from lorentz-polarization.ts; summing the members rather than multiplying one by the multiplicity keeps
 * models that are not icosahedrally symmetric — edge sites, a phason offset — right), at 2θ from Bragg's law with
 * d = 2π/|Q∥|, scaled so that the strongest line is 100, and the profile of profile.ts.
 */
import { lorentzPolarization, twoThetaOfQ } from '../lorentz-polarization';
import { powderProfile, type ProfileShape } from '../profile';
import { qcReflections, type QcModel, type QcOptions } from './structure-factor';
import { progressRange, type OnProgress } from './progress';

export interface QcStar {
  /** Representative indices (lexicographically largest member). */
  indices: number[];
  label: string;
  N: number;
  M: number;
  multiplicity: number;
  qPar: number;
  qPerp: number;
  d: number;
  twoTheta: number;
  /** Mean |F/N|² over the star's members. */
  f2: number;
  /** Σ|F/N|²·Lp, strongest line = 100. */
  intensity: number;
}

export interface QcPowderOptions extends QcOptions {
  wavelength: number;
  twoThetaMin: number;
  twoThetaMax: number;
  /** Largest |Q⊥| (Å⁻¹) of the reflections summed; default 12/aR. */
  qperpMax?: number;
  /** Drop reflections with |F/N|² below this × |F(0)/N|² (default 1e-5). */
  threshold?: number;
  monochromator2Theta?: number;
  /** Second line (Kα2) in the profile only, with this intensity ratio. */
  wavelength2?: number;
  ratio2?: number;
  profile?: ProfileShape & { step: number; background?: number[] };
  /** Progress (progress.ts) of the reflection sums; with a Kα2 line the two wavelengths take half each. */
  onProgress?: OnProgress;
}

export interface QcPowderResult {
  stars: QcStar[];
  profile?: { twoTheta: Float64Array; intensity: Float64Array };
  warnings: string[];
}

export function qcPowderStars(model: QcModel, o: QcPowderOptions, lambda = o.wavelength): { stars: QcStar[]; warnings: string[] } {
  if (!(lambda > 0) || !Number.isFinite(lambda)) throw new Error(`wavelength: must be positive, got ${lambda}`);
  if (!(o.twoThetaMin >= 0 && o.twoThetaMax <= 180 && o.twoThetaMax > o.twoThetaMin)) {
    throw new Error(`range: need 0 ≤ start < end ≤ 180 degrees, got ${o.twoThetaMin}:${o.twoThetaMax}`);
  }
  const qmax = (4 * Math.PI * Math.sin((Math.min(o.twoThetaMax, 179.999) * Math.PI) / 360)) / lambda;
  const { reflections, warnings } = qcReflections(model, { ...o, qmax, threshold: o.threshold ?? 1e-5 });
  const groups = new Map<number, { star: QcStar; sum: number; count: number }>();
  for (const r of reflections) {
    if (r.qParNorm < 1e-9) continue;
    const rep = r.starIndices;
    const key = r.star;
    let g = groups.get(key);
    if (!g) {
      const tt = twoThetaOfQ(r.qParNorm, lambda);
      g = {
        star: { indices: rep, label: '', N: r.N, M: r.M, multiplicity: r.starSize, qPar: r.qParNorm, qPerp: r.qPerpNorm, d: (2 * Math.PI) / r.qParNorm, twoTheta: tt, f2: 0, intensity: 0 },
        sum: 0,
        count: 0,
      };
      groups.set(key, g);
    }
    g.sum += r.intensity;
    g.count++;
  }
  const stars: QcStar[] = [];
  let partial = 0;
  for (const { star, sum, count } of groups.values()) {
    if (!(star.twoTheta >= o.twoThetaMin && star.twoTheta <= o.twoThetaMax)) continue;
    const m = star.multiplicity;
    // Members below the threshold are left out of the sum; the multiplicity is the full orbit size.
    if (count !== m) partial++;
    star.multiplicity = m;
    star.f2 = sum / m;
    star.intensity = sum * lorentzPolarization(star.twoTheta, o.radiation ?? 'xray', o.monochromator2Theta);
    star.label = starLabel(star.indices);
    stars.push(star);
  }
  if (partial > 0) warnings.push(`${partial} stars have members below the intensity threshold (a model without full icosahedral symmetry); their weak members are left out`);
  stars.sort((a, b) => a.twoTheta - b.twoTheta || b.intensity - a.intensity);
  return { stars, warnings };
}

function starLabel(h: number[]): string {
  return h.map((v) => (Number.isInteger(v) ? String(v) : `${v * 2}/2`)).join(' ');
}

export function qcPowder(model: QcModel, o: QcPowderOptions): QcPowderResult {
  const second = o.profile && o.wavelength2 !== undefined;
  const { stars, warnings } = qcPowderStars(model, { ...o, onProgress: progressRange(o.onProgress, 0, second ? 0.5 : 1) });
  let max = 0;
  for (const s of stars) max = Math.max(max, s.intensity);
  const k = max > 0 ? 100 / max : 1;
  for (const s of stars) s.intensity *= k;
  if (stars.length === 0) warnings.push('no reflection of the model falls in the 2θ range');
  if (!o.profile) return { stars, warnings };
  const list = stars.map((s) => ({ twoTheta: s.twoTheta, intensity: s.intensity }));
  if (o.wavelength2 !== undefined) {
    const stars2 = qcPowderStars(model, { ...o, onProgress: progressRange(o.onProgress, 0.5, 1) }, o.wavelength2).stars;
    for (const s of stars2) list.push({ twoTheta: s.twoTheta, intensity: s.intensity * k * (o.ratio2 ?? 0.5) });
  }
  const profile = powderProfile(list, { ...o.profile, start: o.twoThetaMin, stop: o.twoThetaMax });
  return { stars, profile, warnings };
}
