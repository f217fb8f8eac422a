/**
 * Measuring picked atoms (lib/view/measure.ts) against ASE (Debian's python3-ase): Atoms.get_distance and
 * Atoms.get_angle with mic=True give the nearest-image distance and angle, and with mic=False the plain ones.
 */
import { describe, expect, it } from 'vitest';
import { measurePicks } from '@/lib/view/measure';
import { cellFromParameters, type Cell } from '@/lib/math/cell';
import { runPython } from '../../helpers/python';

const ASE = `
import sys, json, numpy as np
from ase import Atoms
job = json.load(sys.stdin)
a = Atoms('X%d' % len(job['positions']), positions=job['positions'], cell=job['cell'], pbc=True)
out = []
for i, j, k in job['triples']:
    out.append({
        'mic': [a.get_distance(i, j, mic=True), a.get_distance(j, k, mic=True), a.get_angle(i, j, k, mic=True)],
        'plain': [a.get_distance(i, j), a.get_distance(j, k), a.get_angle(i, j, k)],
    })
print(json.dumps(out))
`;

function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a * 1664525 + 1013904223) >>> 0;
    return a / 4294967296;
  };
}

describe('measurePicks', () => {
  it('gives the distances and angle of ase with and without the nearest image, in a triclinic cell', () => {
    const cell: Cell = cellFromParameters({ a: 7.1, b: 8.3, c: 9.2, alpha: 78, beta: 101, gamma: 112 });
    const r = rng(5);
    const n = 40;
    // Atoms anywhere in the cell (fractional 0…1), so many pairs are closer across a face than inside.
    const positions = Array.from({ length: n }, () => {
      const f = [r(), r(), r()];
      return [0, 1, 2].map((k) => f[0] * cell[0][k] + f[1] * cell[1][k] + f[2] * cell[2][k]);
    });
    const triples = Array.from({ length: 60 }, () => {
      const i = Math.floor(r() * n);
      let j = Math.floor(r() * n);
      let k = Math.floor(r() * n);
      if (j === i) j = (j + 1) % n;
      if (k === j || k === i) k = (Math.max(i, j) + 1) % n;
      if (k === i || k === j) k = (k + 1) % n;
      return [i, j, k];
    });
    const ref = runPython<{ mic: number[]; plain: number[] }[]>(ASE, JSON.stringify({ positions, cell, triples }));
    const flat = new Float64Array(positions.flat());
    let across = 0;
    triples.forEach((t, m) => {
      const near = measurePicks(flat, t, cell);
      const plain = measurePicks(flat, t, null);
      expect(near.lengths[0]).toBeCloseTo(ref[m].mic[0], 9);
      expect(near.lengths[1]).toBeCloseTo(ref[m].mic[1], 9);
      expect(near.angle!).toBeCloseTo(ref[m].mic[2], 7);
      expect(plain.lengths[0]).toBeCloseTo(ref[m].plain[0], 9);
      expect(plain.angle!).toBeCloseTo(ref[m].plain[2], 7);
      if (near.shifts.some((s) => s.some((x) => x !== 0))) across++;
    });
    // The set really exercises images across faces.
    expect(across).toBeGreaterThan(10);
  });

  it('draws the second atom at its image across the face and names the translation', () => {
    // 0.2 Å either side of the face x = 0 of a 10 Å cube: the image of atom 1 sits at x = −0.1.
    const positions = new Float64Array([0.1, 5, 5, 9.9, 5, 5]);
    const m = measurePicks(positions, [0, 1], [[10, 0, 0], [0, 10, 0], [0, 0, 10]]);
    expect(m.lengths[0]).toBeCloseTo(0.2, 12);
    expect(m.points[1][0]).toBeCloseTo(-0.1, 12);
    expect(m.shifts).toEqual([[0, 0, 0], [-1, 0, 0]]);
    expect(m.angle).toBeNull();
    expect(measurePicks(positions, [0, 1]).lengths[0]).toBeCloseTo(9.8, 12);
  });
});
