/**
 * Pair-distance histogram for the Debye scattering equation: every pair i < j once (exact O(N²)),
 * binned at r with width Δ, separately per pair of scattering groups (a ≤ b), weighted w_i·w_j.
 * After this, the pattern costs O(bins × nQ) instead of O(N² × nQ).
 *
 * The loop over i is split by [i0, i1) so callers may spread it across threads; `balancedRowRanges`
 * gives ranges with equal pair counts. Histograms of parts simply add.
 *
 * With all weights 1 (the common case: no partial occupancy) pairs are counted as integers by the
 * WebAssembly SIMD kernel of pair-kernel.ts, ≈ 2× the JS loops below, which remain for weighted atoms
 * and wherever WebAssembly SIMD is missing. Both give the same bins (tests/unit/diffraction-pairs).
 */

import { pairRowKernel } from './pair-kernel';

export interface PairHistogramSpec {
  nGroups: number;
  binWidth: number;
  nBins: number;
}

/** Index of the histogram of groups (a, b), a ≤ b, inside the flat array (nGroups² blocks of nBins). */
export function pairBlock(a: number, b: number, spec: PairHistogramSpec): number {
  return (a <= b ? a * spec.nGroups + b : b * spec.nGroups + a) * spec.nBins;
}

/**
 * An upper bound on the largest pair distance without a pair loop: the smaller of the bounding-box
 * diagonal and twice the largest distance from the box centre (tight for balls).
 */
export function boundingDiameter(positions: Float64Array): number {
  const n = positions.length / 3;
  if (n === 0) return 0;
  const lo = [Infinity, Infinity, Infinity];
  const hi = [-Infinity, -Infinity, -Infinity];
  for (let i = 0; i < n; i++) {
    for (let c = 0; c < 3; c++) {
      const v = positions[3 * i + c];
      if (v < lo[c]) lo[c] = v;
      if (v > hi[c]) hi[c] = v;
    }
  }
  const c = [0, 1, 2].map((k) => (lo[k] + hi[k]) / 2);
  let r2 = 0;
  for (let i = 0; i < n; i++) {
    const dx = positions[3 * i] - c[0];
    const dy = positions[3 * i + 1] - c[1];
    const dz = positions[3 * i + 2] - c[2];
    r2 = Math.max(r2, dx * dx + dy * dy + dz * dz);
  }
  return Math.min(Math.hypot(hi[0] - lo[0], hi[1] - lo[1], hi[2] - lo[2]), 2 * Math.sqrt(r2));
}

export function histogramSpec(positions: Float64Array, nGroups: number, binWidth: number): PairHistogramSpec {
  if (!(binWidth > 0)) throw new Error(`binWidth: must be positive, got ${binWidth}`);
  const nBins = Math.floor(boundingDiameter(positions) / binWidth) + 2;
  if (nBins * nGroups * nGroups > 2e8) {
    throw new Error(`binWidth: ${binWidth} Å with ${nGroups} groups needs ${nBins * nGroups * nGroups} bins; use a coarser bin`);
  }
  return { nGroups, binWidth, nBins };
}

/**
 * Add pairs (i, j), i0 ≤ i < i1, i < j < N, into hist (length nGroups² · nBins). A pair's bin is
 * trunc(√(dx² + dy² + dz²) · (1/Δ)) in doubles, whichever loop runs. With all weights 1 the WebAssembly
 * SIMD kernel counts them (`simd = false` forces the JS loops, for checking the two agree).
 */
export function accumulatePairs(
  positions: Float64Array,
  groupOf: Uint16Array,
  weight: Float64Array,
  spec: PairHistogramSpec,
  hist: Float64Array,
  i0 = 0,
  i1 = groupOf.length,
  simd = true,
): void {
  const n = groupOf.length;
  const inv = 1 / spec.binWidth;
  const nb = spec.nBins;
  const ng = spec.nGroups;
  let unit = true;
  for (let i = 0; i < n && unit; i++) unit = weight[i] === 1;
  if (simd && unit && i1 > i0 && simdUnitPairs(positions, groupOf, spec, inv, hist, i0, i1)) return;
  if (ng === 1) {
    singleGroupPairs(positions, weight, inv, nb, hist, i0, i1);
    return;
  }
  for (let i = i0; i < i1; i++) {
    const x = positions[3 * i];
    const y = positions[3 * i + 1];
    const z = positions[3 * i + 2];
    const wi = weight[i];
    const gi = groupOf[i];
    for (let j = i + 1, p = 3 * j; j < n; j++, p += 3) {
      const dx = positions[p] - x;
      const dy = positions[p + 1] - y;
      const dz = positions[p + 2] - z;
      const b = (Math.sqrt(dx * dx + dy * dy + dz * dz) * inv) | 0;
      const gj = groupOf[j];
      const blk = gi <= gj ? gi * ng + gj : gj * ng + gi;
      hist[blk * nb + b] += wi * weight[j];
    }
  }
}

/** Split rows 0..n−1 of the triangle i < j into `parts` ranges with about equal pair counts. */
export function balancedRowRanges(n: number, parts: number): [number, number][] {
  const total = (n * (n - 1)) / 2;
  const out: [number, number][] = [];
  let start = 0;
  let acc = 0;
  for (let p = 1; p <= parts; p++) {
    const target = (total * p) / parts;
    let i = start;
    while (i < n && (p === parts || acc + (n - 1 - i) <= target)) {
      acc += n - 1 - i;
      i++;
    }
    out.push([start, i]);
    start = i;
  }
  return out;
}

/**
 * One scattering group (the common case). Coordinates are split into x, y, z arrays and the j loop is
 * unrolled by four into four interleaved lane histograms (bin·4 + lane): neighbouring atoms of an
 * ordered patch often fall in the same bin, and separate lanes keep those increments from waiting on
 * each other (a store→load chain through one memory cell). Lanes are folded into `hist` at the end.
 * The (i, j) triangle is walked in tiles — ROWS rows of i against COLS columns of j — so a tile's j
 * coordinates come from memory once and are reused ROWS times from cache (for 10⁵ atoms the coordinates
 * alone are 2.4 MB; streaming them once per row made the loop memory-bound, ≈ 4× slower).
 */
const ROWS = 128;
const COLS = 2048;

function singleGroupPairs(
  positions: Float64Array,
  weight: Float64Array,
  inv: number,
  nb: number,
  hist: Float64Array,
  i0: number,
  i1: number,
): void {
  const n = weight.length;
  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  const zs = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    xs[i] = positions[3 * i];
    ys[i] = positions[3 * i + 1];
    zs[i] = positions[3 * i + 2];
  }
  let unit = true;
  for (let i = 0; i < n && unit; i++) unit = weight[i] === 1;
  if (unit) {
    unitPairs(xs, ys, zs, inv, nb, hist, i0, i1);
    return;
  }
  const lanes = new Float64Array(4 * nb);
  for (let a = i0; a < i1; a += ROWS) {
    const e = Math.min(i1, a + ROWS);
    for (let c = a + 1; c < n; c += COLS) {
      const d = Math.min(n, c + COLS);
      for (let i = a; i < e; i++) {
        const x = xs[i];
        const y = ys[i];
        const z = zs[i];
        const wi = weight[i];
        let j = i + 1 > c ? i + 1 : c;
        for (; j + 3 < d; j += 4) {
          let dx = xs[j] - x;
          let dy = ys[j] - y;
          let dz = zs[j] - z;
          const b0 = (Math.sqrt(dx * dx + dy * dy + dz * dz) * inv) | 0;
          dx = xs[j + 1] - x;
          dy = ys[j + 1] - y;
          dz = zs[j + 1] - z;
          const b1 = (Math.sqrt(dx * dx + dy * dy + dz * dz) * inv) | 0;
          dx = xs[j + 2] - x;
          dy = ys[j + 2] - y;
          dz = zs[j + 2] - z;
          const b2 = (Math.sqrt(dx * dx + dy * dy + dz * dz) * inv) | 0;
          dx = xs[j + 3] - x;
          dy = ys[j + 3] - y;
          dz = zs[j + 3] - z;
          const b3 = (Math.sqrt(dx * dx + dy * dy + dz * dz) * inv) | 0;
          lanes[b0 << 2] += wi * weight[j];
          lanes[(b1 << 2) | 1] += wi * weight[j + 1];
          lanes[(b2 << 2) | 2] += wi * weight[j + 2];
          lanes[(b3 << 2) | 3] += wi * weight[j + 3];
        }
        for (; j < d; j++) {
          const dx = xs[j] - x;
          const dy = ys[j] - y;
          const dz = zs[j] - z;
          lanes[((Math.sqrt(dx * dx + dy * dy + dz * dz) * inv) | 0) << 2] += wi * weight[j];
        }
      }
    }
  }
  for (let b = 0; b < nb; b++) hist[b] += lanes[4 * b] + lanes[4 * b + 1] + lanes[4 * b + 2] + lanes[4 * b + 3];
}

/** All weights 1 without the SIMD kernel: count pairs in Uint32 lanes (half the cache footprint of doubles); tiles as above. */

function unitPairs(xs: Float64Array, ys: Float64Array, zs: Float64Array, inv: number, nb: number, hist: Float64Array, i0: number, i1: number): void {
  const n = xs.length;
  const lanes = new Uint32Array(4 * nb);
  // A Uint32 lane could overflow after 2³² pairs in one bin; flush every 2²⁸ pairs to be safe.
  let sinceFlush = 0;
  const flush = () => {
    for (let b = 0; b < nb; b++) {
      hist[b] += lanes[4 * b] + lanes[4 * b + 1] + lanes[4 * b + 2] + lanes[4 * b + 3];
    }
    lanes.fill(0);
    sinceFlush = 0;
  };
  for (let a = i0; a < i1; a += ROWS) {
    const b = Math.min(i1, a + ROWS);
    for (let c = a + 1; c < n; c += COLS) {
      const d = Math.min(n, c + COLS);
      for (let i = a; i < b; i++) {
        const x = xs[i];
        const y = ys[i];
        const z = zs[i];
        let j = i + 1 > c ? i + 1 : c;
        if (j >= d) continue;
        sinceFlush += d - j;
        for (; j + 3 < d; j += 4) {
          let dx = xs[j] - x;
          let dy = ys[j] - y;
          let dz = zs[j] - z;
          const b0 = (Math.sqrt(dx * dx + dy * dy + dz * dz) * inv) | 0;
          dx = xs[j + 1] - x;
          dy = ys[j + 1] - y;
          dz = zs[j + 1] - z;
          const b1 = (Math.sqrt(dx * dx + dy * dy + dz * dz) * inv) | 0;
          dx = xs[j + 2] - x;
          dy = ys[j + 2] - y;
          dz = zs[j + 2] - z;
          const b2 = (Math.sqrt(dx * dx + dy * dy + dz * dz) * inv) | 0;
          dx = xs[j + 3] - x;
          dy = ys[j + 3] - y;
          dz = zs[j + 3] - z;
          const b3 = (Math.sqrt(dx * dx + dy * dy + dz * dz) * inv) | 0;
          lanes[b0 << 2]++;
          lanes[(b1 << 2) | 1]++;
          lanes[(b2 << 2) | 2]++;
          lanes[(b3 << 2) | 3]++;
        }
        for (; j < d; j++) {
          const dx = xs[j] - x;
          const dy = ys[j] - y;
          const dz = zs[j] - z;
          lanes[((Math.sqrt(dx * dx + dy * dy + dz * dz) * inv) | 0) << 2]++;
        }
      }
      if (sinceFlush > 1 << 28) flush();
    }
  }
  flush();
}

/**
 * All weights 1 (any number of groups) on the WebAssembly SIMD kernel of pair-kernel.ts; false when the
 * kernel is unavailable (the JS loops above then run). Same pairs, same bins, same integer counts.
 *
 * Atoms are copied into the kernel's memory sorted by group (stable), so for a row i the partners j > i
 * of group b are one contiguous run: group b's segment from start_b + #{k ≤ i : g_k = b} on. Each run
 * goes to the kernel in column tiles (as in unitPairs: ROWS rows reuse COLS columns from cache) and is
 * counted into the lane histogram of the group pair (g_i, b). Rows stay in the caller's [i0, i1) order,
 * so thread splits by row ranges cover exactly the same pairs as the JS loops.
 */
function simdUnitPairs(
  positions: Float64Array,
  groupOf: Uint16Array,
  spec: PairHistogramSpec,
  inv: number,
  hist: Float64Array,
  i0: number,
  i1: number,
): boolean {
  const n = groupOf.length;
  const ng = spec.nGroups;
  const nb = spec.nBins;
  const k = pairRowKernel(n, nb, inv, ng * ng);
  if (!k) return false;
  const start = new Int32Array(ng + 1);
  for (let i = 0; i < n; i++) start[groupOf[i] + 1]++;
  for (let g = 0; g < ng; g++) start[g + 1] += start[g];
  const fill = start.slice(0, ng);
  const at = new Int32Array(n); // sorted slot of atom i
  for (let i = 0; i < n; i++) {
    const s = fill[groupOf[i]]++;
    at[i] = s;
    k.xs[s] = positions[3 * i];
    k.ys[s] = positions[3 * i + 1];
    k.zs[s] = positions[3 * i + 2];
  }
  // before[b] = #{k < a : g_k = b} at the start of each row block a
  const before = new Int32Array(ng);
  for (let i = 0; i < i0; i++) before[groupOf[i]]++;
  const seen = new Int32Array(ng);
  const lanes = k.lanes;
  let sinceFlush = 0;
  for (let a = i0; a < i1; a += ROWS) {
    const e = Math.min(i1, a + ROWS);
    for (let b = 0; b < ng; b++) {
      const end = start[b + 1];
      // the first partner any row of the block can have in group b, then tiles of COLS from there
      for (let c = start[b] + before[b]; c < end; c += COLS) {
        const d = Math.min(end, c + COLS);
        seen.set(before);
        // Rows two at a time: row2 loads each j once for both. Partners start later for the second row
        // (ja ≤ jb), so row i alone takes [ja, jb), both take whole fours from jb, each the rest.
        for (let i = a; i < e; i += 2) {
          const gi = groupOf[i];
          seen[gi]++;
          const fa = start[b] + seen[b];
          const ja = fa > c ? fa : c;
          const ha = gi <= b ? gi * ng + b : b * ng + gi;
          const s = at[i];
          if (i + 1 === e) {
            if (ja < d) k.row(k.xs[s], k.ys[s], k.zs[s], ja, d, ha);
            sinceFlush += d > ja ? d - ja : 0;
            break;
          }
          const g2 = groupOf[i + 1];
          seen[g2]++;
          const fb = start[b] + seen[b];
          const jb = fb > c ? fb : c;
          const hb = g2 <= b ? g2 * ng + b : b * ng + g2;
          const t = at[i + 1];
          if (jb >= d) {
            if (ja < d) k.row(k.xs[s], k.ys[s], k.zs[s], ja, d, ha);
          } else {
            if (ja < jb) k.row(k.xs[s], k.ys[s], k.zs[s], ja, jb, ha);
            const m = jb + ((d - jb) & ~3);
            if (m > jb) k.row2(k.xs[s], k.ys[s], k.zs[s], k.xs[t], k.ys[t], k.zs[t], jb, m, ha, hb);
            if (m < d) {
              k.row(k.xs[s], k.ys[s], k.zs[s], m, d, ha);
              k.row(k.xs[t], k.ys[t], k.zs[t], m, d, hb);
            }
          }
          sinceFlush += (d > ja ? d - ja : 0) + (d > jb ? d - jb : 0);
        }
        if (sinceFlush > 1 << 28) {
          flushLanes(lanes, hist, ng, nb);
          sinceFlush = 0;
        }
      }
    }
    for (let i = a; i < e; i++) before[groupOf[i]]++;
  }
  flushLanes(lanes, hist, ng, nb);
  return true;
}

/** Add the four lanes of each used lane histogram (a ≤ b) into hist and zero them. */
function flushLanes(lanes: Uint32Array, hist: Float64Array, ng: number, nb: number): void {
  for (let a = 0; a < ng; a++) {
    for (let b = a; b < ng; b++) {
      const h = (a * ng + b) * nb;
      for (let t = 0; t < nb; t++) {
        const l = 4 * (h + t);
        hist[h + t] += lanes[l] + lanes[l + 1] + lanes[l + 2] + lanes[l + 3];
      }
    }
  }
  lanes.fill(0);
}
