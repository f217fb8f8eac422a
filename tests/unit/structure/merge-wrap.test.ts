import { describe, expect, it } from 'vitest';
import { wrapCounting } from '../../../lib/structure/merge';
import type { Structure } from '../../../lib/structure/types';
import { runPython } from '../../helpers/python';

describe('wrapCounting', () => {
  it('moves atoms into a triclinic cell as ase.Atoms.wrap does (reference library), counts the moved ones, keeps the rest bit for bit', () => {
    const cell: Structure['cell'] = [[5, 0, 0], [1.2, 4.5, 0], [0.7, -0.9, 6]];
    const positions = new Float64Array([1, 1, 1, -2.3, 7.1, 3.3, 12.5, -4, -7.2, 2, 2, 5.9]);
    const s: Structure = { positions, species: new Uint16Array([13, 13, 25, 30]), cell, provenance: { engine: 'test', params: null } };
    const w = wrapCounting(s);
    const ref = runPython<number[][]>(
      'import sys, json\nfrom ase import Atoms\nd=json.load(sys.stdin)\na=Atoms("Al4", positions=d["p"], cell=d["c"], pbc=True)\na.wrap()\nprint(json.dumps(a.positions.tolist()))',
      JSON.stringify({ p: [[1, 1, 1], [-2.3, 7.1, 3.3], [12.5, -4, -7.2], [2, 2, 5.9]], c: cell }),
    );
    ref.flat().forEach((x, i) => expect(w.structure.positions[i]).toBeCloseTo(x, 9));
    expect(w.count).toBe(2);
    expect(w.structure.positions[0]).toBe(1);
    expect(wrapCounting({ ...s, cell: undefined }).count).toBe(0);
  });
});
