/**
 * The hot loop of periodic diffraction: per-group partial structure factors on integer (h, k, l).
 *
 *   G_g(h) = Σ_{j ∈ g} w_j exp(2πi (h x_j + k y_j + l z_j))
 *
 * Reflections are given as rows of consecutive l at fixed (h, k). For each atom the 1D phase tables
 * e^{2πi h x}, e^{2πi k y}, e^{2πi l z} are built once (3·(2H+1) cos/sin), then every term costs one
 * complex product of the row factor with the l-table entry — no trigonometry per term (the cos+sin
 * per atom×reflection that a naive sum pays is the cost this avoids). Atoms are the outer loop, so the
 * function can be split over atom ranges [j0, j1) (e.g. worker threads) and the partial sums added.
 */

export interface HklRows {
  /** Row (h, k) and inclusive l range, one entry per row. */
  h: Int32Array;
  k: Int32Array;
  l0: Int32Array;
  l1: Int32Array;
  /** Total reflections = Σ (l1 − l0 + 1). Reflection m of row r is at offset start[r] + (l − l0[r]). */
  start: Int32Array;
  count: number;
}

/** Group a list of reflections (packed h k l) into rows; the list must already be sorted by h, k, then l ascending with no gaps in l. */
export function rowsFromSortedHkl(hkl: Int32Array): HklRows {
  const m = hkl.length / 3;
  const h: number[] = [];
  const k: number[] = [];
  const l0: number[] = [];
  const l1: number[] = [];
  const start: number[] = [];
  for (let i = 0; i < m; i++) {
    const hi = hkl[3 * i];
    const ki = hkl[3 * i + 1];
    const li = hkl[3 * i + 2];
    const r = h.length - 1;
    if (r >= 0 && h[r] === hi && k[r] === ki && l1[r] + 1 === li) {
      l1[r] = li;
    } else {
      h.push(hi);
      k.push(ki);
      l0.push(li);
      l1.push(li);
      start.push(i);
    }
  }
  return {
    h: Int32Array.from(h),
    k: Int32Array.from(k),
    l0: Int32Array.from(l0),
    l1: Int32Array.from(l1),
    start: Int32Array.from(start),
    count: m,
  };
}

function extent(a: Int32Array, b?: Int32Array): [number, number] {
  let lo = 0;
  let hi = 0;
  for (let i = 0; i < a.length; i++) {
    if (a[i] < lo) lo = a[i];
    if (a[i] > hi) hi = a[i];
    if (b) {
      if (b[i] < lo) lo = b[i];
      if (b[i] > hi) hi = b[i];
    }
  }
  return [lo, hi];
}

function phaseTable(x: number, lo: number, hi: number, re: Float64Array, im: Float64Array, at = 0, w = 1): void {
  // Direct cos/sin for each integer multiple keeps the table exact to rounding (no drift).
  const t = 2 * Math.PI * (x - Math.floor(x));
  for (let n = lo; n <= hi; n++) {
    re[at + n - lo] = w * Math.cos(n * t);
    im[at + n - lo] = w * Math.sin(n * t);
  }
}

/** Atoms per chunk whose phase tables are built together, and reflections per output block. */
const ATOM_CHUNK = 128;
const BLOCK_REFLECTIONS = 1536;

/** Consecutive row ranges [r0, r1) holding at most BLOCK_REFLECTIONS reflections each (at least one row). */
function rowBlocks(rows: HklRows): Int32Array {
  const out: number[] = [0];
  let n = 0;
  for (let r = 0; r < rows.h.length; r++) {
    const len = rows.l1[r] - rows.l0[r] + 1;
    if (n > 0 && n + len > BLOCK_REFLECTIONS) {
      out.push(r);
      n = 0;
    }
    n += len;
  }
  out.push(rows.h.length);
  return Int32Array.from(out);
}

/** Progress of a long sum: fraction of the atoms done, 0..1. */
export type SumProgress = (fraction: number) => void;

/**
 * Accumulate partial sums into re/im (length nGroups × rows.count, group-major: index g·count + m).
 * frac: packed fractional coordinates; groupOf/weight per atom; atoms j0 ≤ j < j1.
 *
 * Cache blocking: the atoms are taken in chunks of ATOM_CHUNK whose weighted phase tables are built once;
 * each chunk then runs over the reflections in blocks of ≤ BLOCK_REFLECTIONS, so the block of F being
 * accumulated stays in the processor's cache while the whole chunk passes over it. (Streaming the whole F
 * array once per atom, as a plain atom-outer loop does, is memory-bound for ≳10⁵ reflections.)
 * With `realOnly`, only Re F is accumulated (im untouched): the cos-only sum of a centrosymmetric set.
 */
export function hklPartialSums(
  frac: Float64Array,
  groupOf: Uint16Array,
  weight: Float64Array,
  rows: HklRows,
  re: Float64Array,
  im: Float64Array,
  j0 = 0,
  j1 = groupOf.length,
  progress?: SumProgress,
  realOnly = false,
): void {
  const [hLo, hHi] = extent(rows.h);
  const [kLo, kHi] = extent(rows.k);
  const [lLo, lHi] = extent(rows.l0, rows.l1);
  const nh = hHi - hLo + 1;
  const nk = kHi - kLo + 1;
  const nl = lHi - lLo + 1;
  const xr = new Float64Array(ATOM_CHUNK * nh);
  const xi = new Float64Array(ATOM_CHUNK * nh);
  const yr = new Float64Array(ATOM_CHUNK * nk);
  const yi = new Float64Array(ATOM_CHUNK * nk);
  const zr = new Float64Array(ATOM_CHUNK * nl);
  const zi = new Float64Array(ATOM_CHUNK * nl);
  const atom = new Int32Array(ATOM_CHUNK);
  const count = rows.count;
  const rh = rows.h;
  const rk = rows.k;
  const rl0 = rows.l0;
  const rl1 = rows.l1;
  const rs = rows.start;
  const blocks = rowBlocks(rows);
  let j = j0;
  while (j < j1) {
    // Gather the next chunk of atoms with non-zero weight; the weight goes into the x table.
    let n = 0;
    for (; j < j1 && n < ATOM_CHUNK; j++) {
      const w = weight[j];
      if (w === 0) continue;
      phaseTable(frac[3 * j], hLo, hHi, xr, xi, n * nh, w);
      phaseTable(frac[3 * j + 1], kLo, kHi, yr, yi, n * nk);
      phaseTable(frac[3 * j + 2], lLo, lHi, zr, zi, n * nl);
      atom[n++] = j;
    }
    for (let b = 0; b + 1 < blocks.length; b++) {
      const r0 = blocks[b];
      const r1 = blocks[b + 1];
      for (let a = 0; a < n; a++) {
        const base = groupOf[atom[a]] * count;
        const ox = a * nh - hLo;
        const oy = a * nk - kLo;
        const oz = a * nl - lLo;
        for (let r = r0; r < r1; r++) {
          const ix = ox + rh[r];
          const iy = oy + rk[r];
          const pr = xr[ix] * yr[iy] - xi[ix] * yi[iy];
          const pi = xr[ix] * yi[iy] + xi[ix] * yr[iy];
          let m = base + rs[r];
          const end = oz + rl1[r];
          if (realOnly) {
            for (let c = oz + rl0[r]; c <= end; c++, m++) re[m] += pr * zr[c] - pi * zi[c];
          } else {
            for (let c = oz + rl0[r]; c <= end; c++, m++) {
              const cr = zr[c];
              const ci = zi[c];
              re[m] += pr * cr - pi * ci;
              im[m] += pr * ci + pi * cr;
            }
          }
        }
      }
    }
    progress?.((j - j0) / Math.max(1, j1 - j0));
  }
}
