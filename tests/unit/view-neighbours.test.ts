import { describe, expect, it } from 'vitest';
import { bondPairs } from '@/lib/view/neighbours';

function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a * 1664525 + 1013904223) >>> 0;
    return a / 4294967296;
  };
}

function bruteForce(p: Float64Array, cutoff: number, minD = 0.1): string[] {
  const out: string[] = [];
  const n = p.length / 3;
  for (let i = 0; i < n; i++)
    for (let j = i + 1; j < n; j++) {
      const d = Math.hypot(p[3 * i] - p[3 * j], p[3 * i + 1] - p[3 * j + 1], p[3 * i + 2] - p[3 * j + 2]);
      if (d <= cutoff && d > minD) out.push(`${i}-${j}`);
    }
  return out.sort();
}

const asKeys = (pairs: Uint32Array) => {
  const out: string[] = [];
  for (let k = 0; k < pairs.length; k += 2) out.push(`${pairs[k]}-${pairs[k + 1]}`);
  return out.sort();
};

describe('bondPairs (cell list)', () => {
  it('finds exactly the pairs an all-pairs search finds, dense and sparse', () => {
    const r = rng(11);
    for (const [n, box, cut] of [[800, 20, 2.5], [300, 200, 6], [50, 3, 1]] as const) {
      const p = new Float64Array(3 * n).map(() => r() * box);
      expect(asKeys(bondPairs(p, cut).pairs)).toEqual(bruteForce(p, cut));
    }
  });

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

  it('skips coincident points, honours the visible mask and stops at maxBonds', () => {
    const p = new Float64Array([0, 0, 0, 0, 0, 0.05, 1, 0, 0, 2, 0, 0]);
    expect(asKeys(bondPairs(p, 1.1).pairs)).toEqual(['0-2', '1-2', '2-3']);
    expect(asKeys(bondPairs(p, 1.1, { visible: [1, 0, 1, 0] }).pairs)).toEqual(['0-2']);
    const capped = bondPairs(p, 1.1, { maxBonds: 2 });
    expect(capped.pairs.length).toBe(4);
    expect(capped.truncated).toBe(true);
  });
});
