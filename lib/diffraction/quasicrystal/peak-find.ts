/**
 * Peaks of a measured powder pattern: local maxima of a lightly smoothed copy whose topographic prominence
 * (height above the higher of the two lowest points reached before a higher peak on either side — the usual
 * definition, as in scipy.signal.find_peaks) exceeds a fraction of the pattern's range; each is then fitted on
 * the raw data with one pseudo-Voigt (profile.ts) plus a straight background over ±1.5 FWHM by least squares,
 * which gives its position with a standard uncertainty.
 */
import { pseudoVoigt } from '../profile';
import { leastSquares } from './least-squares';
import type { OnProgress } from './progress';

export interface FoundPeak {
  twoTheta: number;
  twoThetaSigma: number;
  /** Peak height above the local background. */
  height: number;
  /** Full width at half maximum, degrees 2θ. */
  fwhm: number;
  /** Integrated intensity above the background. */
  area: number;
  prominence: number;
}

export interface PeakFindOptions {
  /** Minimum prominence as a fraction of (max − min) of the pattern (default 0.01). */
  minProminence?: number;
  /** Half-width of the moving-average smoothing, in points (default 1). */
  smooth?: number;
  /** Progress (progress.ts): 0.05 when the candidates are known, then one report per fitted candidate, 1 at the end. */
  onProgress?: OnProgress;
}

export function findPeaks(x: Float64Array, y: Float64Array, o: PeakFindOptions = {}): FoundPeak[] {
  const n = x.length;
  if (n < 7) throw new Error(`measured: ${n} points; need at least 7 to find peaks`);
  for (let i = 1; i < n; i++) if (!(x[i] > x[i - 1])) throw new Error(`measured: x must increase strictly (point ${i + 1})`);
  const k = o.smooth ?? 1;
  const s = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let a = 0;
    let c = 0;
    for (let j = Math.max(0, i - k); j <= Math.min(n - 1, i + k); j++) {
      a += y[j];
      c++;
    }
    s[i] = a / c;
  }
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of s) {
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  const minProm = (o.minProminence ?? 0.01) * (hi - lo);
  const cand: { i: number; prom: number }[] = [];
  for (let i = 1; i < n - 1; i++) {
    if (!(s[i] > s[i - 1] && s[i] >= s[i + 1])) continue;
    let lmin = s[i];
    for (let j = i - 1; j >= 0 && s[j] <= s[i]; j--) lmin = Math.min(lmin, s[j]);
    let rmin = s[i];
    for (let j = i + 1; j < n && s[j] <= s[i]; j++) rmin = Math.min(rmin, s[j]);
    const prom = s[i] - Math.max(lmin, rmin);
    if (prom >= minProm) cand.push({ i, prom });
  }
  o.onProgress?.(0.05);
  const out: FoundPeak[] = [];
  cand.forEach(({ i, prom }, c) => {
    // Half-maximum crossings above the local floor give the starting width.
    const floor = s[i] - prom;
    const half = floor + prom / 2;
    let l = i;
    while (l > 0 && s[l] > half) l--;
    let r = i;
    while (r < n - 1 && s[r] > half) r++;
    const fwhm0 = Math.max(x[r] - x[l], 2 * (x[Math.min(i + 1, n - 1)] - x[i]));
    // Fit window: ±1.5 FWHM, not past the midpoints to the neighbouring candidates.
    let a = x[i] - 1.5 * fwhm0;
    let b = x[i] + 1.5 * fwhm0;
    if (c > 0) a = Math.max(a, (x[cand[c - 1].i] + x[i]) / 2);
    if (c < cand.length - 1) b = Math.min(b, (x[cand[c + 1].i] + x[i]) / 2);
    const idx: number[] = [];
    for (let j = 0; j < n; j++) if (x[j] >= a && x[j] <= b) idx.push(j);
    const peak: FoundPeak = { twoTheta: x[i], twoThetaSigma: (x[r] - x[l]) / 4, height: prom, fwhm: fwhm0, area: prom * fwhm0 * 1.064, prominence: prom };
    if (idx.length >= 7) {
      const xs = idx.map((j) => x[j]);
      const ys = idx.map((j) => y[j]);
      const ws = ys.map((v) => 1 / Math.max(Math.abs(v), 1));
      const x0 = x[i];
      // params: area, centre, fwhm, eta, b0, b1 (background about x0)
      const model = (p: number[], j: number) => p[0] * pseudoVoigt(xs[j] - p[1], Math.abs(p[2]), Math.min(1, Math.max(0, p[3]))) + p[4] + p[5] * (xs[j] - x0);
      try {
        const area0 = prom * fwhm0 * 1.064;
        const f = leastSquares(ys, ws, model, [area0, x0, fwhm0, 0.5, floor, 0], [area0 * 1e-4, fwhm0 * 1e-4, fwhm0 * 1e-4, 1e-3, Math.max(1e-6, Math.abs(floor) * 1e-4 + prom * 1e-6), prom * 1e-6 / fwhm0], {
          minValues: [0, a, fwhm0 / 5, 0, -1e12, -1e12],
          maxValues: [1e12, b, fwhm0 * 5, 1, 1e12, 1e12],
        });
        const [ar, ce, fw, eta] = f.params;
        if (Number.isFinite(ce) && ce > a && ce < b && ar > 0) {
          peak.twoTheta = ce;
          peak.twoThetaSigma = Number.isFinite(f.sigma[1]) ? f.sigma[1] : peak.twoThetaSigma;
          peak.fwhm = Math.abs(fw);
          peak.area = ar;
          peak.height = ar * pseudoVoigt(0, Math.abs(fw), eta);
        }
      } catch {
        // keep the smoothed estimate
      }
    }
    out.push(peak);
    // Outside the try above, so a callback that throws to stop the run is never swallowed.
    o.onProgress?.(0.05 + (0.95 * (c + 1)) / cand.length);
  });
  if (cand.length === 0) o.onProgress?.(1);
  return out;
}
