/**
 * Fit of a simulated line list (e.g. the quasicrystal's stars) to a measured powder pattern:
 *   y_calc(2θ) = s · Σ_j I_j · pV(2θ − z − 2θ_j; H_j, η) + b0 + b1·2θ
 * with scale s, zero shift z (degrees, measured = true + z) and a linear background, by weighted least
 * squares (least-squares.ts). Weights 1/σ² from the file's σ column, else counting statistics σ² = max(y, 1)
 * (common practice). Agreement factors as defined in Young, The Rietveld Method (IUCr/OUP 1993), ch. 1:
 *   R_p = Σ|y_o − y_c| / Σ|y_o|,  R_wp = √(Σw(y_o − y_c)² / Σw y_o²),  R_exp = √((n − p)/Σw y_o²),  χ² = (R_wp/R_exp)².
 * Our own small fit (scale, zero, linear background) for the quasicrystal; periodic patterns have their own.
 */
import { cagliotiFwhm, pseudoVoigt, type ProfileShape } from '../profile';
import { leastSquares } from './least-squares';

export interface LineList {
  twoTheta: number;
  intensity: number;
}

export interface PatternFit {
  scale: number;
  scaleSigma: number;
  zeroShift: number;
  zeroShiftSigma: number;
  background: [number, number];
  rp: number;
  rwp: number;
  rexp: number;
  chi2: number;
  calculated: Float64Array;
  warnings: string[];
}

export function fitLinesToPattern(
  x: Float64Array,
  y: Float64Array,
  lines: LineList[],
  shape: ProfileShape,
  opts: { sigma?: Float64Array; zeroStart?: number; fitZero?: boolean } = {},
): PatternFit {
  const n = x.length;
  if (n < 10) throw new Error(`measured: ${n} points; need at least 10 to fit`);
  if (lines.length === 0) throw new Error('simulation: no lines in the measured range to fit');
  const w = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const s = opts.sigma?.[i];
    if (opts.sigma && !(s! > 0)) throw new Error(`sigma: point ${i + 1} has σ = ${s}; every σ must be positive`);
    w[i] = opts.sigma ? 1 / (s! * s!) : 1 / Math.max(y[i], 1);
  }
  const widths = lines.map((l) => cagliotiFwhm(l.twoTheta, shape));
  let cacheKey = '';
  let cache: Float64Array = new Float64Array(n);
  const profileAt = (zero: number): Float64Array => {
    const out = new Float64Array(n);
    lines.forEach((l, j) => {
      const c = l.twoTheta + zero;
      const h = widths[j];
      const lo = lowerBound(x, c - 30 * h);
      for (let i = lo; i < n && x[i] <= c + 30 * h; i++) out[i] += l.intensity * pseudoVoigt(x[i] - c, h, shape.eta);
    });
    return out;
  };
  let pKey = NaN;
  let prof: Float64Array = new Float64Array(n);
  const model = (p: number[], i: number) => {
    const key = p.join(',');
    if (key !== cacheKey) {
      if (p[1] !== pKey) {
        prof = profileAt(p[1]);
        pKey = p[1];
      }
      cache = Float64Array.from(prof, (v, k) => p[0] * v + p[2] + p[3] * x[k]);
      cacheKey = key;
    }
    return cache[i];
  };
  // Start: scale and flat background from the means.
  const p0 = profileAt(opts.zeroStart ?? 0);
  let sy = 0;
  let sp = 0;
  let ymin = Infinity;
  for (let i = 0; i < n; i++) {
    sy += y[i];
    sp += p0[i];
    ymin = Math.min(ymin, y[i]);
  }
  const b0 = Math.max(0, ymin);
  const s0 = sp > 0 ? Math.max(1e-12, (sy - b0 * n) / sp) : 1;
  const span = x[n - 1] - x[0];
  const res = leastSquares(y, w, model, [s0, opts.zeroStart ?? 0, b0, 0], [s0 * 1e-4, 1e-4, Math.max(1e-3, Math.abs(b0) * 1e-4), 1e-6 * Math.max(1, Math.abs(b0)) / Math.max(span, 1)], {
    minValues: [0, -1, -1e12, -1e12],
    maxValues: [1e12, 1, 1e12, 1e12],
  });
  const [scale, zero, c0, c1] = res.params;
  const calculated = Float64Array.from({ length: n }, (_, i) => model(res.params, i));
  let num = 0;
  let den = 0;
  let wn = 0;
  let wd = 0;
  for (let i = 0; i < n; i++) {
    const d = y[i] - calculated[i];
    num += Math.abs(d);
    den += Math.abs(y[i]);
    wn += w[i] * d * d;
    wd += w[i] * y[i] * y[i];
  }
  const rwp = Math.sqrt(wn / wd);
  const rexp = Math.sqrt((n - 4) / wd);
  const warnings: string[] = [];
  if (Math.abs(zero) > 0.5) warnings.push(`zero shift ${zero.toFixed(3)}° is large: check the wavelength and the quasilattice constant`);
  return {
    scale,
    scaleSigma: res.sigma[0],
    zeroShift: zero,
    zeroShiftSigma: res.sigma[1],
    background: [c0, c1],
    rp: num / den,
    rwp,
    rexp,
    chi2: (rwp / rexp) ** 2,
    calculated,
    warnings,
  };
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
