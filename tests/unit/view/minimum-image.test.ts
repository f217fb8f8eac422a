/**
 * Minimum image in a 3D cell (lib/view/minimum-image.ts) against ase.geometry.find_mic (ASE, Debian's
 * python3-ase), which Minkowski-reduces the cell and tries the neighbouring images on its own — a different
 * search from ours (LLL and the Voronoi bound), so agreement is a real check.
 */
import { describe, expect, it } from 'vitest';
import { PeriodicCell } from '@/lib/view/minimum-image';
import { cellFromParameters, type Cell } from '@/lib/math/cell';
import type { Vec3 } from '@/lib/math/vec3';
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
    v, _ = find_mic(np.array(job['d']), np.array(job['cell']), pbc=True)
    out.append(v.tolist())
print(json.dumps(out))
`;

// The cubic 2/1 approximant cell with aR = 4.6 Å: a = 2(2τ + 1)·aR/√(2 + τ) (Elser & Henley 1985).
const TAU = (1 + Math.sqrt(5)) / 2;
const a21 = (2 * (2 * TAU + 1) * 4.6) / Math.sqrt(2 + TAU);

const CELLS: [string, Cell][] = [
  ['cubic 2/1 approximant', [[a21, 0, 0], [0, a21, 0], [0, 0, a21]]],
  ['orthorhombic, one long axis', [[12.3, 0, 0], [0, 20.1, 0], [0, 0, 4.1]]],
  ['hexagonal', cellFromParameters({ a: 3, b: 3, c: 5, alpha: 90, beta: 90, gamma: 120 })],
  ['triclinic', cellFromParameters({ a: 4.1, b: 5.3, c: 6.2, alpha: 81, beta: 97, gamma: 104 })],
  ['far from reduced', [[1, 0, 0], [7.3, 0.9, 0], [2.1, 3.3, 0.8]]],
  ['left-handed and sheared', [[3, 1, 0.5], [-2, 4, 1], [5, 4, -3]]],
];

describe('PeriodicCell.nearest', () => {
  const r = rng(11);
  const jobs = CELLS.map(([, cell]) => {
    const size = cell.reduce((s, row) => s + Math.hypot(...row), 0);
    const d = Array.from({ length: 150 }, () => [0, 1, 2].map(() => (r() - 0.5) * 4 * size) as Vec3);
    return { cell, d };
  });

  it('agrees with ase find_mic on cubic, orthorhombic, hexagonal, triclinic and badly skewed cells', () => {
    const ref = runPython<number[][][]>(MIC, JSON.stringify(jobs));
    jobs.forEach((job, c) => {
      const L = new PeriodicCell(job.cell);
      job.d.forEach((d, i) => {
        const v = L.minimumImage(d);
        for (let k = 0; k < 3; k++) expect(v[k], `${CELLS[c][0]} #${i}`).toBeCloseTo(ref[c][i][k], 9);
      });
    });
  });

  it('removes a whole lattice translation, given in multiples of the cell rows as given', () => {
    for (const [name, cell] of CELLS) {
      const L = new PeriodicCell(cell);
      for (const d of jobs[0].d.slice(0, 20)) {
        const { vector, shift } = L.nearest(d);
        expect(shift.every(Number.isInteger), name).toBe(true);
        for (let k = 0; k < 3; k++) {
          const t = shift[0] * cell[0][k] + shift[1] * cell[1][k] + shift[2] * cell[2][k];
          expect(d[k] - t).toBeCloseTo(vector[k], 9);
        }
      }
    }
  });

  it('reads atoms on opposite faces of a cube as neighbours and refuses a flat cell', () => {
    // Two atoms 0.2 Å either side of the face x = 0 of a 10 Å cube: 9.8 Å apart inside the cell, 0.2 Å across.
    const L = new PeriodicCell([[10, 0, 0], [0, 10, 0], [0, 0, 10]]);
    const { vector, shift } = L.nearest([9.8, 0, 0]);
    expect(vector[0]).toBeCloseTo(-0.2, 12);
    expect(shift).toEqual([1, 0, 0]);
    expect(() => new PeriodicCell([[1, 0, 0], [0, 1, 0], [1, 1, 0]])).toThrow(/coplanar/);
  });
});
