/**
 * The index box and reciprocal metric shared by the full reflection list and the orbit list.
 * Outside reference: numpy — the reciprocal metric of a triclinic cell is inv(A Aᵀ) (rows of A the cell
 * vectors; International Tables Vol. B §1.1.3), and the reflections with d ≥ dMin are counted by brute force.
 */
import { describe, expect, it } from 'vitest';
import { hklBox, reciprocalMetric } from '../../../lib/diffraction/hkl-box';
import { enumerateHkl } from '../../../lib/diffraction/structure-factor';
import { hklOrbits } from '../../../lib/diffraction/hkl-orbits';
import type { Mat3 } from '../../../lib/math/mat3';
import type { Structure } from '../../../lib/structure/types';
import { runPython } from '../../helpers/python';

const CELL: Mat3 = [
  [5.1, 0, 0],
  [1.3, 6.2, 0],
  [-0.7, 0.9, 7.4],
];
const one = (cell: Mat3): Structure => ({ positions: new Float64Array(3), species: new Uint16Array([13]), cell, provenance: { params: { test: true }, engine: 'test' } });

describe('hklBox', () => {
  it('has the reciprocal metric of numpy (inv(A Aᵀ)) and the reflection count of a brute-force numpy walk', () => {
    const ref = runPython<{ g: number[][]; n: number }>(`
import json, numpy as np, itertools
A = np.array(${JSON.stringify(CELL)})
g = np.linalg.inv(A @ A.T)
n = 0
for h, k, l in itertools.product(range(-8, 9), repeat=3):
    v = np.array([h, k, l])
    if (h, k, l) != (0, 0, 0) and v @ g @ v <= 1 / 1.5**2: n += 1
print(json.dumps({'g': g.tolist(), 'n': n}))`);
    const g = reciprocalMetric(CELL);
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expect(g[i][j]).toBeCloseTo(ref.g[i][j], 12);
    const box = hklBox(one(CELL), 1.5);
    expect(box.hMax).toBeLessThanOrEqual(8); // the brute-force range above covers the box
    expect(enumerateHkl(one(CELL), 1.5).length / 3).toBe(ref.n);
  });

  it('refuses a box too large to walk, in the full list and in the orbit list alike', () => {
    const big = one([
      [300, 0, 0],
      [0, 300, 0],
      [0, 0, 300],
    ]);
    expect(() => hklBox(big, 0.05)).toThrow(/dMin: 0.05 Å asks for about \d+ reflections; use a larger dMin/);
    expect(() => enumerateHkl(big, 0.05)).toThrow(/use a larger dMin/);
    expect(() => hklOrbits(big, 0.05, new Int8Array([1, 1, 1]), new Int8Array(0))).toThrow(/use a larger dMin/);
    expect(() => hklBox(big, 0)).toThrow(/dMin: must be a positive length/);
  });
});
