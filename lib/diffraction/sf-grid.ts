/**
 * Fast structure factors of large cells: exact phases along a*, Gaussian gridding + FFT in the (b*, c*) plane.
 *
 *   G_g(h, k, l) = Σ_{j∈g} w_j e^{2πi h x_j} e^{2πi (k y_j + l z_j)}
 *
 * For each h ≥ 0 (Friedel: G(−h) = G(h)*) the weighted phases w_j e^{2πi h x_j} are spread onto an N × N grid
 * over (y, z) with a truncated periodic Gaussian g(u) = exp(−u²/2σ²), σ = c/N, one 2D FFT gives every (k, l)
 * of the plane, and dividing by the Gaussian's transform undoes the spreading:
 *
 *   Σ_{n=0}^{N−1} g_per(n/N − y) e^{2πi k n/N} = N ĝ(k) e^{2πi k y} + N Σ_{m≠0} ĝ(mN − k) e^{2πi (k − mN) y},
 *   ĝ(k) = σ√(2π) exp(−2π²σ²k²)
 *
 * (Poisson summation; this is the Gaussian gridding of Dutt & Rokhlin, SIAM J. Sci. Comput. 14 (1993) 1368,
 * and Greengard & Lee, SIAM Review 46 (2004) 443, the same idea as sampling a Gaussian-blurred density and
 * dividing the blur out again, Ten Eyck, Acta Cryst. A33 (1977) 486; volumes and pages cited from memory.)
 * Two errors remain, both bounded
 * relative to each atom's term: aliasing ĝ(N − K)/ĝ(K) = exp(−2π²c²(1 − 2K/N)) for the largest index K used,
 * and truncating g to P points, about exp(−P²/8c²). With ε = tolerance/10, c and P are set so both are ≤ ε:
 *   c² = ln(1/ε) / (2π²(1 − 2K/N)),  P = ⌈√(8c² ln(1/ε))⌉.
 * The FFT is pruned: N transforms along z, then one along y for each l that is kept.
 *
 * Cost per plane ≈ atoms·P² + (N + 2L + 1) FFTs of length N (fft.js, radix 4), against atoms·(2K+1)(2L+1)
 * for the direct sum: for the 5/3 icosahedral approximant at Cu Kα (2440 atoms, ≈ 9·10⁵ reflections) about
 * 30× fewer operations. Keeping one axis exact keeps the memory to one plane per scattering group.
 */
import FFT from 'fft.js';

export interface GridSumOptions {
  /**
   * Error bound: |ΔF| ≤ tolerance · Σ_j |w_j| for every reflection (tolerance/10 is used for aliasing and for
   * truncation of each of the two gridded directions, which leaves room for the sum of the tails). Default 1e-5.
   */
  tolerance?: number;
  /** Fraction of the planes done, 0..1. */
  onProgress?: (fraction: number) => void;
  /** The largest |k| and |l| wanted in plane h (default kMax, lMax): fewer y transforms for the outer planes. */
  planeExtent?: (h: number) => [number, number];
}

export interface GridPlan {
  /** Grid points along y and z (a power of 2). */
  n: number;
  /** Gaussian width in grid steps, and spreading width in points. */
  c: number;
  p: number;
}

/** Gaussian width c (grid steps) and spreading width P for an n-point grid, indices ≤ kMax, tolerance eps. */
function gaussianFor(n: number, kMax: number, eps: number): GridPlan {
  const ln = Math.log(1 / eps);
  const c2 = ln / (2 * Math.PI ** 2 * (1 - (2 * kMax) / n));
  const p = Math.min(n, Math.ceil(Math.sqrt(8 * c2 * ln)));
  return { n, c: Math.sqrt(c2), p };
}

/** Smallest 1 − 2kMax/n: coarser grids need wide Gaussians whose deconvolution amplifies rounding. */
const MIN_MARGIN = 0.15;

/**
 * Grid size and Gaussian for indices |k|, |l| ≤ kMax at relative tolerance eps. The grid is a power of 2
 * (fft.js) with n ≥ 2kMax + 2 and 1 − 2kMax/n ≥ 0.15; among those the one with the least estimated work per
 * plane, atoms·P² (spreading) + 1.5·(n + 2kMax + 1)·n·log₂n (pruned FFT), is taken: a coarse grid needs a wider
 * Gaussian, a fine one longer transforms.
 */
export function gridPlan(kMax: number, eps: number, atoms = 1000): GridPlan {
  if (!(eps > 0 && eps < 0.1)) throw new Error(`tolerance: must be between 0 and 0.1, got ${eps}`);
  let best: GridPlan | null = null;
  let bestCost = Infinity;
  for (let n = 16; n <= 1 << 14; n *= 2) {
    if (n < 2 * kMax + 2 || 1 - (2 * kMax) / n < MIN_MARGIN) continue;
    const plan = gaussianFor(n, kMax, eps);
    const cost = atoms * plan.p * plan.p + 1.5 * (n + 2 * kMax + 1) * n * Math.log2(n);
    if (cost < bestCost) {
      best = plan;
      bestCost = cost;
    }
    if (n > 8 * (2 * kMax + 1)) break;
  }
  return best!;
}

/** Per-atom start index and P weights of the truncated Gaussian around fractional coordinate u. */
function spreadWeights(u: number, plan: GridPlan, at: number, w: Float64Array): number {
  const { n, c, p } = plan;
  const pos = (u - Math.floor(u)) * n; // in grid steps
  const start = Math.ceil(pos - p / 2);
  for (let a = 0; a < p; a++) {
    const d = start + a - pos;
    w[at + a] = Math.exp(-(d * d) / (2 * c * c));
  }
  return start;
}

/**
 * Plane by plane, the sums G_g(h, k, l) for 0 ≤ h ≤ hMax and |k| ≤ kMax, |l| ≤ lMax. For each plane and
 * group, onPlane(h, g, values) gets values interleaved (re, im) at index 2·((k + kMax)(2 lMax + 1) + l + lMax);
 * the array is reused for the next call, so copy out what you keep (only the planeExtent part is fresh).
 */
export function gridPlaneSums(
  frac: Float64Array,
  groupOf: Uint16Array,
  weight: Float64Array,
  nGroups: number,
  hMax: number,
  kMax: number,
  lMax: number,
  onPlane: (h: number, g: number, values: Float64Array) => void,
  opts: GridSumOptions = {},
): GridPlan {
  const tolerance = opts.tolerance ?? 1e-5;
  if (!(tolerance > 0 && tolerance < 0.1)) throw new Error(`tolerance: must be between 0 and 0.1, got ${tolerance}`);
  const eps = tolerance / 10;
  const plan = gridPlan(Math.max(kMax, lMax), eps, groupOf.length);
  const { n, c, p } = plan;
  const mask = n - 1;
  const atoms = groupOf.length;
  // Per-atom Gaussian weights (y and z) and start indices; x phase angle.
  const wy = new Float64Array(atoms * p);
  const wz = new Float64Array(atoms * p);
  const sy = new Int32Array(atoms);
  const sz = new Int32Array(atoms);
  const tx = new Float64Array(atoms);
  const live: number[] = [];
  for (let j = 0; j < atoms; j++) {
    if (weight[j] === 0) continue;
    live.push(j);
    sy[j] = spreadWeights(frac[3 * j + 1], plan, j * p, wy);
    sz[j] = spreadWeights(frac[3 * j + 2], plan, j * p, wz);
    tx[j] = 2 * Math.PI * (frac[3 * j] - Math.floor(frac[3 * j]));
  }
  // Deconvolution 1/(N ĝ(k)) with ĝ(k) = σ√(2π) exp(−2π²σ²k²), σ = c/N.
  const sigma = c / n;
  const decon = (k: number) => 1 / (n * sigma * Math.sqrt(2 * Math.PI) * Math.exp(-2 * Math.PI ** 2 * sigma * sigma * k * k));
  const dk = Float64Array.from({ length: 2 * kMax + 1 }, (_, i) => decon(i - kMax));
  const dl = Float64Array.from({ length: 2 * lMax + 1 }, (_, i) => decon(i - lMax));
  const nl = 2 * lMax + 1;
  const fft = new FFT(n);
  // fft.js runs fastest on its own plain arrays (packed doubles; measured 1.5–2× against Float64Array views).
  const inp = fft.createComplexArray() as number[];
  const out = fft.createComplexArray() as number[];
  // Padded planes (n + p)², so a patch never wraps while spreading; the pad is folded back before the FFT.
  const wide = n + p;
  const grids = Array.from({ length: nGroups }, () => new Float64Array(2 * wide * wide));
  for (const j of live) {
    sy[j] &= mask;
    sz[j] &= mask;
  }
  // After the z transforms: rows gy, kept l only.
  const mid = new Float64Array(2 * n * nl);
  const values = new Float64Array(2 * (2 * kMax + 1) * nl);
  for (let h = 0; h <= hMax; h++) {
    for (const grid of grids) grid.fill(0);
    for (const j of live) {
      const grid = grids[groupOf[j]];
      const ph = h * tx[j];
      const xr = weight[j] * Math.cos(ph);
      const xi = weight[j] * Math.sin(ph);
      const oy = j * p;
      for (let a = 0; a < p; a++) {
        const vr = xr * wy[oy + a];
        const vi = xi * wy[oy + a];
        let idx = 2 * ((sy[j] + a) * wide + sz[j]);
        for (let b = 0; b < p; b++, idx += 2) {
          const v = wz[oy + b];
          grid[idx] += vr * v;
          grid[idx + 1] += vi * v;
        }
      }
    }
    for (const grid of grids) {
      for (let r = 0; r < wide; r++) {
        const row = 2 * r * wide;
        for (let z = n; z < wide; z++) {
          grid[row + 2 * (z - n)] += grid[row + 2 * z];
          grid[row + 2 * (z - n) + 1] += grid[row + 2 * z + 1];
        }
      }
      for (let r = n; r < wide; r++) {
        for (let i = 0; i < 2 * n; i++) grid[2 * (r - n) * wide + i] += grid[2 * r * wide + i];
      }
    }
    const [kNeed, lNeed] = opts.planeExtent?.(h) ?? [kMax, lMax];
    for (let g = 0; g < nGroups; g++) {
      const grid = grids[g];
      // z transforms of every row; forward FFT gives Σ e^{−2πi m n/N}, so +l sits at index (−l) mod N.
      for (let gy = 0; gy < n; gy++) {
        const base = 2 * gy * wide;
        for (let i = 0; i < 2 * n; i++) inp[i] = grid[base + i];
        fft.transform(out, inp);
        for (let l = -lMax; l <= lMax; l++) {
          const src = 2 * ((n - l) & mask);
          const dst = 2 * (gy * nl + l + lMax);
          mid[dst] = out[src];
          mid[dst + 1] = out[src + 1];
        }
      }
      // y transforms of every kept l.
      for (let li = lMax - Math.min(lNeed, lMax); li <= lMax + Math.min(lNeed, lMax); li++) {
        for (let gy = 0; gy < n; gy++) {
          inp[2 * gy] = mid[2 * (gy * nl + li)];
          inp[2 * gy + 1] = mid[2 * (gy * nl + li) + 1];
        }
        fft.transform(out, inp);
        for (let k = -Math.min(kNeed, kMax); k <= Math.min(kNeed, kMax); k++) {
          const src = 2 * ((n - k) & mask);
          const s = dk[k + kMax] * dl[li];
          const dst = 2 * ((k + kMax) * nl + li);
          values[dst] = out[src] * s;
          values[dst + 1] = out[src + 1] * s;
        }
      }
      onPlane(h, g, values);
    }
    opts.onProgress?.((h + 1) / (hMax + 1));
  }
  return plan;
}
