import { describe, expect, it } from 'vitest';
import {
  cellFromParameters,
  cellParameters,
  cellVolume,
  faceSpacings,
  toCartesian,
  toFractional,
  type Cell,
} from '@/lib/structure';
import { hasPython, runPython } from './structure-pyref';

const tric: Cell = [
  [5.1, 0, 0],
  [1.2, 6.3, 0],
  [-0.7, 0.9, 7.4],
];

describe('cell conversions', () => {
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

  it('round-trips vectors → parameters → vectors and Cartesian ↔ fractional', () => {
    const p = cellParameters(tric);
    const back = cellFromParameters(p);
    expect(cellParameters(back).gamma).toBeCloseTo(p.gamma, 10);
    expect(cellVolume(back)).toBeCloseTo(cellVolume(tric), 9);
    const r = new Float64Array([1, 2, 3, -4, 0.5, 10]);
    const f = toFractional(tric, r);
    const r2 = toCartesian(tric, f);
    for (let i = 0; i < r.length; i++) expect(r2[i]).toBeCloseTo(r[i], 12);
    // a itself is (1,0,0) in fractional coordinates.
    expect(Array.from(toFractional(tric, new Float64Array(tric[0])))).toEqual([1, 0, 0].map((x) => expect.closeTo(x, 12)));
  });

  it('face spacings of an orthorhombic cell are its edges', () => {
    const s = faceSpacings([
      [2, 0, 0],
      [0, 3, 0],
      [0, 0, 4],
    ]);
    expect(s).toEqual([2, 3, 4].map((x) => expect.closeTo(x, 12)));
  });

  it('rejects impossible angles', () => {
    expect(() => cellFromParameters({ a: 1, b: 1, c: 1, alpha: 10, beta: 10, gamma: 170 })).toThrow(/do not form a cell/);
  });

  it.skipIf(!hasPython('ase'))('matches ase.geometry cellpar_to_cell / cell_to_cellpar (reference library)', () => {
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
});
