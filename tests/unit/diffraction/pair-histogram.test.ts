import { describe, expect, it } from 'vitest';
import { accumulatePairs, balancedRowRanges, histogramSpec } from '../../../lib/diffraction/pair-histogram';
import { pairRowKernel } from '../../../lib/diffraction/pair-kernel';
import { runPython } from '../../helpers/python';

/**
 * Reference: the definition, evaluated by numpy (reference library) — every pair i < j once
 * (numpy.triu_indices), bin trunc(√(dx² + dy² + dz²) · (1/Δ)) in IEEE doubles, weight w_i·w_j summed into the
 * block of its group pair (a ≤ b) by numpy.bincount. The arithmetic is the same IEEE double arithmetic in the
 * same order, so the histograms must agree exactly, bin edges included.
 */
function naive(pos: Float64Array, groupOf: Uint16Array, weight: Float64Array, ng: number, binWidth: number, nb: number): Float64Array {
  const h = runPython<number[]>(
    `import sys, json, numpy as np
d = json.load(sys.stdin)
p = np.array(d["pos"]).reshape(-1, 3); g = np.array(d["g"]); w = np.array(d["w"]); ng = d["ng"]; nb = d["nb"]
inv = 1.0 / d["dw"]
i, j = np.triu_indices(len(g), 1)
dx = p[j, 0] - p[i, 0]; dy = p[j, 1] - p[i, 1]; dz = p[j, 2] - p[i, 2]
b = (np.sqrt(dx * dx + dy * dy + dz * dz) * inv).astype(np.int64)
lo = np.minimum(g[i], g[j]); hi = np.maximum(g[i], g[j])
print(json.dumps(np.bincount((lo * ng + hi) * nb + b, weights=w[i] * w[j], minlength=ng * ng * nb).tolist()))`,
    JSON.stringify({ pos: Array.from(pos), g: Array.from(groupOf), w: Array.from(weight), ng, nb, dw: binWidth }),
  );
  expect(h).toHaveLength(ng * ng * nb);
  return Float64Array.from(h);
}

/** Seeded points: random ones in a 40 Å box plus an fcc block (many repeated distances, some on bin edges). */
function points(nRandom: number, seed: number): Float64Array {
  let s = seed;
  const rnd = () => (s = (s * 16807) % 2147483647) / 2147483647;
  const out: number[] = [];
  for (let i = 0; i < nRandom; i++) out.push(rnd() * 40 - 20, rnd() * 40 - 20, rnd() * 40 - 20);
  const a = 4; // lattice distances 2√2, 4, 2√6, … and exact multiples of Δ below
  for (let i = 0; i < 6; i++)
    for (let j = 0; j < 6; j++)
      for (let k = 0; k < 6; k++)
        for (const b of [[0, 0, 0], [0, 0.5, 0.5], [0.5, 0, 0.5], [0.5, 0.5, 0]]) out.push((i + b[0]) * a, (j + b[1]) * a, (k + b[2]) * a);
  return Float64Array.from(out);
}

describe('pair histogram', () => {
  it('the WebAssembly SIMD kernel is available here, so the SIMD cases below really run it', () => {
    expect(pairRowKernel(10, 10, 1)).not.toBeNull();
  });

  for (const ng of [1, 3]) {
    it(`equals the naive all-pairs histogram exactly: ${ng} group(s), unit weights, SIMD and JS loops, split rows`, () => {
      const pos = points(2500, 99 + ng);
      const n = pos.length / 3;
      const groupOf = Uint16Array.from({ length: n }, (_, i) => (ng === 1 ? 0 : (i * 7919) % 5 === 0 ? 2 : i % 2));
      const weight = new Float64Array(n).fill(1);
      for (const binWidth of [0.005, 0.25]) {
        const spec = histogramSpec(pos, ng, binWidth);
        const ref = naive(pos, groupOf, weight, ng, binWidth, spec.nBins);
        for (const simd of [true, false]) {
          const whole = new Float64Array(ref.length);
          accumulatePairs(pos, groupOf, weight, spec, whole, 0, n, simd);
          expect(whole).toEqual(ref);
          const split = new Float64Array(ref.length);
          for (const [i0, i1] of balancedRowRanges(n, 3)) accumulatePairs(pos, groupOf, weight, spec, split, i0, i1, simd);
          expect(split).toEqual(ref);
        }
      }
    });
  }

  it('equals the naive histogram with partial weights (JS loops)', () => {
    const pos = points(1500, 5);
    const n = pos.length / 3;
    const groupOf = Uint16Array.from({ length: n }, (_, i) => i % 2);
    const weight = Float64Array.from({ length: n }, (_, i) => (i % 3 === 0 ? 0.5 : 1));
    const spec = histogramSpec(pos, 2, 0.005);
    const ref = naive(pos, groupOf, weight, 2, 0.005, spec.nBins);
    const h = new Float64Array(ref.length);
    accumulatePairs(pos, groupOf, weight, spec, h);
    // weights 0.25, 0.5, 1 add exactly in doubles whatever the order
    expect(h).toEqual(ref);
  });
});
