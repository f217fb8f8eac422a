/**
 * A sweep's grid against Python's itertools.product (reference: the Python standard library, through
 * Debian's python3): the same points in the same order, so point i always names the same params.
 */
import { describe, expect, it } from 'vitest';
import { gridPoint, gridSize, gridValues } from '../../../../lib/server/queue/grid';
import { runPython } from '../../../helpers/python';

const AXES = [
  { path: 'aR', values: [4.4, 4.5, 4.6] },
  { path: 'offset.1', values: [0, 0.5] },
  { path: 'order', values: ['1/1', '2/1', '3/2', '5/3'] },
];

describe('sweep grid', () => {
  it('enumerates the Cartesian product in itertools.product order', () => {
    const ref = runPython<(number | string)[][]>('import sys, json, itertools\naxes = json.load(sys.stdin)\nprint(json.dumps([list(p) for p in itertools.product(*[a["values"] for a in axes])]))', JSON.stringify(AXES));
    expect(gridSize(AXES)).toBe(ref.length);
    expect(Array.from({ length: gridSize(AXES) }, (_, i) => gridValues(AXES, i))).toEqual(ref);
  });

  it('writes values at their paths without touching the base params', () => {
    const base = { family: 'icosahedral', aR: 4.6, offset: [0, 0, 0], order: '1/1' };
    const p = gridPoint(base, AXES, 23);
    expect(p).toEqual({ family: 'icosahedral', aR: 4.6, offset: [0, 0.5, 0], order: '5/3' });
    expect(base.offset).toEqual([0, 0, 0]);
    expect(gridPoint({ family: 'x' }, [{ path: 'decoration.shells.0', values: [2] }], 0)).toEqual({ family: 'x', decoration: { shells: [2] } });
  });
});
