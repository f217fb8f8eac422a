import { describe, expect, it } from 'vitest';
import { icosahedralApproximant, approximantLatticeConstant, approximantVertexCount, approximantFrame } from '../../../../lib/models/icosahedral/approximant';
import { icosahedralBasis } from '../../../../lib/models/icosahedral/hyperlattice';
import { TAU } from '../../../../lib/math/golden';
import { zonotopeWindow, windowVolume } from '../../../../lib/models/icosahedral/window';
import { runPython } from '../../../helpers/python';

const ORDERS: [number, number][] = [[1, 1], [2, 1], [3, 2], [5, 3], [8, 5], [13, 8], [21, 13]];

describe('cubic approximants by linear phason strain', () => {
  it('lattice constant follows Elser & Henley, PRL 55 (1985) 2883: a = 2(pτ+q)aR/√(2+τ), and the cell edge is π∥ of the period N_x', () => {
    const b = icosahedralBasis(4.6);
    for (const [p, q] of ORDERS) {
      const s = icosahedralApproximant({ p, q, aR: 4.6, maxPoints: 3e5 });
      const a = (2 * (p * TAU + q) * 4.6) / Math.sqrt(2 + TAU);
      expect(s.cell![0][0]).toBeCloseTo(a, 10);
      expect(approximantLatticeConstant(p, q, 4.6)).toBeCloseTo(a, 12);
      const N = approximantFrame(p, q, 4.6).periods;
      let x = 0;
      for (let i = 0; i < 6; i++) x += N[i] * b.par[3 * i];
      expect(x).toBeCloseTo(a, 9);
    }
  });

  it('1/1 with aR = 4.60 Å gives a ≈ 12.68 Å, the α-(Al,Mn,Si) cubic constant (from memory), within 0.5 %', () => {
    expect(Math.abs(approximantLatticeConstant(1, 1, 4.6) / 12.68 - 1)).toBeLessThan(0.005);
  });

  it('strained perpendicular vectors: e⊥ − s·e∥ = λ·M with integer M (τ → p/q), and M·N_k = 0', () => {
    const b = icosahedralBasis(4.6);
    for (const [p, q] of ORDERS) {
      const f = approximantFrame(p, q, 4.6);
      for (let k = 0; k < 18; k++) expect(b.perp[k] - f.strain * b.par[k]).toBeCloseTo(f.lambda * f.M[k], 10);
      for (let r = 0; r < 3; r++)
        for (let c = 0; c < 3; c++) {
          let v = 0;
          for (let i = 0; i < 6; i++) v += f.periods[6 * r + i] * f.M[3 * i + c];
          expect(v).toBe(0);
        }
    }
  });

  it('vertices per cell = density × cell volume (Baake & Grimm 2013) and grow by ≈ τ³ per order; 1/1 has 32 (from memory)', () => {
    const counts: number[] = [];
    for (const [p, q] of ORDERS) {
      const s0 = icosahedralApproximant({ p, q, aR: 1, maxPoints: 3e5 });
      // Points per cell: the occupancy sum (boundary sites of a singular symmetric cut carry fractions).
      const n = s0.occupancy ? Math.round(Array.from(s0.occupancy).reduce((x, y) => x + y, 0) * 1e6) / 1e6 : s0.species.length;
      const s = { ...s0, species: { length: n } };
      counts.push(n);
      const a = s.cell![0][0];
      const fromDensity = (a ** 3 * windowVolume(zonotopeWindow(approximantFrame(p, q, 1).M, { scale: approximantFrame(p, q, 1).lambda }))) / 8;
      expect(s.species.length).toBe(Math.round(fromDensity));
      expect(s.species.length).toBe(approximantVertexCount(p, q));
      // and close to the quasicrystal density: the unstrained triacontahedron of edge 1 has volume
      // 4√(5+2√5) (handbook value), the 6D cell 8 — so 4(pτ+q)³/√5 vertices (worked out in the last test).
      const qc = (a ** 3 * 4 * Math.sqrt(5 + 2 * Math.sqrt(5))) / 8;
      if (p >= 8) expect(Math.abs(s.species.length / qc - 1)).toBeLessThan(0.01);
    }
    expect(counts[0]).toBe(32);
    const r = counts[counts.length - 1] / counts[counts.length - 2];
    expect(Math.abs(r / TAU ** 3 - 1)).toBeLessThan(0.02);
  });

  it('fractional coordinates lie in [0,1) and the cell is periodic: with minimum image every vertex has ≥ 4 neighbours at exactly aR', () => {
    for (const [p, q] of [[1, 1], [2, 1], [3, 2]] as [number, number][]) {
      const aR = 4.6;
      const s = icosahedralApproximant({ p, q, aR });
      const a = s.cell![0][0];
      const P = s.positions;
      const N = s.species.length;
      expect(N).toBeGreaterThanOrEqual(32);
      for (let i = 0; i < 3 * N; i++) {
        expect(P[i]).toBeGreaterThanOrEqual(0);
        expect(P[i]).toBeLessThan(a);
      }
      for (let i = 0; i < N; i++) {
        let edges = 0;
        for (let j = 0; j < N; j++) {
          let d2 = 0;
          for (let c = 0; c < 3; c++) {
            let d = P[3 * i + c] - P[3 * j + c];
            d -= a * Math.round(d / a);
            d2 += d * d;
          }
          if (Math.abs(Math.sqrt(d2) - aR) < 1e-9) edges++;
        }
        expect(edges).toBeGreaterThanOrEqual(4);
      }
    }
  });

  it('detected centring agrees with the lattice translations spglib finds (pure translations from spglib.get_symmetry)', () => {
    // spglib reduces the cell to a primitive one; we express its vectors in the cubic cell and ask which
    // centring vectors ½(1,1,1) (I) or ½(1,1,0)+perms (F) are lattice vectors. (The point group can be lower
    // than cubic at singular offsets, so the translation lattice, not the space-group letter, is compared.)
    const script = `
import sys, json, numpy as np, spglib
out = []
for c in json.load(sys.stdin):
    a = c['a']; pos = np.array(c['pos']).reshape(-1, 3) / a
    ops = spglib.get_symmetry((np.eye(3) * a, pos, [1] * len(pos)), symprec=1e-4)
    tr = [t % 1.0 for r, t in zip(ops['rotations'], ops['translations']) if (r == np.eye(3, dtype=int)).all()]
    def inlat(t):
        return any(np.allclose(((x - np.array(t)) + 0.5) % 1.0 - 0.5, 0, atol=1e-6) for x in tr)
    ratio = len(tr)
    kind = 'P'
    if inlat([.5, .5, .5]): kind = 'I'
    if inlat([.5, .5, 0]) and inlat([0, .5, .5]) and inlat([.5, 0, .5]): kind = 'F'
    out.append([kind, ratio])
print(json.dumps(out))`;
    const cases = ([[1, 1], [2, 1], [3, 2], [5, 3]] as [number, number][]).flatMap(([p, q]) => [
      icosahedralApproximant({ p, q, aR: 4.6 }),
      icosahedralApproximant({ p, q, aR: 4.6, offset: [0.11, -0.07, 0.05] }),
    ]);
    const sym = runPython<[string, number][]>(script, JSON.stringify(cases.map((s) => ({ a: s.cell![0][0], pos: Array.from(s.positions) }))));
    cases.forEach((s, k) => {
      expect(sym[k][0]).toBe(s.centring);
      expect(sym[k][1]).toBe(s.centring === 'P' ? 1 : s.centring === 'I' ? 2 : 4);
    });
    // Both centrings must actually occur here (p+q even ⇒ ½(N_x+N_y+N_z) ∈ Z⁶ ⇒ I).
    expect(cases.map((s) => s.centring)).toEqual(['I', 'I', 'P', 'P', 'P', 'P', 'I', 'I']);
  });

  it('rejects orders that are not Fibonacci ratios and oversize cells', () => {
    expect(() => icosahedralApproximant({ p: 4, q: 3, aR: 4.6 })).toThrow(/order/);
    // Estimate worked by hand: density × a³ = [4√(5+2√5) aR³ / (8 aR⁶)] · [2(pτ+q) aR/√(2+τ)]³ = 4(pτ+q)³/√5
    // (√(5+2√5) = (2+τ)^{3/2}/√5), and for 13/8: 4 · 29.034442³ / √5 = 43,784.
    expect(() => icosahedralApproximant({ p: 13, q: 8, aR: 4.6, maxPoints: 1000 })).toThrow(/maxPoints: .*about 43,784 points/);
  });
});
