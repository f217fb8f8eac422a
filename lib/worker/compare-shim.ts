/**
 * TEMPORARY profile comparison, until lib/diffraction/compare.ts lands.
 * Calculated profile interpolated onto the measured 2θ, one least-squares scale k, then
 *   R_p = Σ|y_o − k·y_c| / Σ y_o,   R_wp = √(Σ w (y_o − k·y_c)² / Σ w y_o²),   w = 1/σ² (or 1/y_o)
 * (Young, The Rietveld Method, IUCr/OUP 1993, ch. 1). Peaks: measured local maxima above a fraction of
 * the largest, matched to the nearest calculated peak within a 2θ tolerance.
 */
export interface ProfileComparison {
  x: Float64Array;
  observed: Float64Array;
  calculated: Float64Array;
  residual: Float64Array;
  scale: number;
  rp: number;
  rwp: number;
  matches: { observed: number; calculated?: number; hkl?: string; delta?: number; intensity: number }[];
}

function interp(xs: Float64Array, ys: Float64Array, x: number): number {
  if (x <= xs[0]) return ys[0];
  if (x >= xs[xs.length - 1]) return ys[ys.length - 1];
  let lo = 0;
  let hi = xs.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (xs[mid] <= x) lo = mid;
    else hi = mid;
  }
  const t = (x - xs[lo]) / (xs[hi] - xs[lo]);
  return ys[lo] + t * (ys[hi] - ys[lo]);
}

export function compareProfiles(
  obs: { x: Float64Array; intensity: Float64Array; sigma?: Float64Array },
  calc: { twoTheta: Float64Array; intensity: Float64Array; peaks: { twoTheta: number; hkl?: string }[] },
  opts: { tolerance?: number; peakThreshold?: number } = {},
): ProfileComparison {
  const n = obs.x.length;
  if (n < 3) throw new Error('measured: needs at least 3 points');
  const yc = new Float64Array(n);
  for (let i = 0; i < n; i++) yc[i] = interp(calc.twoTheta, calc.intensity, obs.x[i]);
  const w = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const s = obs.sigma?.[i];
    w[i] = s && s > 0 ? 1 / (s * s) : 1 / Math.max(obs.intensity[i], 1e-9 + Math.abs(obs.intensity[i]));
  }
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < n; i++) {
    sxy += w[i] * obs.intensity[i] * yc[i];
    syy += w[i] * yc[i] * yc[i];
  }
  const k = syy > 0 ? sxy / syy : 1;
  const calculated = yc.map((v) => v * k);
  const residual = new Float64Array(n);
  let num = 0;
  let den = 0;
  let wnum = 0;
  let wden = 0;
  for (let i = 0; i < n; i++) {
    const r = obs.intensity[i] - calculated[i];
    residual[i] = r;
    num += Math.abs(r);
    den += Math.abs(obs.intensity[i]);
    wnum += w[i] * r * r;
    wden += w[i] * obs.intensity[i] * obs.intensity[i];
  }
  const tol = opts.tolerance ?? 0.2;
  const thr = opts.peakThreshold ?? 0.05;
  let ymax = 0;
  for (let i = 0; i < n; i++) ymax = Math.max(ymax, obs.intensity[i]);
  const matches: ProfileComparison['matches'] = [];
  for (let i = 1; i < n - 1; i++) {
    const y = obs.intensity[i];
    if (y < thr * ymax || y < obs.intensity[i - 1] || y <= obs.intensity[i + 1]) continue;
    let best: { twoTheta: number; hkl?: string } | undefined;
    for (const p of calc.peaks) if (Math.abs(p.twoTheta - obs.x[i]) <= tol && (!best || Math.abs(p.twoTheta - obs.x[i]) < Math.abs(best.twoTheta - obs.x[i]))) best = p;
    matches.push({ observed: obs.x[i], calculated: best?.twoTheta, hkl: best?.hkl, delta: best ? obs.x[i] - best.twoTheta : undefined, intensity: (100 * y) / ymax });
  }
  return { x: obs.x, observed: obs.intensity, calculated, residual, scale: k, rp: den > 0 ? num / den : NaN, rwp: wden > 0 ? Math.sqrt(wnum / wden) : NaN, matches };
}
