/**
 * Least-squares fit of a powder model to a measured pattern (the "Rietveld-like" profile fit of Young,
 * The Rietveld Method, 1993, ch. 1, without refining atom positions): scale, zero shift, Chebyshev
 * background (n terms), Caglioti U, V, W and, for periodic models, the isotropic cell scale k.
 *
 * Minimises Σ w_i (y_o,i − y_c,i)² with Levenberg–Marquardt (ml-levenberg-marquardt, run on the
 * weighted residuals √w (y_o − y_c) with unit weights — that package's own weighting scales the error by
 * w but its step by 1/w, so it is not used). Parameters are refined in units u_k (p = p₀ + u·q) so the
 * additive damping treats them alike. Starting point: scale and background by weighted linear least
 * squares; the zero shift from a scan over ±zeroSearch (peaks are narrow, a gradient step from 0 could
 * settle on a neighbour).
 *
 * Standard uncertainties: σ_k = √(C_kk), C = (Jᵀ W J)⁻¹ · χ²_red at the minimum (J by central
 * differences), χ²_red = Σ w (y_o − y_c)² / (N − P) — the usual scaling by the goodness of fit
 * (Young 1993 ch. 1; Prince, Mathematical Techniques in Crystallography, 2004). These are the
 * statistical uncertainties under the model; they do not include model errors (state it when shown).
 */
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { Matrix, pseudoInverse, solve } from 'ml-matrix';
import { agreement, type Agreement } from './agreement';
import { PowderFitModel, type FitLine, type FitParams, type FitSetup } from './model';

export interface RefineOptions {
  /** Chebyshev background terms (0–12). Default 4. */
  nBackground?: number;
  /** Starting Caglioti U, V, W (degrees²) and the fixed Lorentzian fraction η. */
  U: number;
  V: number;
  W: number;
  eta: number;
  refineZero?: boolean;
  refineWidths?: boolean;
  /** Refine the isotropic cell scale (periodic models). Default false. */
  refineLattice?: boolean;
  /** Half-width of the zero-shift scan, degrees. Default 0.5. */
  zeroSearch?: number;
  maxIterations?: number;
}

export interface RefinedParameter {
  name: string;
  value: number;
  sigma: number;
}

export interface RefineResult {
  params: FitParams;
  parameters: RefinedParameter[];
  /** Before: scale and a flat background only, no zero shift, starting widths. */
  initial: Agreement;
  final: Agreement;
  calculated: Float64Array;
  background: Float64Array;
  iterations: number;
  warnings: string[];
  model: PowderFitModel;
}

/** Weighted linear least squares y ≈ Σ_c a_c X_c; columns as arrays. Returns a or throws when singular. */
export function linearLeastSquares(columns: ArrayLike<number>[], y: ArrayLike<number>, w: ArrayLike<number>): number[] {
  const m = columns.length;
  const a = Matrix.zeros(m, m);
  const b = Matrix.zeros(m, 1);
  for (let i = 0; i < y.length; i++) {
    const wi = w[i];
    for (let r = 0; r < m; r++) {
      const xr = columns[r][i] * wi;
      b.set(r, 0, b.get(r, 0) + xr * y[i]);
      for (let c = r; c < m; c++) a.set(r, c, a.get(r, c) + xr * columns[c][i]);
    }
  }
  for (let r = 0; r < m; r++) for (let c = 0; c < r; c++) a.set(r, c, a.get(c, r));
  const sol = solve(a, b);
  const out = sol.to1DArray();
  if (!out.every(Number.isFinite)) throw new Error('fit: the linear part (scale, background) is singular');
  return out;
}

/** Scale and background (all n terms) for fixed nonlinear parameters. */
function linearPart(model: PowderFitModel, p: FitParams, yo: ArrayLike<number>, w: ArrayLike<number>, nBg: number): FitParams & { ss: number } {
  const peaks = model.peaks(p);
  const cols: Float64Array[] = [peaks];
  for (let j = 0; j < nBg; j++) {
    const unit = Array.from({ length: nBg }, (_, k) => (k === j ? 1 : 0));
    cols.push(model.background({ ...p, background: unit }));
  }
  const a = linearLeastSquares(cols, yo, w);
  let ss = 0;
  for (let i = 0; i < yo.length; i++) {
    let c = 0;
    for (let k = 0; k < cols.length; k++) c += a[k] * cols[k][i];
    ss += w[i] * (yo[i] - c) ** 2;
  }
  return { ...p, scale: a[0], background: a.slice(1), ss };
}

export function refinePowder(setup: FitSetup, yo: Float64Array, w: Float64Array, o: RefineOptions): RefineResult {
  const nBg = o.nBackground ?? 4;
  if (!Number.isInteger(nBg) || nBg < 0 || nBg > 12) throw new Error(`background: need 0 to 12 Chebyshev terms, got ${o.nBackground}`);
  if (yo.length !== setup.x.length || w.length !== yo.length) throw new Error('fit: observed, weights and x differ in length');
  const warnings: string[] = [];
  const model = new PowderFitModel(setup, Math.max(nBg, 1));
  const start: FitParams = { scale: 1, zero: 0, background: nBg > 0 ? [0] : [], U: o.U, V: o.V, W: o.W, lattice: 1 };

  // "Before": scale and flat background only (what a plain overlay gives).
  const strip = ({ ss: _ss, ...q }: FitParams & { ss: number }): FitParams => q;
  const before = strip(linearPart(model, { ...start }, yo, w, Math.min(nBg, 1)));
  const initial = agreement(yo, model.evaluate(before), w, 1 + Math.min(nBg, 1));

  let p = strip(linearPart(model, { ...start, background: new Array(nBg).fill(0) }, yo, w, nBg));
  if (o.refineZero !== false) {
    const half = o.zeroSearch ?? 0.5;
    let best = { ss: Infinity, z: 0 };
    const stepZ = Math.max(0.002, Math.sqrt(Math.max(o.W, 1e-6)) / 10);
    for (let z = -half; z <= half + 1e-12; z += stepZ) {
      const { ss } = linearPart(model, { ...p, zero: z }, yo, w, nBg);
      if (ss < best.ss) best = { ss, z };
    }
    p = strip(linearPart(model, { ...p, zero: best.z }, yo, w, nBg));
  }

  // Parameter vector.
  const names: string[] = ['scale'];
  const units: number[] = [Math.abs(p.scale) > 0 ? Math.abs(p.scale) * 0.01 : 1];
  if (o.refineZero !== false) {
    names.push('zero');
    units.push(0.01);
  }
  let ymax = 0;
  for (const v of yo) ymax = Math.max(ymax, Math.abs(v));
  for (let j = 0; j < nBg; j++) {
    names.push(`background${j}`);
    units.push(Math.max(ymax, 1) * 0.001);
  }
  if (o.refineWidths !== false) {
    names.push('U', 'V', 'W');
    units.push(0.001, 0.001, 0.001);
  }
  if (o.refineLattice) {
    names.push('lattice');
    units.push(1e-4);
  }
  const p0 = p;
  const toParams = (q: ArrayLike<number>): FitParams => {
    const r: FitParams = { ...p0, background: [...p0.background] };
    names.forEach((n, k) => {
      const v = q[k] * units[k];
      if (n === 'scale') r.scale = p0.scale + v;
      else if (n === 'zero') r.zero = p0.zero + v;
      else if (n === 'U') r.U = p0.U + v;
      else if (n === 'V') r.V = p0.V + v;
      else if (n === 'W') r.W = p0.W + v;
      else if (n === 'lattice') r.lattice = p0.lattice + v;
      else r.background[Number(n.slice(10))] = p0.background[Number(n.slice(10))] + v;
    });
    return r;
  };
  const sw = Float64Array.from(w, Math.sqrt);
  const target = Float64Array.from(yo, (v, i) => v * sw[i]);
  const idx = Float64Array.from(yo, (_, i) => i);
  const weighted = (q: number[]) => {
    const yc = model.evaluate(toParams(q));
    for (let i = 0; i < yc.length; i++) yc[i] *= sw[i];
    return yc;
  };
  const P = names.length;
  const minValues = names.map((n) => (n === 'lattice' ? -1000 : n === 'zero' ? -200 : -1e12));
  const maxValues = names.map((n) => (n === 'lattice' ? 1000 : n === 'zero' ? 200 : 1e12));
  // Rounds of a few iterations until the weighted sum of squares stops improving (the package only stops
  // on an absolute error or the iteration cap).
  let q = new Array(P).fill(0);
  let iterations = 0;
  let prev = Infinity;
  const maxIt = o.maxIterations ?? 200;
  while (iterations < maxIt) {
    const res = levenbergMarquardt(
      { x: idx, y: target },
      (qq: number[]) => {
        const v = weighted(qq);
        return (i: number) => v[i];
      },
      {
        initialValues: q,
        damping: 1e-3,
        gradientDifference: 1e-3,
        centralDifference: true,
        maxIterations: Math.min(8, maxIt - iterations),
        errorTolerance: 0,
        minValues,
        maxValues,
      },
    );
    iterations += res.iterations;
    q = res.parameterValues;
    const ss = res.parameterError;
    if (!(ss < prev * (1 - 1e-7))) break;
    prev = ss;
  }
  const params = toParams(q);
  const calculated = model.evaluate(params);
  const final = agreement(yo, calculated, w, P);

  // Covariance (Jᵀ W J)⁻¹ χ²_red, J of the weighted model by central differences in q.
  const n = yo.length;
  const jac = new Matrix(n, P);
  const h = 1e-3;
  for (let k = 0; k < P; k++) {
    const qp = [...q];
    const qm = [...q];
    qp[k] += h;
    qm[k] -= h;
    const yp = weighted(qp);
    const ym = weighted(qm);
    for (let i = 0; i < n; i++) jac.set(i, k, (yp[i] - ym[i]) / (2 * h));
  }
  const jtj = jac.transpose().mmul(jac);
  const cov = pseudoInverse(jtj);
  const parameters: RefinedParameter[] = names.map((name, k) => {
    const value =
      name === 'scale' ? params.scale : name === 'zero' ? params.zero : name === 'U' ? params.U : name === 'V' ? params.V : name === 'W' ? params.W : name === 'lattice' ? params.lattice : params.background[Number(name.slice(10))];
    return { name, value, sigma: units[k] * Math.sqrt(Math.max(cov.get(k, k), 0) * final.chi2) };
  });
  const x = setup.x;
  for (const tt of [x[0], x[x.length - 1]]) {
    const t = Math.tan((tt * Math.PI) / 360);
    const h2 = params.U * t * t + params.V * t + params.W;
    if (!(h2 > 0)) warnings.push(`profile: the fitted U, V, W give FWHM² = ${h2.toPrecision(3)} ≤ 0 at 2θ = ${tt.toFixed(2)}°; fix the widths or narrow the range`);
  }
  if (o.refineLattice && Math.abs(params.lattice - 1) > 0.05) warnings.push(`lattice: the fitted cell is ${((params.lattice - 1) * 100).toFixed(2)} % off the model's; check the model`);
  if (final.rwp > 2 * final.rexp) {
    warnings.push(`fit: R_wp = ${(final.rwp * 100).toFixed(2)} % is more than twice R_exp = ${(final.rexp * 100).toFixed(2)} %; the model does not describe the pattern within its noise, and the σ understate the error`);
  }
  return { params, parameters, initial, final, calculated, background: model.background(params), iterations, warnings, model };
}

export type { FitLine, FitParams, FitSetup };
