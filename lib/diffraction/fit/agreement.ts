/**
 * Weights and agreement indices of a powder fit (Young, The Rietveld Method, IUCr/OUP 1993, ch. 1):
 *   w_i  = 1/σ_i²                                    (σ from the file's third column, else counting
 *                                                     statistics σ_i² = y_i with a floor, see below)
 *   R_p  = Σ |y_o − y_c| / Σ |y_o|
 *   R_wp = √( Σ w (y_o − y_c)² / Σ w y_o² )
 *   R_exp = √( (N − P) / Σ w y_o² )
 *   χ²   = Σ w (y_o − y_c)² / (N − P) = (R_wp / R_exp)²   (goodness of fit S = √χ²)
 * N points, P refined parameters.
 *
 * Counting statistics without a σ column: σ_i² = y_i for y_i > 0 (Poisson: variance = mean, y_i its
 * estimate). A point with y_i ≤ 0 (an empty or background-subtracted channel) has no such estimate; its
 * variance is taken as the mean of the positive counts among its ±LOCAL neighbours (floored at one count),
 * so it weighs like its surroundings — never, as 1/y_min would give, the most of all.
 * For intensities that are not counts (largest below 100) the weights are still computed but a warning
 * says so.
 */

/** Neighbours on each side whose mean stands in for the variance of an empty channel. */
const LOCAL = 5;

export interface Weighting {
  w: Float64Array;
  source: 'sigma' | 'counts';
  warnings: string[];
}

export function powderWeights(y: ArrayLike<number>, sigma?: ArrayLike<number>): Weighting {
  const n = y.length;
  const w = new Float64Array(n);
  const warnings: string[] = [];
  if (sigma) {
    if (sigma.length !== n) throw new Error(`sigma: ${sigma.length} uncertainties for ${n} points`);
    for (let i = 0; i < n; i++) {
      if (!(sigma[i] > 0) || !Number.isFinite(sigma[i])) throw new Error(`sigma: point ${i + 1} has uncertainty ${sigma[i]}; must be positive`);
      w[i] = 1 / (sigma[i] * sigma[i]);
    }
    return { w, source: 'sigma', warnings };
  }
  let max = -Infinity;
  for (let i = 0; i < n; i++) {
    max = Math.max(max, y[i]);
    if (y[i] > 0) {
      w[i] = 1 / y[i];
      continue;
    }
    let sum = 0;
    let cnt = 0;
    for (let j = Math.max(0, i - LOCAL); j <= Math.min(n - 1, i + LOCAL); j++) {
      if (y[j] > 0) {
        sum += y[j];
        cnt++;
      }
    }
    w[i] = 1 / Math.max(cnt > 0 ? sum / cnt : 1, 1);
  }
  if (max < 100) {
    warnings.push(
      `weights: no σ column and the largest intensity is ${max.toPrecision(3)}, which does not look like counts; w = 1/y assumes counts, so R_exp and χ² are not meaningful — give σ as a third column`,
    );
  }
  return { w, source: 'counts', warnings };
}

export interface Agreement {
  rp: number;
  rwp: number;
  rexp: number;
  chi2: number;
  points: number;
  parameters: number;
}

export function agreement(yo: ArrayLike<number>, yc: ArrayLike<number>, w: ArrayLike<number>, parameters: number): Agreement {
  const n = yo.length;
  if (yc.length !== n || w.length !== n) throw new Error('agreement: observed, calculated and weights differ in length');
  if (!(n > parameters)) throw new Error(`range: ${n} points cannot determine ${parameters} parameters`);
  let num = 0;
  let den = 0;
  let wss = 0;
  let wyy = 0;
  for (let i = 0; i < n; i++) {
    const d = yo[i] - yc[i];
    num += Math.abs(d);
    den += Math.abs(yo[i]);
    wss += w[i] * d * d;
    wyy += w[i] * yo[i] * yo[i];
  }
  return {
    rp: den > 0 ? num / den : NaN,
    rwp: wyy > 0 ? Math.sqrt(wss / wyy) : NaN,
    rexp: wyy > 0 ? Math.sqrt((n - parameters) / wyy) : NaN,
    chi2: wss / (n - parameters),
    points: n,
    parameters,
  };
}
