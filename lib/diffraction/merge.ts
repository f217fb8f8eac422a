/**
 * Merge symmetry-equivalent and Friedel-related reflections into one entry with a multiplicity.
 *
 * Rule (no space group needed, so it works for any cell, approximants included): reflections are
 * equivalent when their d agree to `dTol` (relative) and their |F|² agree to `f2Tol` (relative to the
 * larger, plus 1e-6·max|F|² absolute). This merges every Laue-class equivalent and Friedel pair, and
 * also reflections that are equal by accident (e.g. cubic 333 and 511 of fcc) — in a powder pattern those
 * coincide exactly anyway. The defaults (d to 1e-5, |F|² to 2e-3 relative, i.e. |F| to 0.1 %) absorb the
 * rounding of coordinates a CIF carries (x = 0.333333 for 1/3 splits hexagonal {100} into 2 + 4 at 1e-6)
 * while keeping families of different |F| apart (Laue class m-3: {hkl} and {khl} at one d).
 * The representative index has the most non-negative entries, then is the lexicographically largest,
 * which gives the usual 111, 200, 220, 311 … for cubic and 100, 110, 101 for hexagonal cells. Deterministic.
 */
import type { HklFactors } from './structure-factor';

export interface MergedReflection {
  hkl: [number, number, number];
  d: number;
  f2: number;
  multiplicity: number;
}

export interface MergeOptions {
  /** Relative d tolerance of a shell. Default 1e-5. */
  dTol?: number;
  /** |F|² within f2Tol relative (plus 1e-6 of the largest |F|²) is one family. Default 2e-3. */
  f2Tol?: number;
  /** Drop reflections with |F|² below this fraction of the largest (systematic absences). Default 1e-10. */
  extinctTol?: number;
}

function lexGreater(a: ArrayLike<number>, ia: number, b: ArrayLike<number>, ib: number): boolean {
  let na = 0;
  let nb = 0;
  for (let c = 0; c < 3; c++) {
    if (a[ia + c] >= 0) na++;
    if (b[ib + c] >= 0) nb++;
  }
  if (na !== nb) return na > nb;
  for (let c = 0; c < 3; c++) {
    if (a[ia + c] !== b[ib + c]) return a[ia + c] > b[ib + c];
  }
  return false;
}

/**
 * The kept reflections ordered by d descending, exactly: an LSD radix sort (4 passes of 16 bits) on the IEEE-754
 * bits of d, which for positive doubles order like the numbers (no comparator calls; d > 0 always).
 */
function orderByD(d: Float64Array, keep: Int32Array): Int32Array {
  const m = keep.length;
  const bits = new Uint32Array(2 * m);
  const key = new Float64Array(1);
  const kw = new Uint32Array(key.buffer);
  // Little- or big-endian: find the word holding the sign and exponent.
  key[0] = 1;
  const hiWord = kw[1] !== 0 ? 1 : 0;
  for (let t = 0; t < m; t++) {
    key[0] = d[keep[t]];
    bits[2 * t] = kw[1 - hiWord];
    bits[2 * t + 1] = kw[hiWord];
  }
  let src = Int32Array.from({ length: m }, (_, t) => t);
  let dst = new Int32Array(m);
  const count = new Int32Array(65537);
  for (let pass = 0; pass < 4; pass++) {
    const word = pass >> 1;
    const shift = (pass & 1) * 16;
    count.fill(0);
    for (let t = 0; t < m; t++) count[((bits[2 * src[t] + word] >>> shift) & 0xffff) + 1]++;
    for (let r = 0; r < 65536; r++) count[r + 1] += count[r];
    for (let t = 0; t < m; t++) dst[count[(bits[2 * src[t] + word] >>> shift) & 0xffff]++] = src[t];
    const tmp = src;
    src = dst;
    dst = tmp;
  }
  // Ascending d → descending, as reflection indices.
  const out = new Int32Array(m);
  for (let t = 0; t < m; t++) out[t] = keep[src[m - 1 - t]];
  return out;
}

/**
 * Merge a reflection list into families (rule in the header). With `friedelPairs` every listed reflection
 * stands for itself and −h (a Friedel-unique list, sf-friedel.ts; valid when F(−h) = F(h)*): the families,
 * their d, |F|² and representative index are those of the full ±h list, with twice the multiplicity.
 */
export interface MergeListOptions extends MergeOptions {
  /** Every listed reflection stands for itself and −h (shorthand for images ±1, multiplicity 2). */
  friedelPairs?: boolean;
  /** Every listed reflection stands for its images S·h, S in these sign patterns (packed ±1 triples; hkl-orbits.ts)… */
  images?: Int8Array;
  /** …of which there are this many (its orbit size). */
  multiplicity?: Int32Array;
}

export function mergeReflections(f: HklFactors, opts: MergeListOptions = {}): MergedReflection[] {
  const dTol = opts.dTol ?? 1e-5;
  const f2Tol = opts.f2Tol ?? 2e-3;
  const extinctTol = opts.extinctTol ?? 1e-10;
  const images = opts.images ?? (opts.friedelPairs ? Int8Array.of(1, 1, 1, -1, -1, -1) : Int8Array.of(1, 1, 1));
  const mult = opts.multiplicity;
  const pairs = opts.friedelPairs ?? false;
  const m = f.d.length;
  // With all eight sign patterns the listed index is (|h|, |k|, |l|) (hkl-orbits.ts), already the best of its images.
  let selfBest = images.length === 24 && images[0] === 1 && images[1] === 1 && images[2] === 1;
  if (selfBest) for (let i = 0; i < m && selfBest; i++) selfBest = f.hkl[3 * i] >= 0 && f.hkl[3 * i + 1] >= 0 && f.hkl[3 * i + 2] >= 0;
  const imageCheck = selfBest ? 3 : images.length;
  let f2max = 0;
  for (let i = 0; i < m; i++) if (f.f2[i] > f2max) f2max = f.f2[i];
  let kept = 0;
  for (let i = 0; i < m; i++) if (f.f2[i] > extinctTol * f2max) kept++;
  const keep = new Int32Array(kept);
  for (let i = 0, t = 0; i < m; i++) if (f.f2[i] > extinctTol * f2max) keep[t++] = i;
  const order = orderByD(f.d, keep);
  const out: MergedReflection[] = [];
  const img = new Int32Array(3);
  const best = new Int32Array(3);
  // Walk shells of equal d; within a shell, cluster by |F|².
  let i = 0;
  while (i < order.length) {
    const d0 = f.d[order[i]];
    let j = i + 1;
    while (j < order.length && Math.abs(f.d[order[j]] - d0) <= dTol * d0) j++;
    const shell = order.slice(i, j).sort((a, b) => f.f2[b] - f.f2[a]);
    let p = 0;
    while (p < shell.length) {
      const ref = f.f2[shell[p]];
      let q = p + 1;
      while (q < shell.length && Math.abs(f.f2[shell[q]] - ref) <= f2Tol * ref + 1e-6 * f2max) q++;
      best[0] = f.hkl[3 * shell[p]];
      best[1] = f.hkl[3 * shell[p] + 1];
      best[2] = f.hkl[3 * shell[p] + 2];
      let sumF2 = 0;
      let sumD = 0;
      let n = 0;
      for (let t = p; t < q; t++) {
        const idx = shell[t];
        for (let s = 0; s < imageCheck; s += 3) {
          img[0] = images[s] * f.hkl[3 * idx];
          img[1] = images[s + 1] * f.hkl[3 * idx + 1];
          img[2] = images[s + 2] * f.hkl[3 * idx + 2];
          if (lexGreater(img, 0, best, 0)) {
            best[0] = img[0];
            best[1] = img[1];
            best[2] = img[2];
          }
        }
        const w = mult ? mult[idx] : pairs ? 2 : 1;
        sumF2 += w * f.f2[idx];
        sumD += w * f.d[idx];
        n += w;
      }
      out.push({ hkl: [best[0], best[1], best[2]], d: sumD / n, f2: sumF2 / n, multiplicity: n });
      p = q;
    }
    i = j;
  }
  return out;
}
