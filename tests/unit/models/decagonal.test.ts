import { describe, expect, it } from 'vitest';
import type { Structure } from '../../../lib/structure/types';
import { generate } from '../../../lib/models';
import { runPython } from '../../helpers/python';
import { toFractional } from '../../../lib/math/frac';
import { TAU } from '../../../lib/math/golden';
import { enumerateHkl, structureFactorsHkl } from '../../../lib/diffraction/structure-factor';

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
    const s = generate({ family: 'decagonal', radius: 10, edge: 2, layers: 3, spacing: 2.1, shift: [0.5, -0.25], stacking: 'translation' });
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
    const stacked = generate({ family: 'decagonal', approximant: { p: 2, q: 1 }, layers: 3, spacing: 2, shift: [0.7, 0.3], stacking: 'translation' });
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

  describe('10₅ screw stacking (Steurer, Z. Kristallogr. 219 (2004) 391: decagonal phases have a tenfold screw axis, period two layers — from memory)', () => {
    const params = (stacking: 'screw' | 'translation') =>
      ({ family: 'decagonal', approximant: { p: 2, q: 1 }, edge: 2.45, layers: 2, spacing: 2.04, species: 'Al', stacking }) as const;

    it('the second layer is the first turned by 36° — the Penrose layer inverted through the axis (window inverted)', () => {
      const s = generate({ family: 'decagonal', radius: 8, edge: 2.45, species: 'Al' });
      const m = s.species.length / 2;
      for (const i of [0, 5, 17]) {
        expect(s.positions[3 * (m + i)]).toBeCloseTo(-s.positions[3 * i], 12);
        expect(s.positions[3 * (m + i) + 1]).toBeCloseTo(-s.positions[3 * i + 1], 12);
        expect(s.positions[3 * (m + i) + 2]).toBeCloseTo(2.04, 12);
      }
      // The inverted layer is a different tiling of the same patch: not a translate of the first.
      const key = (k: number) => `${s.positions[3 * k].toFixed(6)},${s.positions[3 * k + 1].toFixed(6)}`;
      const first = new Set(Array.from({ length: m }, (_, i) => key(i)));
      let shared = 0;
      for (let i = 0; i < m; i++) if (first.has(key(m + i))) shared++;
      expect(shared).toBeLessThan(m);
    });

    it('spglib finds the two-layer period: the primitive cell keeps every atom (identical layers halve it)', () => {
      const screw = generate(params('screw'));
      expect(spglibPrimitiveCount(screw)).toBe(screw.species.length);
      const flat = generate(params('translation'));
      expect(spglibPrimitiveCount(flat)).toBe(flat.species.length / 2);
    }, 60_000);

    it('odd-l reflections of the two-layer cell are present (lib/diffraction and numpy agree); identical layers extinguish them', () => {
      const oddMax = (stacking: 'screw' | 'translation') => {
        const s = generate(params(stacking));
        const f = structureFactorsHkl(s, enumerateHkl(s, 1.2), 'xray');
        let odd = 0;
        let all = 0;
        for (let r = 0; r < f.f2.length; r++) {
          all = Math.max(all, f.f2[r]);
          if (Math.abs(f.hkl[3 * r + 2]) % 2 === 1) odd = Math.max(odd, f.f2[r]);
        }
        // numpy: the strongest odd-l geometric structure factor |Σ exp(2πi h·x)|² / N² over |h|, |k| ≤ 8, l = ±1, ±3.
        const frac = Array.from(toFractional(s.cell!, s.positions));
        const ref = runPython<number>(
          'import sys, json, numpy as np\nf=np.array(json.load(sys.stdin)).reshape(-1,3)\nb=0\nfor h in range(-8,9):\n  for k in range(-8,9):\n    for l in (-3,-1,1,3):\n      b=max(b,abs(np.exp(2j*np.pi*(f@np.array([h,k,l]))).sum())**2/len(f)**2)\nprint(json.dumps(b))',
          JSON.stringify(frac),
        );
        return { ratio: odd / all, ref };
      };
      const screw = oddMax('screw');
      expect(screw.ratio).toBeGreaterThan(1e-3);
      expect(screw.ref).toBeGreaterThan(1e-3);
      const flat = oddMax('translation');
      expect(flat.ratio).toBeLessThan(1e-20);
      expect(flat.ref).toBeLessThan(1e-20);
    }, 60_000);

    it('an odd number of layers is refused for the screw stacking, with the reason', () => {
      expect(() => generate({ family: 'decagonal', radius: 5, layers: 3 })).toThrow(/layers: the 10₅ screw stacking repeats after two layers, so layers per period must be even \(got 3\)/);
    });
  });
});
