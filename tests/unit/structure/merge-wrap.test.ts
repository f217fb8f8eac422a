import { describe, expect, it } from 'vitest';
import { mergeClose, wrapCounting } from '../../../lib/structure/merge';
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

  it('a coordinate a hair below 0 (float noise) becomes 0, not a', () => {
    const s: Structure = { positions: new Float64Array([-1e-15, 1, 1]), species: new Uint16Array([13]), cell: [[4, 0, 0], [0, 4, 0], [0, 0, 4]], provenance: { engine: 'test', params: null } };
    const w = wrapCounting(s);
    expect(w.structure.positions[0]).toBe(0);
    expect(w.count).toBe(1);
  });
});

describe('mergeClose with position "mean"', () => {
  it('two mirror images across the cell boundary merge onto the mirror plane (minimum image), not onto one of them', () => {
    // x = 0.2 and x = a − 0.2 are 0.4 Å apart through the boundary, images under x → −x: the mean is x = 0.
    const s: Structure = {
      positions: new Float64Array([0.2, 1, 1, 3.8, 1, 1, 2, 2, 2]),
      species: new Uint16Array([13, 13, 25]),
      cell: [[4, 0, 0], [0, 4, 0], [0, 0, 4]],
      provenance: { engine: 'test', params: null },
    };
    const kept = mergeClose(s, 0.5);
    expect(Array.from(kept.structure.positions.slice(0, 3))).toEqual([0.2, 1, 1]);
    const mean = mergeClose(s, 0.5, { position: 'mean' });
    expect(mean.count).toBe(1);
    expect(mean.structure.positions[0]).toBeCloseTo(0, 12);
    expect(Array.from(mean.structure.positions.slice(1, 6))).toEqual([1, 1, 2, 2, 2]);
    // Finite structures: the plain mean.
    const finite = mergeClose({ ...s, cell: undefined, positions: new Float64Array([0.2, 1, 1, 0.6, 1, 1, 2, 2, 2]) }, 0.5, { position: 'mean' });
    expect(finite.structure.positions[0]).toBeCloseTo(0.4, 12);
  });
});
