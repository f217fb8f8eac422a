import { describe, expect, it } from 'vitest';
import { cellFromParameters, cellParameters, cellVolume, faceSpacings, type Cell } from '@/lib/math/cell';
import { runPython } from '../../helpers/python';

const tric: Cell = [
  [5.1, 0, 0],
  [1.2, 6.3, 0],
  [-0.7, 0.9, 7.4],
];
const DEG = Math.PI / 180;

describe('cell parameters', () => {
  it('gives lengths and angles of a hexagonal cell (textbook: a = b, γ = 120°)', () => {
    const a = 3.2;
    const p = cellParameters([
      [a, 0, 0],
      [-a / 2, (a * Math.sqrt(3)) / 2, 0],
      [0, 0, 5.2],
    ]);
    expect(p.a).toBeCloseTo(3.2, 12);
    expect(p.b).toBeCloseTo(3.2, 12);
    expect(p.gamma).toBeCloseTo(120, 10);
    expect(p.alpha).toBeCloseTo(90, 10);
  });

  it('matches ase.geometry cellpar_to_cell / cell_to_cellpar (reference library)', () => {
    const ref = runPython<{ par: number[]; cell: number[][] }>(
      `import json, numpy as np
from ase.geometry import cell_to_cellpar, cellpar_to_cell
c = np.array(${JSON.stringify(tric)})
par = cell_to_cellpar(c)
print(json.dumps({"par": par.tolist(), "cell": cellpar_to_cell(par).tolist()}))`,
    );
    const p = cellParameters(tric);
    expect([p.a, p.b, p.c, p.alpha, p.beta, p.gamma]).toEqual(ref.par.map((x) => expect.closeTo(x, 9)));
    const c = cellFromParameters(p);
    for (let i = 0; i < 3; i++) for (let k = 0; k < 3; k++) expect(c[i][k]).toBeCloseTo(ref.cell[i][k], 9);
  });

  it('rejects impossible angles and non-positive lengths', () => {
    expect(() => cellFromParameters({ a: 1, b: 1, c: 1, alpha: 10, beta: 10, gamma: 170 })).toThrow(/do not form a cell/);
    expect(() => cellFromParameters({ a: 0, b: 1, c: 1, alpha: 90, beta: 90, gamma: 90 })).toThrow(/positive/);
  });
});

describe('cell volume', () => {
  it('triclinic: V = abc·√(1 − cos²α − cos²β − cos²γ + 2 cosα cosβ cosγ) (International Tables Vol. B §1.1)', () => {
    const p = { a: 4.1, b: 5.3, c: 6.2, alpha: 81, beta: 97, gamma: 104 };
    const [ca, cb, cg] = [p.alpha, p.beta, p.gamma].map((x) => Math.cos(x * DEG));
    const handbook = p.a * p.b * p.c * Math.sqrt(1 - ca * ca - cb * cb - cg * cg + 2 * ca * cb * cg);
    expect(cellVolume(cellFromParameters(p))).toBeCloseTo(handbook, 11);
  });

  it('is signed: a left-handed cell (rows swapped) has negative volume; cubic a³', () => {
    expect(cellVolume([tric[1], tric[0], tric[2]])).toBeCloseTo(-cellVolume(tric), 12);
    expect(cellVolume(cellFromParameters({ a: 4.05, b: 4.05, c: 4.05, alpha: 90, beta: 90, gamma: 90 }))).toBeCloseTo(4.05 ** 3, 12);
  });

  it('matches ase Cell.volume (reference library)', () => {
    const v = runPython<number>(`import json
from ase.cell import Cell
print(json.dumps(Cell(${JSON.stringify(tric)}).volume))`);
    expect(cellVolume(tric)).toBeCloseTo(v, 11);
  });
});

describe('face spacings', () => {
  it('of an orthorhombic cell are its edges', () => {
    const s = faceSpacings([
      [2, 0, 0],
      [0, 3, 0],
      [0, 0, 4],
    ]);
    expect(s).toEqual([2, 3, 4].map((x) => expect.closeTo(x, 12)));
  });

  it('hexagonal: d(100) = a·√3/2 (textbook 1/d² = 4(h² + hk + k²)/(3a²) + l²/c²)', () => {
    const a = 3.21;
    const s = faceSpacings(cellFromParameters({ a, b: a, c: 5.21, alpha: 90, beta: 90, gamma: 120 }));
    expect(s[0]).toBeCloseTo((a * Math.sqrt(3)) / 2, 12);
    expect(s[1]).toBeCloseTo((a * Math.sqrt(3)) / 2, 12);
    expect(s[2]).toBeCloseTo(5.21, 12);
  });

  it('triclinic: the distances between opposite faces from ase (volume / face area)', () => {
    const ref = runPython<number[]>(`import json, numpy as np
from ase.cell import Cell
c = Cell(${JSON.stringify(tric)})
print(json.dumps([c.volume / np.linalg.norm(np.cross(c[(i + 1) % 3], c[(i + 2) % 3])) for i in range(3)]))`);
    expect(faceSpacings(tric)).toEqual(ref.map((x) => expect.closeTo(x, 12)));
  });
});
