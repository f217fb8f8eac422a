import { describe, expect, it } from 'vitest';
import { writePoscar } from '@/lib/formats/poscar';
import { writeExport } from '@/lib/formats/write';
import { generate } from '@/lib/models';
import type { Structure } from '@/lib/structure';
import { runPython } from '../../helpers/python';
import { approximant21, asJson, triclinic } from './simulation-fixtures';

/** ase.io.read(format='vasp') on our text, with the original structure built as ase.Atoms for comparison. */
const READ_BACK = `
import sys, json, io
import numpy as np
from ase import Atoms
from ase.io import read
src = json.loads(sys.stdin.readline())
text = sys.stdin.read()
a = read(io.StringIO(text), format='vasp')
ref = Atoms(numbers=src['numbers'], positions=np.array(src['positions']).reshape(-1, 3), cell=src['cell'], pbc=True)
print(json.dumps({
  'cell': a.cell.array.tolist(),
  'symbols': a.get_chemical_symbols(),
  'scaled': a.get_scaled_positions(wrap=False).tolist(),
  'refScaled': ref.get_scaled_positions(wrap=True).tolist(),
  'refSymbols': ref.get_chemical_symbols(),
}))
`;

interface Back {
  cell: number[][];
  symbols: string[];
  scaled: number[][];
  refScaled: number[][];
  refSymbols: string[];
}

function compare(s: Structure) {
  const text = writePoscar(s);
  const back = runPython<Back>(READ_BACK, `${asJson(s)}\n${text}`);
  // Cell: the same vectors (POSCAR keeps the orientation).
  for (let i = 0; i < 3; i++) for (let k = 0; k < 3; k++) expect(back.cell[i][k]).toBeCloseTo(s.cell![i][k], 8);
  // Species and positions: ASE's reading of the file matches ASE's own wrapping of the original, atom by atom once
  // both are grouped by element (POSCAR groups atoms by species: increasing Z, original order within an element).
  const order = [...back.refSymbols.keys()].sort((i, j) => s.species[i] - s.species[j] || i - j);
  expect(back.symbols).toEqual(order.map((i) => back.refSymbols[i]));
  order.forEach((i, row) => {
    for (let k = 0; k < 3; k++) {
      const f = back.scaled[row][k];
      expect(f).toBeGreaterThanOrEqual(0);
      expect(f).toBeLessThan(1);
      // Equal modulo 1 (a coordinate at 0.9999999999 in one and 0 in the other is the same site).
      const d = f - back.refScaled[i][k];
      expect(Math.abs(d - Math.round(d))).toBeLessThan(1e-8);
    }
  });
  return text;
}

describe('VASP POSCAR (read back with ase.io.read format="vasp", ASE 3.22)', () => {
  it('writes the VASP 5 layout: comment, scale, lattice, species line, counts, Direct', () => {
    const lines = writePoscar(triclinic(), { comment: '1 warning: test' }).split('\n');
    expect(lines[0]).toMatch(/^Tauforge tauforge-engine\/0\.1\.0 Al3Mn2Cu1 \| 1 warning: test$/);
    expect(lines[1]).toBe('1.0');
    expect(lines[5].trim().split(/\s+/)).toEqual(['Al', 'Mn', 'Cu']);
    expect(lines[6].trim().split(/\s+/)).toEqual(['3', '2', '1']);
    expect(lines[7]).toBe('Direct');
    expect(lines.length).toBe(8 + 6 + 1);
  });

  it('triclinic cell with atoms outside it: same cell, species and wrapped positions as ASE', () => {
    compare(triclinic());
  });

  it('the 2/1 icosahedral approximant (136 atoms, two species): same cell, species and positions as ASE', () => {
    compare(approximant21());
  });

  it('refuses a finite patch with a clear error', () => {
    const s = generate({ family: 'icosahedral', mode: 'patch', radius: 6, aR: 4.6, species: 'Al' });
    expect(() => writePoscar(s)).toThrow(/POSCAR needs a periodic cell/);
    expect(() => writeExport(s, 'poscar')).toThrow(/POSCAR needs a periodic cell/);
  });

  it('refuses a mixed site, naming it and suggesting an ordered variant', () => {
    const s: Structure = { ...triclinic(), site: new Uint16Array([0, 0, 0, 0, 1, 0]), siteClasses: [{ name: 'frame', species: 13 }, { name: 'glue', species: 30, mix: { 30: 0.6, 12: 0.4 } }] };
    expect(() => writePoscar(s)).toThrow(/site class "glue" \(atom 5\) is a mixed site \(40 % Mg, 60 % Zn\).*ordered variant/);
  });

  it('refuses a partially occupied site and unassigned vertices', () => {
    const s = { ...triclinic(), occupancy: new Float64Array([1, 1, 0.5, 1, 1, 1]) };
    expect(() => writePoscar(s)).toThrow(/atom 3 is a partially occupied site \(50 % Al\)/);
    const x = { ...triclinic(), species: new Uint16Array([13, 0, 13, 13, 13, 13]) };
    expect(() => writePoscar(x)).toThrow(/unassigned vertex \(X\)/);
  });
});
