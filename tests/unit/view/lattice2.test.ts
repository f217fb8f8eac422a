/**
 * Minimum image in a 2D cell (lib/view/lattice2.ts) against ase.geometry.find_mic (ASE, Debian's
 * python3-ase), which reduces the cell (Minkowski) and searches the neighbouring images on its own.
 */
import { describe, expect, it } from 'vitest';
import { Lattice2, type Vec2 } from '@/lib/view/lattice2';
import { runPython } from '../../helpers/python';

function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a * 1664525 + 1013904223) >>> 0;
    return a / 4294967296;
  };
}

const MIC = `
import sys, json, numpy as np
from ase.geometry import find_mic
jobs = json.load(sys.stdin)
out = []
for job in jobs:
    a, b = job['a'], job['b']
    cell = np.array([[a[0], a[1], 0.0], [b[0], b[1], 0.0], [0.0, 0.0, 10.0]])
    d = np.array([[x, y, 0.0] for x, y in job['d']])
    v, _ = find_mic(d, cell, pbc=[True, True, False])
    out.append(v[:, :2].tolist())
print(json.dumps(out))
`;

describe('Lattice2.minimumImage', () => {
  it('agrees with ase find_mic on square, rectangular, hexagonal, skewed and unreduced cells', () => {
    const r = rng(7);
    const cells: [Vec2, Vec2][] = [
      [[2.414, 0], [0, 2.414]], // the octagonal 2/1 cell (edge 1)
      [[8.09, 0], [0, 3.078]], // the Penrose 1/1 cell (edge 1)
      [[3, 0], [1.5, 3 * Math.sin(Math.PI / 3)]], // hexagonal
      [[5, 0.3], [4.2, 1.1]], // thin and skewed
      [[1, 0], [7.3, 0.9]], // long second vector, far from reduced
      [[-2, 1], [3, 4]],
    ];
    const jobs = cells.map(([a, b]) => {
      const scale = Math.hypot(...a) + Math.hypot(...b);
      const d = Array.from({ length: 200 }, () => [(r() - 0.5) * 6 * scale, (r() - 0.5) * 6 * scale] as Vec2);
      return { a, b, d };
    });
    const ref = runPython<number[][][]>(MIC, JSON.stringify(jobs));
    const out = [0, 0];
    jobs.forEach((job, c) => {
      const L = new Lattice2(job.a, job.b);
      job.d.forEach(([x, y], i) => {
        L.minimumImage(x, y, out);
        expect(out[0]).toBeCloseTo(ref[c][i][0], 9);
        expect(out[1]).toBeCloseTo(ref[c][i][1], 9);
      });
    });
  });

  it('leaves a vector inside the cell’s Voronoi region alone and writes at an offset', () => {
    // A unit rhombus edge in the smallest octagonal approximant cell (periods 1 + √2 edges): its own image.
    const L = new Lattice2([1 + Math.SQRT2, 0], [0, 1 + Math.SQRT2]);
    const out = [9, 9, 9, 9];
    L.minimumImage(Math.cos(Math.PI / 4), Math.sin(Math.PI / 4), out, 2);
    expect(out[0]).toBe(9);
    expect(out[2]).toBeCloseTo(Math.cos(Math.PI / 4), 12);
    expect(out[3]).toBeCloseTo(Math.sin(Math.PI / 4), 12);
    // The same edge seen from the far side of the cell: 1 + √2 − cos 45° to the right is cos 45° to the left.
    L.minimumImage(1 + Math.SQRT2 - Math.cos(Math.PI / 4), 0, out);
    expect(out[0]).toBeCloseTo(-Math.cos(Math.PI / 4), 12);
  });

  it('gives fractional coordinates in the cell as given and refuses parallel cell vectors', () => {
    const L = new Lattice2([4, 1], [1, 3]);
    const [f, g] = L.fractional(0.25 * 4 + 0.5 * 1, 0.25 * 1 + 0.5 * 3);
    expect(f).toBeCloseTo(0.25, 12);
    expect(g).toBeCloseTo(0.5, 12);
    expect(() => new Lattice2([1, 2], [2, 4])).toThrow(/parallel/);
  });
});
