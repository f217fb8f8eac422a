import { describe, expect, it } from 'vitest';
import type { Cell } from '@/lib/math/cell';
import { toCartesian, toFractional, wrapFractional } from '@/lib/math/frac';
import { runPython } from '../../helpers/python';

const tric: Cell = [
  [5.1, 0, 0],
  [1.2, 6.3, 0],
  [-0.7, 0.9, 7.4],
];
const cart = new Float64Array([1, 2, 3, -4, 0.5, 10, 12.5, -3.25, 0.125]);

describe('fractional ↔ Cartesian', () => {
  it('matches ase Atoms.get_scaled_positions(wrap=False) and back (reference library)', () => {
    const ref = runPython<number[][]>(
      `import sys, json, numpy as np
from ase import Atoms
d = json.loads(sys.stdin.read())
a = Atoms("H%d" % len(d["pos"]), positions=d["pos"], cell=d["cell"], pbc=True)
print(json.dumps(a.get_scaled_positions(wrap=False).tolist()))`,
      JSON.stringify({ pos: [[1, 2, 3], [-4, 0.5, 10], [12.5, -3.25, 0.125]], cell: tric }),
    );
    const f = toFractional(tric, cart);
    expect(Array.from(f)).toEqual(ref.flat().map((x) => expect.closeTo(x, 13)));
    const back = toCartesian(tric, f);
    expect(Array.from(back)).toEqual(Array.from(cart).map((x) => expect.closeTo(x, 12)));
  });

  it('the cell vectors are (1,0,0), (0,1,0), (0,0,1) and a + b + c is (1,1,1)', () => {
    const rows = new Float64Array([...tric[0], ...tric[1], ...tric[2]]);
    expect(Array.from(toFractional(tric, rows))).toEqual([1, 0, 0, 0, 1, 0, 0, 0, 1].map((x) => expect.closeTo(x, 14)));
    const corner = toCartesian(tric, new Float64Array([1, 1, 1]));
    expect(Array.from(corner)).toEqual([5.6, 7.2, 7.4].map((x) => expect.closeTo(x, 14)));
  });

  it('wraps into [0, 1): −0.25 → 0.75, 1 → 0, 2.5 → 0.5, and −1e-17 (which would round to 1) → 0', () => {
    expect(Array.from(wrapFractional(new Float64Array([-0.25, 1, 2.5, -1e-17, 0.999])))).toEqual([0.75, 0, 0.5, 0, 0.999]);
  });
});
