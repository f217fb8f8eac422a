/**
 * Unwrapping the tiles of periodic cuts (lib/view/unwrap-tile.ts), checked against what a tiling is, not
 * against our own code:
 * - a Fibonacci chain approximant of order n is a cycle of F(n+1) long and F(n) short segments, so its period
 *   is F(n+1)·ℓ + F(n)·s (Fibonacci numbers from OEIS A000045, written out below);
 * - a rhombus tiling covers the plane once, so the tiles of one cell, with their translates, cover every
 *   point exactly once, and their areas add up to the cell area (edge² sin α per rhombus);
 * - every edge of a rhombus has the same length, and its four corners close.
 */
import { describe, expect, it } from 'vitest';
import { generate } from '@/lib/models';
import { forwardSpan, periodicityOf, unwrapTile } from '@/lib/view/unwrap-tile';
import type { Structure } from '@/lib/structure/types';

/** F(0) … F(14), OEIS A000045. */
const F = [0, 1, 1, 2, 3, 5, 8, 13, 21, 34, 55, 89, 144, 233, 377];
const TAU = (1 + Math.sqrt(5)) / 2;

function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a * 1664525 + 1013904223) >>> 0;
    return a / 4294967296;
  };
}

function unwrappedTiles(s: Structure): Float64Array[] {
  const t = s.tiles!;
  const per = periodicityOf(s);
  return Array.from({ length: t.kind.length }, (_, ti) => {
    const xy = new Float64Array(2 * t.cornersPerTile);
    unwrapTile(s.positions, t, ti, per, xy);
    return xy;
  });
}

/** Strictly inside a convex polygon given as x y pairs (either orientation). */
function inside(poly: Float64Array, x: number, y: number): boolean {
  const k = poly.length / 2;
  let pos = 0, neg = 0;
  for (let c = 0; c < k; c++) {
    const ax = poly[2 * c], ay = poly[2 * c + 1];
    const bx = poly[(2 * c + 2) % (2 * k)], by = poly[(2 * c + 3) % (2 * k)];
    const cr = (bx - ax) * (y - ay) - (by - ay) * (x - ax);
    if (cr > 0) pos++;
    else if (cr < 0) neg++;
  }
  return pos === k || neg === k;
}

describe('forwardSpan', () => {
  it('is the step modulo the period, a whole period for a vertex joined to its own image', () => {
    expect(forwardSpan(0.618, 2.618)).toBeCloseTo(0.618, 12);
    expect(forwardSpan(-2, 2.618)).toBeCloseTo(0.618, 12);
    expect(forwardSpan(0, 1.618)).toBe(1.618);
    expect(forwardSpan(-1.618 * (1 - 1e-12), 1.618)).toBe(1.618);
  });
});

describe('unwrapTile on chain approximants', () => {
  it('gives every segment the long or the short length, and one period in all, at orders 0 to 12', () => {
    for (const [long, ratio] of [[1, TAU], [2.5, 0.7]]) {
      const s = long / ratio;
      for (let n = 0; n <= 12; n++) {
        const cut = generate({ family: 'fibonacci', order: n, approximant: true, long, ratio });
        const seg = unwrappedTiles(cut).map((xy) => xy[2] - xy[0]);
        const nL = seg.filter((d) => Math.abs(d - long) < 1e-9).length;
        const nS = seg.filter((d) => Math.abs(d - s) < 1e-9).length;
        expect([nL, nS]).toEqual([F[n + 1], F[n]]);
        expect(seg.reduce((a, b) => a + b, 0)).toBeCloseTo(F[n + 1] * long + F[n] * s, 9);
      }
    }
  });
});

describe('unwrapTile on planar approximants', () => {
  const cases = [
    { family: 'penrose', p: 1, q: 1, angles: [36, 72] },
    { family: 'penrose', p: 3, q: 2, angles: [36, 72] },
    { family: 'penrose', p: 5, q: 3, angles: [36, 72] },
    { family: 'octagonal', p: 2, q: 1, angles: [45, 90] },
    { family: 'octagonal', p: 12, q: 5, angles: [45, 90] },
  ] as const;
  for (const { family, p, q, angles } of cases) {
    it(`${family} ${p}/${q}: rhombi of equal edges that tile the cell once`, () => {
      const edge = 2.5;
      const s = generate({ family, approximant: { p, q }, edge });
      const polys = unwrappedTiles(s);
      const [a, b] = s.cell!;
      const cellArea = Math.abs(a[0] * b[1] - a[1] * b[0]);
      let area = 0;
      for (const xy of polys) {
        for (let c = 0; c < 4; c++) {
          const d = Math.hypot(xy[(2 * c + 2) % 8] - xy[2 * c], xy[(2 * c + 3) % 8] - xy[2 * c + 1]);
          expect(d).toBeCloseTo(edge, 9);
        }
        // Shoelace area against edge² sin α for the two rhombus angles allowed.
        let sh = 0;
        for (let c = 0; c < 4; c++) sh += xy[2 * c] * xy[(2 * c + 3) % 8] - xy[(2 * c + 2) % 8] * xy[2 * c + 1];
        const A = Math.abs(sh) / 2;
        expect(angles.some((al) => Math.abs(A - edge * edge * Math.sin((al * Math.PI) / 180)) < 1e-9)).toBe(true);
        area += A;
      }
      expect(area).toBeCloseTo(cellArea, 6);
      // Every point of the cell lies in exactly one translate of one tile.
      const r = rng(p * 31 + q);
      for (let n = 0; n < 400; n++) {
        const f = r(), g = r();
        const x = f * a[0] + g * b[0], y = f * a[1] + g * b[1];
        let hits = 0;
        for (const xy of polys) {
          for (let i = -2; i <= 2; i++) for (let j = -2; j <= 2; j++) if (inside(xy, x - i * a[0] - j * b[0], y - i * a[1] - j * b[1])) hits++;
        }
        expect(hits).toBe(1);
      }
    });
  }

  it('leaves the tiles of a finite patch as stored', () => {
    const s = generate({ family: 'penrose', radius: 4 });
    expect(periodicityOf(s).kind).toBe('none');
    const t = s.tiles!;
    const xy = new Float64Array(8);
    unwrapTile(s.positions, t, 3, periodicityOf(s), xy);
    for (let c = 0; c < 4; c++) {
      expect(xy[2 * c]).toBe(s.positions[3 * t.corners[12 + c]]);
      expect(xy[2 * c + 1]).toBe(s.positions[3 * t.corners[12 + c] + 1]);
    }
  });
});
