/**
 * Sweep batches: guided self-scheduling, Polychronopoulos & Kuck, IEEE Trans. Computers C-36 (1987) 1425 —
 * each batch ⌈R/P⌉ of the R points left. The 100-point, 4-processor sequence below was worked out by hand
 * from that rule (25, ⌈75/4⌉ = 19, ⌈56/4⌉ = 14, …).
 */
import { describe, expect, it } from 'vitest';
import { guidedBatches } from '../../../../lib/server/queue/batches';

const sizes = (b: unknown[][]) => b.map((x) => x.length);
const range = (n: number) => Array.from({ length: n }, (_, i) => i);

describe('guided batches', () => {
  it('follow the published rule ⌈R/P⌉ (f = 1, no cap): 100 points on 4 workers', () => {
    expect(sizes(guidedBatches(range(100), { workers: 4 }))).toEqual([25, 19, 14, 11, 8, 6, 5, 3, 3, 2, 1, 1, 1, 1]);
  });

  it('with f = 4 and a cap of 8 for 2 workers: never above the cap, never growing, single points at the end, every point once in order', () => {
    const pending = range(120).map((i) => i * 3 + 1); // a resumed sweep's pending points need not be consecutive
    const b = guidedBatches(pending, { workers: 2, factor: 4, max: 8 });
    const s = sizes(b);
    expect(Math.max(...s)).toBe(8);
    for (let k = 1; k < s.length; k++) expect(s[k]).toBeLessThanOrEqual(s[k - 1]);
    // ⌈R/8⌉ is 1 once R ≤ 8: the last eight batches are single points.
    expect(s.slice(-8)).toEqual([1, 1, 1, 1, 1, 1, 1, 1]);
    expect(s[s.length - 9]).toBe(2);
    expect(b.flat()).toEqual(pending);
    // About a quarter of the round trips of one job per point.
    expect(b.length).toBeLessThan(40);
  });

  it('treat an unknown or zero worker count as one worker, and refuse a factor or cap that cannot work', () => {
    expect(sizes(guidedBatches(range(10), { workers: 0 }))).toEqual([10]);
    expect(sizes(guidedBatches(range(10), { workers: Number.NaN, max: 4 }))).toEqual([4, 4, 2]);
    expect(guidedBatches([], { workers: 2 })).toEqual([]);
    expect(() => guidedBatches(range(3), { workers: 2, factor: 0 })).toThrow(/factor/);
    expect(() => guidedBatches(range(3), { workers: 2, max: 0 })).toThrow(/max/);
  });
});
