/**
 * Fit of a simulated line list (e.g. the quasicrystal's stars) to a measured powder pattern:
 *   y_calc(2θ) = s · Σ_j I_j · pV(2θ − z − 2θ_j; H_j, η) + b0 + b1·2θ
 * with scale s, zero shift z (degrees, measured = true + z) and a linear background, by weighted least
 * squares: linear in s, b0, b1 for each z, and a scan with a parabola for z (our own small fit; σ(z) from the
 * curvature of χ²(z), σ(s) from the linear normal matrix, both times the reduced χ²). Weights 1/σ² from the file's σ column, else counting statistics σ² = max(y, 1)
 * (common practice). Agreement factors as defined in Young, The Rietveld Method (IUCr/OUP 1993), ch. 1:
 *   R_p = Σ|y_o − y_c| / Σ|y_o|,  R_wp = √(Σw(y_o − y_c)² / Σw y_o²),  R_exp = √((n − p)/Σw y_o²),  χ² = (R_wp/R_exp)².
 * Our own small fit (scale, zero, linear background) for the quasicrystal; periodic patterns have their own.
 */
import { cagliotiFwhm, pseudoVoigt, type ProfileShape } from '../profile';
import type { OnProgress } from './progress';

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
  opts: { sigma?: Float64Array; zeroStart?: number; fitZero?: boolean; onProgress?: OnProgress } = {},
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
  // Progress (progress.ts): the profile evaluations are the work; about 80 with the zero shift fitted (61 + 2
  // on the coarse scan, 11 + 2 on the fine one, the final profile and two for the curvature), 2 without.
  const expected = opts.fitZero === false ? 2 : 80;
  let evaluations = 0;
  const profileAt = (zero: number): Float64Array => {
    if (evaluations > 0) opts.onProgress?.(Math.min(0.99, evaluations / expected));
    evaluations++;
    const out = new Float64Array(n);
    lines.forEach((l, j) => {
      const c = l.twoTheta + zero;
      const h = widths[j];
      const lo = lowerBound(x, c - 30 * h);
      for (let i = lo; i < n && x[i] <= c + 30 * h; i++) out[i] += l.intensity * pseudoVoigt(x[i] - c, h, shape.eta);
    });
    return out;
  };
  // Scale and background are linear: for a given zero shift, weighted linear least squares on
  // (profile, 1, 2θ) gives them exactly; χ²(z) is then minimised over z by a scan (step 0.01°, ±range)
  // and a parabola through the three best points, iterated once on a finer scan.
  const linear = (prof: Float64Array) => {
    const A = [
      [0, 0, 0],
      [0, 0, 0],
      [0, 0, 0],
    ];
    const bvec = [0, 0, 0];
    for (let i = 0; i < n; i++) {
      const f = [prof[i], 1, x[i] - x0];
      for (let r = 0; r < 3; r++) {
        bvec[r] += w[i] * f[r] * y[i];
        for (let c = 0; c < 3; c++) A[r][c] += w[i] * f[r] * f[c];
      }
    }
    const inv = invert3(A);
    const p = [0, 1, 2].map((r) => inv[r][0] * bvec[0] + inv[r][1] * bvec[1] + inv[r][2] * bvec[2]);
    let chi2 = 0;
    for (let i = 0; i < n; i++) chi2 += w[i] * (y[i] - p[0] * prof[i] - p[1] - p[2] * (x[i] - x0)) ** 2;
    return { p, chi2, inv };
  };
  const x0 = x[0];
  const chiAt = (z: number) => linear(profileAt(z)).chi2;
  const range = opts.fitZero === false ? 0 : 0.3;
  let zBest = opts.zeroStart ?? 0;
  let step = 0.01;
  if (range > 0) {
    for (let pass = 0; pass < 2; pass++) {
      const lo = zBest - (pass === 0 ? range : 5 * step);
      const hi = zBest + (pass === 0 ? range : 5 * step);
      let bz = zBest;
      let bc = Infinity;
      for (let z = lo; z <= hi + 1e-12; z += step) {
        const c = chiAt(z);
        if (c < bc) {
          bc = c;
          bz = z;
        }
      }
      const cm = chiAt(bz - step);
      const cp = chiAt(bz + step);
      const den = cm - 2 * bc + cp;
      zBest = den > 0 ? bz + (step * (cm - cp)) / (2 * den) : bz;
      step /= 10;
    }
  }
  const final = linear(profileAt(zBest));
  const nPar = range > 0 ? 4 : 3;
  const red = final.chi2 / (n - nPar);
  // σ(z) from the curvature: χ²(z) ≈ χ²_min + (z − z₀)²/σ², scaled by the reduced χ² (usual practice)
  const hz = 0.002;
  const curv = range > 0 ? (chiAt(zBest - hz) - 2 * final.chi2 + chiAt(zBest + hz)) / (hz * hz) : NaN;
  const zeroSigma = curv > 0 ? Math.sqrt((2 / curv) * red) : NaN;
  const [scale, c0r, c1] = final.p;
  const c0 = c0r - c1 * x0;
  const zero = zBest;
  const profFinal = profileAt(zBest);
  const calculated = Float64Array.from({ length: n }, (_, i) => scale * profFinal[i] + c0 + c1 * x[i]);
  const res = { sigma: [Math.sqrt(final.inv[0][0] * red), zeroSigma] };
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
  const rexp = Math.sqrt((n - nPar) / wd);
  const warnings: string[] = [];
  if (Math.abs(zero) > 0.5) warnings.push(`zero shift ${zero.toFixed(3)}° is large: check the wavelength and the quasilattice constant`);
  opts.onProgress?.(1);
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

function invert3(m: number[][]): number[][] {
  const [a, b, c] = m[0];
  const [d, e, f] = m[1];
  const [g, h, k] = m[2];
  const A = e * k - f * h;
  const B = -(d * k - f * g);
  const C = d * h - e * g;
  const det = a * A + b * B + c * C;
  if (!(Math.abs(det) > 0)) throw new Error('fit: the simulated profile is zero or flat over the measured range');
  return [
    [A / det, -(b * k - c * h) / det, (b * f - c * e) / det],
    [B / det, (a * k - c * g) / det, -(a * f - c * d) / det],
    [C / det, -(a * h - b * g) / det, (a * e - b * d) / det],
  ];
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
