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
 * and truncating g to P points, a tail of about exp(−P²/8c²) of ĝ(0) at every frequency, which the division by
 * ĝ(K) = ĝ(0) exp(−2π²c²K²/N²) magnifies. With ε = tolerance/10, c and P are set so both are ≤ ε:
 *   c² = ln(1/ε) / (2π²(1 − 2K/N)),  P = ⌈√(8c² (ln(1/ε) + 2π²c²K²/N²))⌉.
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
  const p = Math.ceil(Math.sqrt(8 * c2 * (ln + 2 * Math.PI ** 2 * c2 * (kMax / n) ** 2)));
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
    // The Gaussian must fit in one period (the spreading adds no periodic images of its tails).
    if (plan.p > n) continue;
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

/** Everything one grid size needs: its Gaussian, the atoms' spreading weights, FFT and work rows. */
interface PlaneGrid {
  plan: GridPlan;
  fft: FFT;
  wy: Float64Array;
  wz: Float64Array;
  sy: Int32Array;
  sz: Int32Array;
  /** Deconvolution 1/(N ĝ(k)) for k = −kMax..kMax and l = −lMax..lMax of the call. */
  dk: Float64Array;
  dl: Float64Array;
  /** Per group, n rows of n complex values (plain arrays: fft.js runs 1.5–2× faster on them than on typed views). */
  rows: number[][][];
  /** After the z transforms, one column of n complex values per kept l (transposed, so the y transform reads it as is). */
  cols: number[][];
  out: number[];
}

function planeGrid(plan: GridPlan, frac: Float64Array, live: Int32Array, nGroups: number, kMax: number, lMax: number): PlaneGrid {
  const { n, c, p } = plan;
  const atoms = frac.length / 3;
  const wy = new Float64Array(atoms * p);
  const wz = new Float64Array(atoms * p);
  const sy = new Int32Array(atoms);
  const sz = new Int32Array(atoms);
  for (const j of live) {
    sy[j] = spreadWeights(frac[3 * j + 1], plan, j * p, wy) & (n - 1);
    sz[j] = spreadWeights(frac[3 * j + 2], plan, j * p, wz) & (n - 1);
  }
  // ĝ(k) = σ√(2π) exp(−2π²σ²k²), σ = c/N.
  const sigma = c / n;
  const decon = (k: number) => 1 / (n * sigma * Math.sqrt(2 * Math.PI) * Math.exp(-2 * Math.PI ** 2 * sigma * sigma * k * k));
  const fft = new FFT(n);
  return {
    plan,
    fft,
    wy,
    wz,
    sy,
    sz,
    dk: Float64Array.from({ length: 2 * kMax + 1 }, (_, i) => decon(i - kMax)),
    dl: Float64Array.from({ length: 2 * lMax + 1 }, (_, i) => decon(i - lMax)),
    rows: Array.from({ length: nGroups }, () => Array.from({ length: n }, () => fft.createComplexArray() as number[])),
    cols: Array.from({ length: 2 * lMax + 1 }, () => fft.createComplexArray() as number[]),
    out: fft.createComplexArray() as number[],
  };
}

/**
 * Plane by plane, the sums G_g(h, k, l) for 0 ≤ h ≤ hMax and |k| ≤ kMax, |l| ≤ lMax. For each plane and
 * group, onPlane(h, g, values) gets values interleaved (re, im) at index 2·((k + kMax)(2 lMax + 1) + l + lMax);
 * the array is reused for the next call, so copy out what you keep (only the planeExtent part is fresh).
 * Each plane uses the coarsest grid that holds its own extent (planeExtent), so the outer planes of a sphere of
 * reflections take smaller transforms; every grid meets the tolerance for the indices it serves.
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
  const atoms = groupOf.length;
  const liveList: number[] = [];
  for (let j = 0; j < atoms; j++) if (weight[j] !== 0) liveList.push(j);
  const live = Int32Array.from(liveList);
  const tx = new Float64Array(atoms);
  for (const j of live) tx[j] = 2 * Math.PI * (frac[3 * j] - Math.floor(frac[3 * j]));
  // Grid size per plane: the plan for the plane's own extent; per size, the Gaussian for the largest extent it serves.
  const extent = Array.from({ length: hMax + 1 }, (_, h) => {
    const [k, l] = opts.planeExtent?.(h) ?? [kMax, lMax];
    return [Math.min(k, kMax), Math.min(l, lMax)] as const;
  });
  const sizeOf = extent.map(([k, l]) => gridPlan(Math.max(k, l, 1), eps, live.length).n);
  const reach = new Map<number, number>();
  extent.forEach(([k, l], h) => reach.set(sizeOf[h], Math.max(reach.get(sizeOf[h]) ?? 1, k, l)));
  const grids = new Map<number, PlaneGrid>();
  const gridFor = (n: number) => {
    let g = grids.get(n);
    if (!g) {
      g = planeGrid(gaussianFor(n, reach.get(n)!, eps), frac, live, nGroups, kMax, lMax);
      grids.set(n, g);
    }
    return g;
  };
  const nl = 2 * lMax + 1;
  const values = new Float64Array(2 * (2 * kMax + 1) * nl);
  let widest: GridPlan | null = null;
  for (let h = 0; h <= hMax; h++) {
    const pg = gridFor(sizeOf[h]);
    const { plan, fft, wy, wz, sy, sz, dk, dl, rows, cols, out } = pg;
    const { n, p } = plan;
    if (!widest || n > widest.n) widest = plan;
    const mask = n - 1;
    for (const group of rows) for (const row of group) row.fill(0);
    for (let t = 0; t < live.length; t++) {
      const j = live[t];
      const group = rows[groupOf[j]];
      const ph = h * tx[j];
      const xr = weight[j] * Math.cos(ph);
      const xi = weight[j] * Math.sin(ph);
      const o = j * p;
      const z0 = sz[j];
      const wraps = z0 + p > n;
      for (let a = 0; a < p; a++) {
        const row = group[(sy[j] + a) & mask];
        const vr = xr * wy[o + a];
        const vi = xi * wy[o + a];
        if (!wraps) {
          for (let b = 0, idx = 2 * z0; b < p; b++, idx += 2) {
            const v = wz[o + b];
            row[idx] += vr * v;
            row[idx + 1] += vi * v;
          }
        } else {
          for (let b = 0; b < p; b++) {
            const v = wz[o + b];
            const idx = 2 * ((z0 + b) & mask);
            row[idx] += vr * v;
            row[idx + 1] += vi * v;
          }
        }
      }
    }
    const [kNeed, lNeed] = extent[h];
    for (let g = 0; g < nGroups; g++) {
      const group = rows[g];
      // z transforms of every row; forward FFT gives Σ e^{−2πi m n/N}, so +l sits at index (−l) mod N.
      for (let gy = 0; gy < n; gy++) {
        fft.transform(out, group[gy]);
        for (let l = -lNeed; l <= lNeed; l++) {
          const src = 2 * ((n - l) & mask);
          const col = cols[l + lMax];
          col[2 * gy] = out[src];
          col[2 * gy + 1] = out[src + 1];
        }
      }
      // y transforms of every kept l.
      for (let l = -lNeed; l <= lNeed; l++) {
        const li = l + lMax;
        fft.transform(out, cols[li]);
        for (let k = -kNeed; k <= kNeed; k++) {
          const src = 2 * ((n - k) & mask);
          const sc = dk[k + kMax] * dl[li];
          const dst = 2 * ((k + kMax) * nl + li);
          values[dst] = out[src] * sc;
          values[dst + 1] = out[src + 1] * sc;
        }
      }
      onPlane(h, g, values);
    }
    opts.onProgress?.((h + 1) / (hMax + 1));
  }
  return widest ?? gridPlan(Math.max(kMax, lMax, 1), eps, live.length);
}
