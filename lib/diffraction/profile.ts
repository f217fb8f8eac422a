/**
 * Peak profiles for powder patterns.
 * Pseudo-Voigt (Wertheim et al., J. Electron Spectrosc. 3 (1974) 295; common practice in Rietveld codes):
 *   pV(x) = η L(x) + (1 − η) G(x), both of unit area and the same FWHM H:
 *   G = (2/H)√(ln2/π) exp(−4 ln2 x²/H²),  L = (2/(πH)) / (1 + 4x²/H²).
 * Width: Caglioti, Paoletti & Ricci, Nucl. Instrum. 3 (1958) 223:  H² = U tan²θ + V tanθ + W  (degrees² of 2θ).
 */

const DEG = Math.PI / 180;
const LN2 = Math.LN2;

export interface ProfileShape {
  U: number;
  V: number;
  W: number;
  /** Lorentzian fraction 0..1. */
  eta: number;
}

export interface ProfilePeak {
  twoTheta: number;
  /** Integrated intensity. */
  intensity: number;
}

export interface ProfileOptions extends ProfileShape {
  start: number;
  stop: number;
  step: number;
  /** Background polynomial in 2θ (degrees): b0 + b1·2θ + b2·2θ² … (default flat 0). */
  background?: number[];
}

export function cagliotiFwhm(twoThetaDeg: number, { U, V, W }: Pick<ProfileShape, 'U' | 'V' | 'W'>): number {
  const t = Math.tan((twoThetaDeg * DEG) / 2);
  const h2 = U * t * t + V * t + W;
  if (!(h2 > 0)) {
    throw new Error(`profile: U, V, W give FWHM² = ${h2.toPrecision(4)} ≤ 0 at 2θ = ${twoThetaDeg.toFixed(3)}°; adjust U/V/W`);
  }
  return Math.sqrt(h2);
}

export function pseudoVoigt(x: number, fwhm: number, eta: number): number {
  const u = (2 * x) / fwhm;
  const g = ((2 / fwhm) * Math.sqrt(LN2 / Math.PI)) * Math.exp(-LN2 * u * u);
  const l = 2 / (Math.PI * fwhm) / (1 + u * u);
  return eta * l + (1 - eta) * g;
}

/** Sum of pseudo-Voigt peaks plus background on a uniform 2θ grid. Peaks are cut at ±40 FWHM. */
export function powderProfile(peaks: ProfilePeak[], opts: ProfileOptions): { twoTheta: Float64Array; intensity: Float64Array } {
  const { start, stop, step, eta } = opts;
  if (!(step > 0)) throw new Error(`step: must be positive, got ${step}`);
  if (!(stop > start)) throw new Error(`range: end ${stop} must exceed start ${start}`);
  if (!(eta >= 0 && eta <= 1)) throw new Error(`eta: must be between 0 and 1, got ${eta}`);
  const n = Math.floor((stop - start) / step + 1e-9) + 1;
  if (n > 2e6) throw new Error(`step: ${step}° gives ${n} points; use a larger step`);
  const tt = new Float64Array(n);
  const y = new Float64Array(n);
  const bg = opts.background ?? [];
  for (let i = 0; i < n; i++) {
    const x = start + i * step;
    tt[i] = x;
    let b = 0;
    for (let c = bg.length - 1; c >= 0; c--) b = b * x + bg[c];
    y[i] = b;
  }
  for (const p of peaks) {
    if (!(p.intensity > 0)) continue;
    const h = cagliotiFwhm(p.twoTheta, opts);
    const lo = Math.max(0, Math.ceil((p.twoTheta - 40 * h - start) / step));
    const hi = Math.min(n - 1, Math.floor((p.twoTheta + 40 * h - start) / step));
    for (let i = lo; i <= hi; i++) y[i] += p.intensity * pseudoVoigt(tt[i] - p.twoTheta, h, eta);
  }
  return { twoTheta: tt, intensity: y };
}
