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

function phaseTable(x: number, lo: number, hi: number, re: Float64Array, im: Float64Array): void {
  // Direct cos/sin for each integer multiple keeps the table exact to rounding (no drift).
  const t = 2 * Math.PI * (x - Math.floor(x));
  for (let n = lo; n <= hi; n++) {
    re[n - lo] = Math.cos(n * t);
    im[n - lo] = Math.sin(n * t);
  }
}

/**
 * Accumulate partial sums into re/im (length nGroups × rows.count, group-major: index g·count + m).
 * frac: packed fractional coordinates; groupOf/weight per atom; atoms j0 ≤ j < j1.
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
): void {
  const [hLo, hHi] = extent(rows.h);
  const [kLo, kHi] = extent(rows.k);
  const [lLo, lHi] = extent(rows.l0, rows.l1);
  const xr = new Float64Array(hHi - hLo + 1);
  const xi = new Float64Array(hHi - hLo + 1);
  const yr = new Float64Array(kHi - kLo + 1);
  const yi = new Float64Array(kHi - kLo + 1);
  const zr = new Float64Array(lHi - lLo + 1);
  const zi = new Float64Array(lHi - lLo + 1);
  const nRows = rows.h.length;
  const count = rows.count;
  const rh = rows.h;
  const rk = rows.k;
  const rl0 = rows.l0;
  const rl1 = rows.l1;
  const rs = rows.start;
  for (let j = j0; j < j1; j++) {
    const w = weight[j];
    if (w === 0) continue;
    phaseTable(frac[3 * j], hLo, hHi, xr, xi);
    phaseTable(frac[3 * j + 1], kLo, kHi, yr, yi);
    phaseTable(frac[3 * j + 2], lLo, lHi, zr, zi);
    const base = groupOf[j] * count;
    for (let r = 0; r < nRows; r++) {
      const a = rh[r] - hLo;
      const b = rk[r] - kLo;
      const pr = (xr[a] * yr[b] - xi[a] * yi[b]) * w;
      const pi = (xr[a] * yi[b] + xi[a] * yr[b]) * w;
      let m = base + rs[r];
      const end = rl1[r] - lLo;
      for (let c = rl0[r] - lLo; c <= end; c++, m++) {
        const cr = zr[c];
        const ci = zi[c];
        re[m] += pr * cr - pi * ci;
        im[m] += pr * ci + pi * cr;
      }
    }
  }
}
