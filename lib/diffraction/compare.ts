/**
 * Comparison of a simulated powder profile with a measured one.
 *
 * Scale (and optional flat background) by weighted linear least squares, y_obs ≈ s·y_calc + b, with
 * weights w = 1/σ² from the file's σ column, else counting statistics w = 1/y_obs (fit/agreement.ts: a
 * point with y_obs ≤ 0 weighs like its neighbours, never the most). Agreement factors (Young, The
 * Rietveld Method, IUCr/OUP 1993, ch. 1 definitions, fit/agreement.ts):
 *   R_p  = Σ |y_obs − y_calc| / Σ |y_obs|
 *   R_wp = √( Σ w (y_obs − y_calc)² / Σ w y_obs² ),  R_exp = √((N − P)/Σ w y_obs²),  χ² = (R_wp/R_exp)²
 * Measured x on the |Q| or d axis is converted to 2θ with the given wavelength; the simulation is
 * interpolated linearly onto the measured points (points outside the simulated range are left out).
 * Peak table: local maxima of the measured pattern above `peakThreshold` × (max − min) prominence over
 * the neighbouring minima, each named after the simulated line that contributes most at that 2θ among
 * those within one peak width (fit/labels.ts; the nearest line only when none is within the width;
 * reflections at the same 2θ count as one line: the strongest hkl, the summed intensity).
 */
import type { MeasuredPattern } from '../formats/measured';
import { agreement, powderWeights } from './fit/agreement';
import { labelPeaks } from './fit/labels';
import type { RefinedParameter } from './fit/refine';

export interface SimReflection {
  twoTheta: number;
  d: number;
  hkl: number[] | null;
  intensity: number;
}

export interface CompareOptions {
  /** Needed when the measured axis is |Q| or d. */
  wavelength?: number;
  background?: boolean;
  peakThreshold?: number;
  /** Peak width (FWHM, degrees) of the simulated profile at 2θ, for labelling; default 0.1°. */
  fwhm?: (twoTheta: number) => number;
  /** Lorentzian fraction of the simulated profile, for labelling; default 0.5. */
  eta?: number;
}

export interface PeakMatch {
  twoTheta: number;
  d?: number;
  intensity: number;
  nearest: { twoTheta: number; d: number; hkl: number[] | null; intensity: number } | null;
  /** Measured − simulated, degrees 2θ. */
  misfit: number | null;
  /** False when no simulated line lies within one peak width (then `nearest` is just the nearest). */
  withinWidth?: boolean;
}

export interface CompareResult {
  scale: number;
  background: number;
  rp: number;
  rwp: number;
  rexp: number;
  chi2: number;
  /** Where the weights came from: the file's σ column or counting statistics. */
  weights: 'sigma' | 'counts';
  warnings: string[];
  points: number;
  twoTheta: Float64Array;
  observed: Float64Array;
  calculated: Float64Array;
  peaks: PeakMatch[];
  /** Present when the result comes from a least-squares fit (fit/fit-pattern.ts). */
  fit?: { parameters: RefinedParameter[]; initialRwp: number; iterations: number };
}

/** R_p and R_wp for given observed, calculated and weights. */
export function rFactors(yo: ArrayLike<number>, yc: ArrayLike<number>, w: ArrayLike<number>): { rp: number; rwp: number } {
  let num = 0;
  let den = 0;
  let wn = 0;
  let wd = 0;
  for (let i = 0; i < yo.length; i++) {
    const d = yo[i] - yc[i];
    num += Math.abs(d);
    den += Math.abs(yo[i]);
    wn += w[i] * d * d;
    wd += w[i] * yo[i] * yo[i];
  }
  return { rp: den > 0 ? num / den : NaN, rwp: wd > 0 ? Math.sqrt(wn / wd) : NaN };
}

/** Weighted least squares for y ≈ s·x (+ b). */
export function fitScale(y: ArrayLike<number>, x: ArrayLike<number>, w: ArrayLike<number>, withBackground: boolean): { scale: number; background: number } {
  let sw = 0, sx = 0, sy = 0, sxx = 0, sxy = 0;
  for (let i = 0; i < y.length; i++) {
    sw += w[i];
    sx += w[i] * x[i];
    sy += w[i] * y[i];
    sxx += w[i] * x[i] * x[i];
    sxy += w[i] * x[i] * y[i];
  }
  if (!withBackground) {
    if (!(sxx > 0)) throw new Error('simulation: the simulated profile is zero over the measured range');
    return { scale: sxy / sxx, background: 0 };
  }
  const det = sw * sxx - sx * sx;
  if (!(Math.abs(det) > 1e-300)) throw new Error('simulation: the simulated profile is flat over the measured range; cannot fit scale and background');
  return { scale: (sw * sxy - sx * sy) / det, background: (sxx * sy - sx * sxy) / det };
}

/** The measured x axis as 2θ in degrees (|Q| and d converted with λ; NaN where unreachable). */
export function toTwoTheta(m: MeasuredPattern, lambda?: number): Float64Array {
  if (m.axis === '2theta') return Float64Array.from(m.x);
  if (!(lambda && lambda > 0)) throw new Error(`wavelength: needed to convert the measured ${m.axis === 'q' ? '|Q|' : 'd'} axis to 2θ`);
  const out = new Float64Array(m.x.length);
  for (let i = 0; i < m.x.length; i++) {
    const sinth = m.axis === 'q' ? (m.x[i] * lambda) / (4 * Math.PI) : lambda / (2 * m.x[i]);
    out[i] = sinth <= 1 ? (2 * Math.asin(sinth) * 180) / Math.PI : NaN;
  }
  return out;
}

function interpolate(xs: Float64Array, ys: Float64Array, x: number): number {
  let lo = 0;
  let hi = xs.length - 1;
  if (!(x >= xs[0] && x <= xs[hi])) return NaN;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (xs[mid] <= x) lo = mid;
    else hi = mid;
  }
  const t = xs[hi] === xs[lo] ? 0 : (x - xs[lo]) / (xs[hi] - xs[lo]);
  return ys[lo] * (1 - t) + ys[hi] * t;
}

/** Local maxima with prominence ≥ threshold × (max − min). */
export function findPeaks(x: ArrayLike<number>, y: ArrayLike<number>, threshold: number): { x: number; y: number }[] {
  const n = y.length;
  let ymin = Infinity;
  let ymax = -Infinity;
  for (let i = 0; i < n; i++) {
    ymin = Math.min(ymin, y[i]);
    ymax = Math.max(ymax, y[i]);
  }
  const need = threshold * (ymax - ymin);
  const out: { x: number; y: number }[] = [];
  for (let i = 1; i < n - 1; i++) {
    if (!(y[i] > y[i - 1] && y[i] >= y[i + 1])) continue;
    let l = i;
    let leftMin = y[i];
    while (l > 0 && y[l - 1] <= y[i]) leftMin = Math.min(leftMin, y[--l]);
    let r = i;
    let rightMin = y[i];
    while (r < n - 1 && y[r + 1] <= y[i]) rightMin = Math.min(rightMin, y[++r]);
    if (y[i] - Math.max(leftMin, rightMin) >= need) out.push({ x: x[i], y: y[i] });
  }
  return out;
}

/** Reflections closer than this in 2θ (degrees) are one line of the peak table. */
const COINCIDENT_TWO_THETA = 1e-4;

export function comparePatterns(
  measured: MeasuredPattern,
  sim: { twoTheta: Float64Array; intensity: Float64Array },
  reflections: SimReflection[],
  o: CompareOptions = {},
): CompareResult {
  const tt = toTwoTheta(measured, o.wavelength);
  // keep ascending 2θ order (d axis reverses)
  const idx = Array.from(tt.keys()).filter((i) => Number.isFinite(tt[i])).sort((a, b) => tt[a] - tt[b]);
  const x: number[] = [];
  const yo: number[] = [];
  const yc: number[] = [];
  const sg: number[] = [];
  for (const i of idx) {
    const c = interpolate(sim.twoTheta, sim.intensity, tt[i]);
    if (!Number.isFinite(c)) continue;
    x.push(tt[i]);
    yo.push(measured.intensity[i]);
    yc.push(c);
    if (measured.sigma) sg.push(measured.sigma[i]);
  }
  if (x.length < 3) throw new Error('range: fewer than three measured points lie inside the simulated 2θ range');
  if (!yo.some((v) => v > 0)) throw new Error('intensity: the measured pattern has no positive intensities');
  const { w, source, warnings } = powderWeights(yo, measured.sigma ? sg : undefined);
  const withBg = o.background ?? true;
  const { scale, background } = fitScale(yo, yc, w, withBg);
  const calc = yc.map((v) => scale * v + background);
  const { rp, rwp, rexp, chi2 } = agreement(yo, calc, w, withBg ? 2 : 1);
  const mp = findPeaks(x, yo, o.peakThreshold ?? 0.02);
  const width = o.fwhm ?? (() => 0.1);
  // Reflections at one 2θ are one line: a cell written in P1 lists every symmetry-equivalent hkl on its
  // own, and in a cubic cell different families share h²+k²+l² (so d = a/√(h²+k²+l²)). Name the
  // strongest of them and give their summed intensity.
  const lines: { twoTheta: number; d: number; hkl: number[] | null; intensity: number; top: number }[] = [];
  for (const r of [...reflections].sort((p, q) => p.twoTheta - q.twoTheta)) {
    const last = lines[lines.length - 1];
    if (last && Math.abs(r.twoTheta - last.twoTheta) <= COINCIDENT_TWO_THETA) {
      last.intensity += r.intensity;
      if (r.intensity > last.top) {
        last.top = r.intensity;
        last.hkl = r.hkl;
      }
    } else lines.push({ twoTheta: r.twoTheta, d: r.d, hkl: r.hkl, intensity: r.intensity, top: r.intensity });
  }
  const labelled = labelPeaks(
    mp,
    lines.map((l) => ({ twoTheta: l.twoTheta, area: l.intensity * scale, fwhm: width(l.twoTheta), d: l.d, hkl: l.hkl })),
    o.eta ?? 0.5,
  );
  const peaks: PeakMatch[] = labelled.map((p) => ({
    twoTheta: p.twoTheta,
    d: o.wavelength ? o.wavelength / (2 * Math.sin((p.twoTheta * Math.PI) / 360)) : undefined,
    intensity: p.intensity,
    nearest: p.line ? { twoTheta: p.line.twoTheta, d: p.line.d, hkl: p.line.hkl, intensity: p.line.area / (scale || 1) } : null,
    misfit: p.misfit,
    withinWidth: p.withinWidth,
  }));
  return {
    scale,
    background,
    rp,
    rwp,
    rexp,
    chi2,
    weights: source,
    warnings,
    points: x.length,
    twoTheta: Float64Array.from(x),
    observed: Float64Array.from(yo),
    calculated: Float64Array.from(calc),
    peaks,
  };
}
