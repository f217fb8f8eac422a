import { describe, expect, it } from 'vitest';
import { bondPairs } from '@/lib/view/bonds';

/** Deterministic pseudo-random numbers (LCG from Numerical Recipes, common practice). */
function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a * 1664525 + 1013904223) >>> 0;
    return a / 4294967296;
  };
}

/** Pairs i < j with minD < d < cutoff among the shown atoms, by a double loop. */
function bruteForce(p: Float64Array, cutoff: number, minD = 0.1, shown?: ArrayLike<number>): string[] {
  const out: string[] = [];
  const n = p.length / 3;
  for (let i = 0; i < n; i++)
    for (let j = i + 1; j < n; j++) {
      if (shown && (!shown[i] || !shown[j])) continue;
      const d = Math.hypot(p[3 * i] - p[3 * j], p[3 * i + 1] - p[3 * j + 1], p[3 * i + 2] - p[3 * j + 2]);
      if (d < cutoff && d > minD) out.push(`${i}-${j}`);
    }
  return out.sort();
}

const asKeys = (pairs: Uint32Array) => {
  const out: string[] = [];
  for (let k = 0; k < pairs.length; k += 2) out.push(`${pairs[k]}-${pairs[k + 1]}`);
  return out.sort();
};

describe('bondPairs (the viewer on the shared cell list)', () => {
  it('gives every interior fcc atom its 12 nearest neighbours at a/√2 (fcc coordination)', () => {
    const a = 4.05;
    const basis = [[0, 0, 0], [0.5, 0.5, 0], [0.5, 0, 0.5], [0, 0.5, 0.5]];
    const pts: number[] = [];
    for (let i = 0; i < 5; i++) for (let j = 0; j < 5; j++) for (let k = 0; k < 5; k++) for (const b of basis) pts.push((i + b[0]) * a, (j + b[1]) * a, (k + b[2]) * a);
    const p = new Float64Array(pts);
    const { pairs } = bondPairs(p, (a / Math.SQRT2) * 1.05);
    const degree = new Uint32Array(p.length / 3);
    for (const i of pairs) degree[i]++;
    const centre = pts.findIndex((_, idx) => idx % 3 === 0 && pts[idx] === 2 * a && pts[idx + 1] === 2 * a && pts[idx + 2] === 2 * a) / 3;
    expect(degree[centre]).toBe(12);
    expect(Math.max(...degree)).toBe(12);
  });

  it('with a visible mask and a minimum distance: the pairs a double loop over the shown atoms finds', () => {
    const r = rng(4);
    const p = new Float64Array(3 * 600).map(() => r() * 15);
    p.set(p.subarray(0, 3), 3); // atom 1 on top of atom 0
    const shown = Uint8Array.from({ length: 600 }, () => (r() < 0.6 ? 1 : 0));
    shown[0] = shown[1] = 1;
    const masked = bruteForce(p, 2.4, 0.1, shown);
    const far = bruteForce(p, 2.4, 1);
    // The data hold pairs to find (600 points in 15³ Å³: several hundred within 2.4 Å).
    expect(Math.min(masked.length, far.length)).toBeGreaterThan(100);
    expect(asKeys(bondPairs(p, 2.4, { visible: shown }).pairs)).toEqual(masked);
    expect(asKeys(bondPairs(p, 2.4, { minDistance: 1 }).pairs)).toEqual(far);
  });

  it('skips coincident points, honours the visible mask and stops at maxBonds', () => {
    const p = new Float64Array([0, 0, 0, 0, 0, 0.05, 1, 0, 0, 2, 0, 0]);
    expect(asKeys(bondPairs(p, 1.1).pairs)).toEqual(['0-2', '1-2', '2-3']);
    expect(asKeys(bondPairs(p, 1.1, { visible: [1, 0, 1, 0] }).pairs)).toEqual(['0-2']);
    const capped = bondPairs(p, 1.1, { maxBonds: 2 });
    expect(capped.pairs.length).toBe(4);
    expect(capped.truncated).toBe(true);
    const exact = bondPairs(p, 1.1, { maxBonds: 3 });
    expect(exact.pairs.length).toBe(6);
    expect(exact.truncated).toBe(false);
  });
});
