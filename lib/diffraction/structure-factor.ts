/**
 * Kinematic structure factors of periodic structures on integer (h, k, l):
 *
 *   F(h) = Σ_g g_g(s) · Σ_{j∈g} w_j exp(2πi h·x_j),   s = sinθ/λ = 1/(2d),  |Q| = 2π/d,  phase Q·r = 2π h·x
 *
 * (International Tables Vol. B §1.2; g_g includes exp(−B s²)). The per-group sums come from hkl-sum.ts.
 * Reciprocal vectors b_i with a_i · b_j = δ_ij (no 2π, lib/math reciprocal()), so G = h b1 + k b2 + l b3
 * has |G| = 1/d and Q = 2π G; fractional x_i = r · b_i.
 */
import { toFractional } from '../math/frac';
import { reciprocal, type Mat3 } from '../math/mat3';
import type { Structure } from '../structure/types';
import type { Radiation } from './form-factors';
import { groupAtoms, groupFactor } from './scatterers';
import { hklPartialSums, rowsFromSortedHkl } from './hkl-sum';
import { hklBox } from './hkl-box';
import { gridPlaneSums, type GridSumOptions } from './sf-grid';
import { axisSymmetry, type AxisSymmetry } from './sf-symmetry';

export interface HklFactors {
  /** Packed h k l, sorted by h, k, l. */
  hkl: Int32Array;
  /** d-spacing in Å. */
  d: Float64Array;
  re: Float64Array;
  im: Float64Array;
  /** |F|². */
  f2: Float64Array;
}

/**
 * All (h, k, l) ≠ 0 with d ≥ dMin, sorted by h, k, l. For 1D and 2D models (dim < 3) the indices of
 * the missing directions are held at 0 (the extra cell vectors are only padding there).
 */
export function enumerateHkl(s: Structure, dMin: number): Int32Array {
  return enumerateHklRange(s, dMin, false);
}

/**
 * As enumerateHkl, or with `half` only one of each Friedel pair ±h: h > 0, or h = 0 and k > 0, or
 * h = k = 0 and l > 0 (still sorted by h, k, l). Typed arrays and the metric tensor, two passes (count, fill).
 */
export function enumerateHklRange(s: Structure, dMin: number, half: boolean): Int32Array {
  const { hMax, kMax, lMax, g, g2max } = hklBox(s, dMin);
  let out: Int32Array | null = null;
  for (let pass = 0; pass < 2; pass++) {
    let n = 0;
    for (let h = half ? 0 : -hMax; h <= hMax; h++) {
      for (let k = half && h === 0 ? 0 : -kMax; k <= kMax; k++) {
        const base = g[0][0] * h * h + 2 * g[0][1] * h * k + g[1][1] * k * k;
        const lin = 2 * (g[0][2] * h + g[1][2] * k);
        for (let l = half && h === 0 && k === 0 ? 1 : -lMax; l <= lMax; l++) {
          if (h === 0 && k === 0 && l === 0) continue;
          if (base + l * (lin + g[2][2] * l) <= g2max) {
            if (out) {
              out[3 * n] = h;
              out[3 * n + 1] = k;
              out[3 * n + 2] = l;
            }
            n++;
          }
        }
      }
    }
    if (!out) out = new Int32Array(3 * n);
  }
  return out!;
}

export type StructureFactorMethod = 'auto' | 'direct' | 'grid';

export interface StructureFactorOptions {
  /**
   * direct: the exact sum over atoms and reflections (the reference). grid: Gaussian gridding + FFT
   * (sf-grid.ts), |ΔF| ≤ tolerance · Σ|w_j| (× the form factor). auto (default): grid for 3D cells when
   * atoms × reflections exceeds GRID_THRESHOLD, direct otherwise.
   */
  method?: StructureFactorMethod;
  /** Error bound of the grid method relative to Σ_j |w_j f_j| (default 1e-5, see sf-grid.ts). */
  tolerance?: number;
  onProgress?: (fraction: number) => void;
  /**
   * Grid route: spread one atom per orbit of the structure's axis-sign symmetry (sf-symmetry.ts) and expand
   * the sums by symmetry. Default true; false spreads every atom (same result within the tolerance).
   */
  symmetry?: boolean | AxisSymmetry;
}

/** Atoms × reflections above which `auto` takes the grid route (a few tenths of a second of direct sums). */
export const GRID_THRESHOLD = 5e7;

/**
 * Progress reporter of the structure-factor sums running inside `fn` (for callers that reach the sums
 * through functions without an options argument, e.g. the powder pattern in the Web Worker).
 */
let scopedProgress: ((fraction: number) => void) | undefined;
export function withStructureFactorProgress<T>(report: (fraction: number) => void, fn: () => T): T {
  const before = scopedProgress;
  scopedProgress = report;
  try {
    return fn();
  } finally {
    scopedProgress = before;
  }
}

function chooseMethod(s: Structure, atoms: number, reflections: number, o: StructureFactorOptions): 'direct' | 'grid' {
  const m = o.method ?? 'auto';
  if (m !== 'auto') return m;
  return (s.dim ?? 3) === 3 && atoms * reflections > GRID_THRESHOLD ? 'grid' : 'direct';
}

/** Structure factors for a sorted hkl list (see enumerateHkl). */
export function structureFactorsHkl(s: Structure, hkl: Int32Array, radiation: Radiation, opts: StructureFactorOptions = {}): HklFactors {
  if (!s.cell) throw new Error('cell: the structure is not periodic');
  const recip = reciprocal(s.cell);
  const frac = toFractional(s.cell, s.positions);
  const { groups, groupOf, weight } = groupAtoms(s);
  const m = hkl.length / 3;
  const gre = new Float64Array(groups.length * m);
  const gim = new Float64Array(groups.length * m);
  const progress = opts.onProgress ?? scopedProgress;
  if (chooseMethod(s, groupOf.length, m, opts) === 'grid') {
    gridListSums(frac, groupOf, weight, groups.length, hkl, gre, gim, { tolerance: opts.tolerance, onProgress: progress }, opts.symmetry ?? true);
  } else {
    const rows = rowsFromSortedHkl(hkl);
    hklPartialSums(frac, groupOf, weight, rows, gre, gim, 0, groupOf.length, progress);
  }
  return combineGroups(hkl, recip, groups, radiation, gre, gim);
}

/**
 * Group sums for an arbitrary hkl list from the grid planes h ≥ 0: −h reflections are the conjugates
 * G(−h) = G(h)*; with `symmetry` only one atom per orbit is spread and G(h) = Σ_g ±G_rep(S_g h) (sf-symmetry.ts).
 */
function gridListSums(
  frac: Float64Array,
  groupOf: Uint16Array,
  weight: Float64Array,
  nGroups: number,
  hkl: Int32Array,
  gre: Float64Array,
  gim: Float64Array,
  opts: GridSumOptions,
  symmetry: boolean | AxisSymmetry,
): void {
  const m = hkl.length / 3;
  let hMax = 0;
  let kMax = 0;
  let lMax = 0;
  for (let i = 0; i < m; i++) {
    hMax = Math.max(hMax, Math.abs(hkl[3 * i]));
    kMax = Math.max(kMax, Math.abs(hkl[3 * i + 1]));
    lMax = Math.max(lMax, Math.abs(hkl[3 * i + 2]));
  }
  // Reflections bucketed by |h| (counting sort).
  const start = new Int32Array(hMax + 2);
  for (let i = 0; i < m; i++) start[Math.abs(hkl[3 * i]) + 1]++;
  for (let h = 0; h <= hMax; h++) start[h + 1] += start[h];
  const order = new Int32Array(m);
  const fill = start.slice(0, hMax + 1);
  for (let i = 0; i < m; i++) order[fill[Math.abs(hkl[3 * i])]++] = i;
  const nl = 2 * lMax + 1;
  const need = new Int32Array(2 * (hMax + 1));
  for (let i = 0; i < m; i++) {
    const h = Math.abs(hkl[3 * i]);
    need[2 * h] = Math.max(need[2 * h], Math.abs(hkl[3 * i + 1]));
    need[2 * h + 1] = Math.max(need[2 * h + 1], Math.abs(hkl[3 * i + 2]));
  }
  const sym = symmetry === false ? null : symmetry === true ? axisSymmetry(frac, groupOf, weight) : symmetry;
  let spreadFrac = frac;
  let spreadGroup = groupOf;
  let spreadWeight = weight;
  if (sym && sym.sign.length > 3) {
    const r = sym.rep.length;
    spreadFrac = new Float64Array(3 * r);
    spreadGroup = new Uint16Array(r);
    for (let t = 0; t < r; t++) {
      const j = sym.rep[t];
      spreadFrac[3 * t] = frac[3 * j] - sym.origin[0];
      spreadFrac[3 * t + 1] = frac[3 * j + 1] - sym.origin[1];
      spreadFrac[3 * t + 2] = frac[3 * j + 2] - sym.origin[2];
      spreadGroup[t] = groupOf[j];
    }
    spreadWeight = sym.repWeight;
  }
  // G(h) = T(h) Σ_cosets e^{2πi h·u} G_rep(S h), T(h) = Σ_t e^{2πi h·t} over the pure translations (sf-symmetry.ts).
  const nOps = sym ? sym.cosetSign.length / 3 : 1;
  const sign = sym?.cosetSign ?? Int8Array.of(1, 1, 1);
  const half = sym?.cosetHalf ?? Int8Array.of(0, 0, 0);
  const trans = sym?.transHalf ?? Int8Array.of(0, 0, 0);
  const nTrans = trans.length / 3;
  // Phases e^{2πi h c_x}, e^{2πi k c_y}, e^{2πi l c_z} that move the sums about c back to the file's origin.
  const shifted = spreadFrac !== frac && sym!.origin.some((c) => c !== 0);
  const phase = (c: number, lim: number) => {
    const t = new Float64Array(2 * (2 * lim + 1));
    for (let v = -lim; v <= lim; v++) {
      t[2 * (v + lim)] = Math.cos(2 * Math.PI * v * c);
      t[2 * (v + lim) + 1] = Math.sin(2 * Math.PI * v * c);
    }
    return t;
  };
  const px = shifted ? phase(sym!.origin[0], hMax) : null;
  const py = shifted ? phase(sym!.origin[1], kMax) : null;
  const pz = shifted ? phase(sym!.origin[2], lMax) : null;
  gridPlaneSums(
    spreadFrac,
    spreadGroup,
    spreadWeight,
    nGroups,
    hMax,
    kMax,
    lMax,
    (h, g, v) => {
      const off = g * m;
      for (let t = start[h]; t < start[h + 1]; t++) {
        const i = order[t];
        const hi = hkl[3 * i];
        const ki = hkl[3 * i + 1];
        const li = hkl[3 * i + 2];
        let tf = 0;
        for (let o = 0; o < nTrans; o++) tf += ((hi * trans[3 * o] + ki * trans[3 * o + 1] + li * trans[3 * o + 2]) & 1) === 0 ? 1 : -1;
        let re = 0;
        let im = 0;
        for (let o = 0; tf !== 0 && o < nOps; o++) {
          const sh = sign[3 * o] * hi;
          const sk = sign[3 * o + 1] * ki;
          const sl = sign[3 * o + 2] * li;
          // e^{2πi h·t}, t = half/2: −1 when h·(2t) is odd.
          const par = ((hi * half[3 * o] + ki * half[3 * o + 1] + li * half[3 * o + 2]) & 1) === 0 ? 1 : -1;
          if (sh >= 0) {
            const at = 2 * ((sk + kMax) * nl + sl + lMax);
            re += par * v[at];
            im += par * v[at + 1];
          } else {
            // G(−h, k, l) = G(h, −k, −l)*.
            const at = 2 * ((kMax - sk) * nl + lMax - sl);
            re += par * v[at];
            im -= par * v[at + 1];
          }
        }
        if (px && py && pz) {
          const a = 2 * (hi + hMax);
          const b = 2 * (ki + kMax);
          const c = 2 * (li + lMax);
          const qr = px[a] * py[b] - px[a + 1] * py[b + 1];
          const qi = px[a] * py[b + 1] + px[a + 1] * py[b];
          const pr = qr * pz[c] - qi * pz[c + 1];
          const pi = qr * pz[c + 1] + qi * pz[c];
          const r0 = re;
          re = r0 * pr - im * pi;
          im = r0 * pi + im * pr;
        }
        gre[off + i] = tf * re;
        gim[off + i] = tf * im;
      }
    },
    { ...opts, planeExtent: (h) => [need[2 * h], need[2 * h + 1]] },
  );
}

/** F = Σ_g g_g(s) G_g for each reflection, from group partial sums (also used by the worker path). */
export function combineGroups(
  hkl: Int32Array,
  recip: Mat3,
  groups: ReturnType<typeof groupAtoms>['groups'],
  radiation: Radiation,
  gre: Float64Array,
  gim: Float64Array,
): HklFactors {
  const m = hkl.length / 3;
  const d = new Float64Array(m);
  const re = new Float64Array(m);
  const im = new Float64Array(m);
  const f2 = new Float64Array(m);
  const g = [0, 1, 2].map((i) => [0, 1, 2].map((j) => recip[i][0] * recip[j][0] + recip[i][1] * recip[j][1] + recip[i][2] * recip[j][2]));
  const fac = new Float64Array(groups.length);
  let lastS2 = -1;
  // Cubic metric: |G|² = n/a² with n = h² + k² + l², so the scattering factors are tabulated by the integer n.
  const cubicMetric = g[0][1] === 0 && g[0][2] === 0 && g[1][2] === 0 && g[0][0] === g[1][1] && g[1][1] === g[2][2];
  let table: Float64Array | null = null;
  if (cubicMetric && m > 0) {
    let nMax = 0;
    for (let i = 0; i < 3 * m; i += 3) nMax = Math.max(nMax, hkl[i] * hkl[i] + hkl[i + 1] * hkl[i + 1] + hkl[i + 2] * hkl[i + 2]);
    if (nMax < 1e7) table = new Float64Array((nMax + 1) * groups.length).fill(NaN);
  }
  for (let i = 0; i < m; i++) {
    const h = hkl[3 * i];
    const k = hkl[3 * i + 1];
    const l = hkl[3 * i + 2];
    const G2 = g[0][0] * h * h + g[1][1] * k * k + g[2][2] * l * l + 2 * (g[0][1] * h * k + g[0][2] * h * l + g[1][2] * k * l);
    d[i] = 1 / Math.sqrt(G2);
    const s2 = G2 / 4;
    if (table) {
      const at = (h * h + k * k + l * l) * groups.length;
      if (Number.isNaN(table[at])) for (let c = 0; c < groups.length; c++) table[at + c] = groupFactor(groups[c], radiation, s2);
      for (let c = 0; c < groups.length; c++) fac[c] = table[at + c];
    } else if (s2 !== lastS2) {
      // Scattering factors depend on |G| only: reuse them while consecutive reflections share it.
      for (let c = 0; c < groups.length; c++) fac[c] = groupFactor(groups[c], radiation, s2);
      lastS2 = s2;
    }
    let r = 0;
    let q = 0;
    for (let c = 0; c < groups.length; c++) {
      r += fac[c] * gre[c * m + i];
      q += fac[c] * gim[c * m + i];
    }
    re[i] = r;
    im[i] = q;
    f2[i] = r * r + q * q;
  }
  return { hkl, d, re, im, f2 };
}
