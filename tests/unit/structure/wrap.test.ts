import { describe, expect, it } from 'vitest';
import { atomsOutsideCell, wrapIntoCell, wrappedFractional, type Structure } from '@/lib/structure';
import { writeExport } from '@/lib/formats/write';
import { readExtxyz } from '@/lib/formats';
import { runPython } from '../../helpers/python';
import { asJson, triclinic } from '../formats/simulation-fixtures';

describe('wrapping into the cell', () => {
  it('agrees with ase.Atoms.wrap (ASE 3.22) and keeps every fractional coordinate in [0, 1)', () => {
    const s = triclinic();
    const ref = runPython<number[]>(
      `import sys, json\nimport numpy as np\nfrom ase import Atoms\nsrc = json.loads(sys.stdin.read())\na = Atoms(numbers=src['numbers'], positions=np.array(src['positions']).reshape(-1, 3), cell=src['cell'], pbc=True)\na.wrap()\nprint(json.dumps(a.positions.ravel().tolist()))`,
      asJson(s),
    );
    const w = wrapIntoCell(s);
    w.positions.forEach((x, i) => expect(x).toBeCloseTo(ref[i], 9));
    for (const f of wrappedFractional(s)) expect(f >= 0 && f < 1).toBe(true);
    expect(atomsOutsideCell(s)).toBe(4); // by construction: atoms 3, 4, 5, 6 have a coordinate outside [0, 1)
    expect(atomsOutsideCell(w)).toBe(0);
  });

  it('snaps a coordinate that would print as 1.00000000 to 0', () => {
    const s: Structure = { positions: new Float64Array([9.99999999999, 0, -1e-13]), species: new Uint16Array([13]), cell: [[10, 0, 0], [0, 10, 0], [0, 0, 10]], provenance: { engine: 'x', params: null } };
    expect(Array.from(wrappedFractional(s))).toEqual([0, 0, 0]);
  });

  it('every periodic export is wrapped (extended XYZ read back: no atom outside)', () => {
    const back = readExtxyz(writeExport(triclinic(), 'extxyz'));
    expect(atomsOutsideCell(back)).toBe(0);
  });
});
