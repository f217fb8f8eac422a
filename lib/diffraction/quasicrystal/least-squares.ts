/**
 * Weighted non-linear least squares with standard uncertainties: Levenberg–Marquardt from the
 * ml-levenberg-marquardt package (Marquardt, J. SIAM 11 (1963) 431), then the covariance
 * C = s²·(JᵀWJ)⁻¹ at the minimum, s² = χ²/(n − p) (the usual estimate, e.g. Young, The Rietveld Method, ch. 1),
 * from a central-difference Jacobian.
 */
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { Matrix, inverse } from 'ml-matrix';

export interface LsqResult {
  params: number[];
  sigma: number[];
  chi2: number;
  /** χ²/(n − p). */
  reducedChi2: number;
  residuals: Float64Array;
  iterations: number;
}

/**
 * Fit y_i ≈ model(params, i) for i = 0..n−1 with weights w_i (1/σ_i², all > 0). `steps` are the finite-difference
 * steps for the Jacobian (one per parameter).
 */
export function leastSquares(
  y: ArrayLike<number>,
  w: ArrayLike<number>,
  model: (params: number[], i: number) => number,
  initial: number[],
  steps: number[],
  opts: { maxIterations?: number; minValues?: number[]; maxValues?: number[] } = {},
): LsqResult {
  const n = y.length;
  const p = initial.length;
  if (n <= p) throw new Error(`fit: ${n} data points for ${p} parameters; need more points than parameters`);
  const idx = Float64Array.from({ length: n }, (_, i) => i);
  // Weights enter by scaling both sides with √w_i (the package's own weights option scores steps with σ² where
  // it solves them with 1/σ², so it is left at 1).
  const sw = Float64Array.from(w, (v) => Math.sqrt(v));
  const res = levenbergMarquardt({ x: idx, y: Float64Array.from(y, (v, i) => v * sw[i]) }, (par) => (x) => model(par, x) * sw[x], {
    initialValues: initial,
    gradientDifference: steps,
    centralDifference: true,
    damping: 1e-3,
    maxIterations: opts.maxIterations ?? 200,
    errorTolerance: 1e-12,
    improvementThreshold: 1e-4,
    ...(opts.minValues ? { minValues: opts.minValues } : {}),
    ...(opts.maxValues ? { maxValues: opts.maxValues } : {}),
  });
  const par = res.parameterValues;
  const residuals = new Float64Array(n);
  let chi2 = 0;
  for (let i = 0; i < n; i++) {
    residuals[i] = y[i] - model(par, i);
    chi2 += w[i] * residuals[i] ** 2;
  }
  const J = new Matrix(n, p);
  for (let k = 0; k < p; k++) {
    const up = par.slice();
    const dn = par.slice();
    up[k] += steps[k];
    dn[k] -= steps[k];
    // all points at one parameter set, then the other (models may cache per parameter set)
    const fu = Float64Array.from({ length: n }, (_, i) => model(up, i));
    for (let i = 0; i < n; i++) J.set(i, k, (fu[i] - model(dn, i)) / (2 * steps[k]));
  }
  const A = new Matrix(p, p);
  for (let a = 0; a < p; a++)
    for (let b = 0; b < p; b++) {
      let s = 0;
      for (let i = 0; i < n; i++) s += w[i] * J.get(i, a) * J.get(i, b);
      A.set(a, b, s);
    }
  const red = chi2 / (n - p);
  let sigma: number[];
  try {
    const C = inverse(A);
    sigma = Array.from({ length: p }, (_, k) => Math.sqrt(Math.max(0, C.get(k, k) * red)));
  } catch {
    sigma = new Array<number>(p).fill(NaN);
  }
  return { params: par, sigma, chi2, reducedChi2: red, residuals, iterations: res.iterations };
}
