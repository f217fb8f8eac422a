import { describe, expect, it } from 'vitest';
import { MAX_SUPERCELL_COPIES, parseSupercell, supercell, type Structure } from '@/lib/structure';
import { writeExport } from '@/lib/formats/write';
import { runPython } from '../../helpers/python';
import { approximant21, asJson, triclinic } from '../formats/simulation-fixtures';

/** ase.Atoms.repeat (ASE 3.22) as the reference: cell, positions and species in ASE's order. */
const REPEAT = `
import sys, json
import numpy as np
from ase import Atoms
src = json.loads(sys.stdin.readline())
n = json.loads(sys.stdin.readline())
a = Atoms(numbers=src['numbers'], positions=np.array(src['positions']).reshape(-1, 3), cell=src['cell'], pbc=True).repeat(n)
print(json.dumps({'cell': a.cell.array.tolist(), 'positions': a.positions.ravel().tolist(), 'numbers': a.numbers.tolist()}))
`;

function compare(s: Structure, n: [number, number, number]) {
  const mine = supercell(s, n);
  const ref = runPython<{ cell: number[][]; positions: number[]; numbers: number[] }>(REPEAT, `${asJson(s)}\n${JSON.stringify(n)}\n`);
  for (let i = 0; i < 3; i++) for (let k = 0; k < 3; k++) expect(mine.cell![i][k]).toBeCloseTo(ref.cell[i][k], 10);
  expect(Array.from(mine.species)).toEqual(ref.numbers);
  expect(mine.positions.length).toBe(ref.positions.length);
  let worst = 0;
  for (let i = 0; i < ref.positions.length; i++) worst = Math.max(worst, Math.abs(mine.positions[i] - ref.positions[i]));
  expect(worst).toBeLessThan(1e-10);
}

describe('supercell n₁×n₂×n₃ (against ase.Atoms.repeat)', () => {
  it('triclinic 2×3×1: same cell, atom order, species and positions as ASE', () => compare(triclinic(), [2, 3, 1]));
  it('2/1 approximant 2×2×1 (544 atoms) and 1×1×3', () => {
    compare(approximant21(), [2, 2, 1]);
    compare(approximant21(), [1, 1, 3]);
  });

  it('repeats per-atom site, occupancy and perp with the atoms, and notes it', () => {
    const s: Structure = { ...triclinic(), site: new Uint16Array([0, 1, 0, 1, 0, 1]), occupancy: new Float64Array([1, 0.5, 1, 1, 1, 1]), perp: new Float64Array(6).map((_, i) => i), perpDim: 1 };
    const t = supercell(s, [2, 1, 1]);
    expect(Array.from(t.site!)).toEqual([0, 1, 0, 1, 0, 1, 0, 1, 0, 1, 0, 1]);
    expect(t.occupancy![7]).toBe(0.5);
    expect(t.perp![11]).toBe(5);
    expect(t.notes!.at(-1)).toMatch(/supercell 2×1×1/);
  });

  it('parses 2x2x1 and refuses bad sizes and finite structures with clear errors', () => {
    expect(parseSupercell('2x2x1')).toEqual([2, 2, 1]);
    expect(parseSupercell('3×1×2')).toEqual([3, 1, 2]);
    expect(parseSupercell('1,1,4')).toEqual([1, 1, 4]);
    expect(() => parseSupercell('2x2')).toThrow(/three positive whole numbers/);
    expect(() => parseSupercell('0x1x1')).toThrow(/≥ 1/);
    expect(() => parseSupercell('11x10x10')).toThrow(new RegExp(`more than ${MAX_SUPERCELL_COPIES}`));
    const { cell: _c, ...finite } = triclinic();
    void _c;
    expect(() => supercell(finite, [2, 1, 1])).toThrow(/no cell/);
    expect(() => writeExport(finite, 'xyz', { supercell: [2, 1, 1] })).toThrow(/needs a periodic cell/);
    // The point cap of the cut applies to the supercell too.
    const capped = { ...approximant21(), model: { maxPoints: 1000 } } as unknown as Structure;
    expect(() => writeExport(capped, 'poscar', { supercell: [2, 2, 2] })).toThrow(/1,088 atoms, more than the point cap of 1,000/);
  });
});
