/**
 * The calculated powder profile of a fit at the measured points:
 *
 *   y_c(x) = b(x) + s · Σ_r S_r Lp(2θ_r) [ pV(x − 2θ_r − z; H_r, η) + R₂ pV(x − 2θ′_r − z; H′_r, η) ] / N₀
 *
 * r runs over powder lines with d-spacing d_r and strength S_r = Σ m|F|² (families at that d);
 * 2θ_r = 2 asin(λ / 2k d_r) with k the isotropic scale of the cell (lattice constant a = k a₀);
 * 2θ′_r the same for the second line λ₂ (Kα2, intensity ratio R₂); z the zero shift (measured position
 * = calculated + z); H_r the Caglioti FWHM at 2θ_r (profile.ts); b the Chebyshev background
 * (chebyshev.ts); N₀ the largest S·Lp at k = 1 (so s is of the order of the largest peak area).
 * |F|² is held at its value for the starting cell (the form factors change by far less than the
 * fit's other uncertainties for the small k − 1 a fit explores).
 */
import type { Radiation } from '../form-factors';
import { lorentzPolarization } from '../lorentz-polarization';
import { pseudoVoigt } from '../profile';
import { chebyshevBasis, chebyshevT } from './chebyshev';

export interface FitLine {
  d: number;
  /** Σ m|F|² of the line. */
  strength: number;
  hkl: number[] | null;
}

export interface FitParams {
  scale: number;
  zero: number;
  background: number[];
  U: number;
  V: number;
  W: number;
  /** Isotropic cell scale k (1 = the model's cell). */
  lattice: number;
}

export interface FitSetup {
  x: Float64Array;
  lines: FitLine[];
  wavelength: number;
  radiation: Radiation;
  monochromator2Theta?: number;
  wavelength2?: number;
  ratio2?: number;
  eta: number;
}

/**
 * Peaks are cut at ±CUT FWHM at least (the pseudo-Voigt Lorentz tail beyond holds 1.1 % of the area at
 * η = 1); when the pattern has few lines, wider, up to the whole range, within a budget of point
 * evaluations per model evaluation — the far Lorentz tails of strong peaks otherwise end up in the
 * background.
 */
const CUT = 30;
const BUDGET = 1.5e6;
const DEG = Math.PI / 180;

function twoTheta(d: number, lambda: number): number {
  const x = lambda / (2 * d);
  return x >= 1 ? NaN : (2 * Math.asin(x)) / DEG;
}

function fwhm(tt: number, p: FitParams): number {
  const t = Math.tan((tt * DEG) / 2);
  const h2 = p.U * t * t + p.V * t + p.W;
  return Math.sqrt(Math.max(h2, 1e-8));
}

function lowerBound(x: Float64Array, v: number): number {
  let lo = 0;
  let hi = x.length;
  while (lo < hi) {
    const m = (lo + hi) >> 1;
    if (x[m] < v) lo = m + 1;
    else hi = m;
  }
  return lo;
}

export class PowderFitModel {
  readonly setup: FitSetup;
  private readonly norm: number;
  private readonly basis: Float64Array[];

  constructor(setup: FitSetup, nBackground: number) {
    this.setup = setup;
    let norm = 0;
    for (const l of setup.lines) {
      const tt = twoTheta(l.d, setup.wavelength);
      if (Number.isFinite(tt) && tt > 0) norm = Math.max(norm, l.strength * lorentzPolarization(tt, setup.radiation, setup.monochromator2Theta));
    }
    if (!(norm > 0)) throw new Error('model: no reflection of the model falls in the measured range');
    this.norm = norm;
    const x = setup.x;
    const lo = x[0];
    const hi = x[x.length - 1];
    this.basis = Array.from(x, (v) => {
      const b = new Float64Array(nBackground);
      chebyshevBasis(chebyshevT(v, lo, hi), nBackground, b);
      return b;
    });
  }

  /** Background alone at every point. */
  background(p: FitParams): Float64Array {
    const n = this.setup.x.length;
    const out = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const b = this.basis[i];
      let v = 0;
      for (let j = 0; j < p.background.length; j++) v += p.background[j] * b[j];
      out[i] = v;
    }
    return out;
  }

  /** Peaks alone (unit scale), for the linear part of a fit. */
  peaks(p: FitParams): Float64Array {
    const { x, lines, wavelength, radiation, monochromator2Theta, wavelength2, ratio2, eta } = this.setup;
    const out = new Float64Array(x.length);
    const xMin = x[0];
    const xMax = x[x.length - 1];
    const perLine = BUDGET / (lines.length * (wavelength2 && ratio2 ? 2 : 1));
    const span = ((xMax - xMin) / Math.max(x.length - 1, 1)) * (perLine / 2);
    const add = (tt: number, area: number) => {
      if (!Number.isFinite(tt)) return;
      const h = fwhm(tt, p);
      const c = tt + p.zero;
      const half = Math.max(CUT * h, span);
      if (c + half < xMin || c - half > xMax) return;
      const i0 = lowerBound(x, c - half);
      for (let i = i0; i < x.length && x[i] <= c + half; i++) out[i] += area * pseudoVoigt(x[i] - c, h, eta);
    };
    for (const l of lines) {
      const d = l.d * p.lattice;
      const tt = twoTheta(d, wavelength);
      if (!Number.isFinite(tt)) continue;
      const a = (l.strength * lorentzPolarization(tt, radiation, monochromator2Theta)) / this.norm;
      add(tt, a);
      if (wavelength2 && ratio2) {
        const tt2 = twoTheta(d, wavelength2);
        if (Number.isFinite(tt2)) add(tt2, ((ratio2 * l.strength * lorentzPolarization(tt2, radiation, monochromator2Theta)) / this.norm));
      }
    }
    return out;
  }

  evaluate(p: FitParams): Float64Array {
    const y = this.peaks(p);
    const b = this.background(p);
    for (let i = 0; i < y.length; i++) y[i] = p.scale * y[i] + b[i];
    return y;
  }

  /** Calculated line positions (with zero shift) and their areas on the measured scale. */
  linePositions(p: FitParams): { twoTheta: number; area: number; fwhm: number; line: FitLine }[] {
    const { lines, wavelength, radiation, monochromator2Theta } = this.setup;
    const out: { twoTheta: number; area: number; fwhm: number; line: FitLine }[] = [];
    for (const l of lines) {
      const tt = twoTheta(l.d * p.lattice, wavelength);
      if (!Number.isFinite(tt)) continue;
      out.push({
        twoTheta: tt + p.zero,
        area: (p.scale * l.strength * lorentzPolarization(tt, radiation, monochromator2Theta)) / this.norm,
        fwhm: fwhm(tt, p),
        line: l,
      });
    }
    return out;
  }
}
