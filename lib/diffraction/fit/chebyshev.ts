/**
 * Chebyshev polynomials of the first kind as a powder background (common practice in Rietveld codes):
 *   b(x) = Σ_{j<n} c_j T_j(t),  t = 2 (x − x_min)/(x_max − x_min) − 1 ∈ [−1, 1],
 *   T_0 = 1, T_1 = t, T_{j+1} = 2 t T_j − T_{j−1}.
 */

/** T_0(t) … T_{n−1}(t) into out (length ≥ n). */
export function chebyshevBasis(t: number, n: number, out: Float64Array | number[]): void {
  if (n > 0) out[0] = 1;
  if (n > 1) out[1] = t;
  for (let j = 2; j < n; j++) out[j] = 2 * t * out[j - 1] - out[j - 2];
}

/** Map x in [lo, hi] to t in [−1, 1]. */
export function chebyshevT(x: number, lo: number, hi: number): number {
  return hi > lo ? (2 * (x - lo)) / (hi - lo) - 1 : 0;
}

export function chebyshevValue(c: ArrayLike<number>, t: number): number {
  let sum = 0;
  let t0 = 1;
  let t1 = t;
  for (let j = 0; j < c.length; j++) {
    const tj = j === 0 ? 1 : j === 1 ? t : 2 * t * t1 - t0;
    if (j >= 2) {
      t0 = t1;
      t1 = tj;
    }
    sum += c[j] * tj;
  }
  return sum;
}
