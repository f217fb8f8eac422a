import { describe, expect, it } from 'vitest';
import type { Structure } from '../../../lib/structure/types';
import { generate } from '../../../lib/models';
import { runPython } from '../../helpers/python';
import { toFractional } from '../../../lib/math/frac';
import { TAU } from '../../../lib/math/golden';

/** Number of atoms in the primitive cell spglib finds (spglib.find_primitive, reference library). */
function spglibPrimitiveCount(s: Structure): number {
  const frac = Array.from(toFractional(s.cell!, s.positions));
  const doc = JSON.stringify({ lattice: s.cell, frac, numbers: new Array(s.species.length).fill(1) });
  return runPython<number>(
    'import sys, json, spglib\nd=json.load(sys.stdin)\nf=d["frac"]\npos=[f[i:i+3] for i in range(0,len(f),3)]\nr=spglib.find_primitive((d["lattice"], pos, d["numbers"]), symprec=1e-4)\nprint(len(r[2]))',
    doc,
  );
}

describe('decagonal model', () => {
  it('stacks the layer tiling: layers × the planar vertices, z = k·spacing, shift per layer', () => {
    const planar = generate({ family: 'penrose', radius: 10, edge: 2 });
    const s = generate({ family: 'decagonal', radius: 10, edge: 2, layers: 3, spacing: 2.1, shift: [0.5, -0.25] });
    const m = planar.species.length;
    expect(s.species.length).toBe(3 * m);
    expect(s.dim).toBe(3);
    expect(s.cell).toBeUndefined();
    for (const k of [0, 1, 2]) {
      const o = k * m + 7;
      expect(s.positions[3 * o]).toBeCloseTo(planar.positions[21] + 0.5 * k, 12);
      expect(s.positions[3 * o + 1]).toBeCloseTo(planar.positions[22] - 0.25 * k, 12);
      expect(s.positions[3 * o + 2]).toBeCloseTo(2.1 * k, 12);
    }
  });

  it('approximant: orthorhombic cell a × b × (layers·spacing) for zero shift, one vertex per rhombus in each layer', () => {
    const edge = 2.45;
    const s = generate({ family: 'decagonal', approximant: { p: 3, q: 2 }, edge, layers: 2, spacing: 2 });
    const [a, b, c] = s.cell!;
    expect(a[0] * b[0] + a[1] * b[1]).toBeCloseTo(0, 9);
    expect(c).toEqual([0, 0, 4]);
    // Worked by hand: the layer is a periodic Penrose rhombus tiling, so its cell area is
    // n_thick·e²·sin 72° + n_thin·e²·sin 36° = e²·sin 36°·(n_thin + n_thick·τ) (sin 72° = τ sin 36°); τ is
    // irrational, so the cell fixes both counts. For the 3/2 cell the area is e²·sin 36°·(80 + 130τ):
    // 130 thick and 80 thin rhombi. A rhombus tiling of a torus has as many vertices as tiles
    // (V − E + F = 0 with E = 2F), so 210 vertices per layer.
    const area = Math.abs(a[0] * b[1] - a[1] * b[0]);
    expect(area / (edge * edge * Math.sin(Math.PI / 5))).toBeCloseTo(80 + 130 * TAU, 8);
    expect(s.species.length).toBe(2 * (80 + 130));
  });

  it('spglib finds the planar approximant cell primitive, and the stacked cell primitive / layers (spglib.find_primitive)', () => {
    const planar = generate({ family: 'penrose', approximant: { p: 2, q: 1 }, edge: 2.45 });
    expect(spglibPrimitiveCount(planar)).toBe(planar.species.length);
    const stacked = generate({ family: 'decagonal', approximant: { p: 2, q: 1 }, layers: 3, spacing: 2, shift: [0.7, 0.3] });
    expect(spglibPrimitiveCount(stacked)).toBe(stacked.species.length / 3);
  }, 60_000);

  it('bad input names the field; size is checked before building', () => {
    expect(() => generate({ family: 'decagonal', })).toThrow(/radius: required/);
    expect(() => generate({ family: 'decagonal', radius: 5, layers: 0 })).toThrow(/layers: must be at least 1/);
    expect(() => generate({ family: 'decagonal', radius: 5, spacing: -1 })).toThrow(/spacing:/);
    expect(() => generate({ family: 'decagonal', radius: 5, shift: [1] as never })).toThrow(/shift/);
    expect(() => generate({ family: 'decagonal', approximant: { p: 4, q: 3 } })).toThrow(/approximant: 4\/3 is not a convergent/);
    expect(() => generate({ family: 'decagonal', radius: 200, layers: 100 })).toThrow(/maxPoints: 100 decagonal layers would hold about/);
  });
});
