import { describe, expect, it } from 'vitest';
import { fibonacciPeaks, icosahedralPeaks, penrosePeaks, penroseWindows } from '../../../lib/diffraction/hyperspace';
import { intensityAt } from '../../../lib/diffraction/intensity-at';
import { csgFromHyper, hyperFromCsg, qSquaredFromNM } from '../../../lib/diffraction/indexing';
import { icosahedralPatch } from '../../../lib/models/icosahedral/patch';
import { TAU } from '../../../lib/math/golden';
import type { Structure } from '../../../lib/structure/types';
import { generate } from '../../../lib/models';

describe('hyperspace diffraction', () => {
  it('Fibonacci chain (N = 17712 from lib/models/chain/generate.ts): |F(Q)|²/N² at Fourier-module points = sinc²(Q⊥L/2) of the window within 1 % (Baake & Grimm, Aperiodic Order vol. 1, 2013, ch. 9)', () => {
    const aR = 2.5;
    const chain = generate({ family: 'fibonacci', order: 20, long: aR, ratio: TAU });
    const n = chain.species.length;
    expect(n).toBeGreaterThan(1e4);
    const peaks = fibonacciPeaks({ family: 'fibonacci', aR, qmax: 6, threshold: 0.01 }).filter((p) => p.qParNorm > 0);
    expect(peaks.length).toBeGreaterThan(5);
    const q = new Float64Array(3 * peaks.length);
    peaks.forEach((p, i) => (q[3 * i] = p.qPar[0]));
    const direct = intensityAt(chain, q, 'xray');
    peaks.forEach((p, i) => {
      const L = TAU * (aR / TAU);
      const x = (p.qPerp[0] * L) / 2;
      const sinc2 = (Math.sin(x) / x) ** 2;
      expect(p.intensity).toBeCloseTo(sinc2, 12);
      expect(Math.abs(direct[i] / n - sinc2)).toBeLessThan(0.01 * sinc2 + 1e-4);
    });
  });

  // Builds a Penrose vertex patch by cut-and-project from Z⁵ in the test itself (penrose.ts conventions,
  // windows of hyperspace.ts), with a small generic shift so no point sits on a window edge.
  function penrosePatch(a: number, radius: number): Structure {
    const wins = penroseWindows(a);
    const exs = [0, 1, 2, 3, 4].map((j) => [Math.cos((2 * Math.PI * j) / 5), Math.sin((2 * Math.PI * j) / 5)]);
    const eps = [0, 1, 2, 3, 4].map((j) => [Math.cos((4 * Math.PI * j) / 5), Math.sin((4 * Math.PI * j) / 5)]);
    const ex = (j: number) => exs[j];
    const ep = (j: number) => eps[j];
    const shift = [1e-4, 2.3e-5];
    const inside = (v: number[], x: number, y: number) => {
      for (let i = 0; i < v.length / 2; i++) {
        const j = (i + 1) % (v.length / 2);
        if ((v[2 * j] - v[2 * i]) * (y - v[2 * i + 1]) - (v[2 * j + 1] - v[2 * i + 1]) * (x - v[2 * i]) < 0) return false;
      }
      return true;
    };
    const pos: number[] = [];
    const R = Math.ceil(radius / a) + 2;
    const nn = [0, 0, 0, 0, 0];
    for (nn[0] = -R; nn[0] <= R; nn[0]++)
      for (nn[1] = -R; nn[1] <= R; nn[1]++)
        for (nn[2] = -R; nn[2] <= R; nn[2]++)
          for (nn[3] = -R; nn[3] <= R; nn[3]++)
            for (const k of [1, 2, 3, 4]) {
              nn[4] = k - nn[0] - nn[1] - nn[2] - nn[3];
              let x = 0, y = 0, u = shift[0], w = shift[1];
              if (Math.abs(nn[4]) > R) continue;
              for (let j = 0; j < 5; j++) {
                x += a * nn[j] * ex(j)[0];
                y += a * nn[j] * ex(j)[1];
                u += a * nn[j] * ep(j)[0];
                w += a * nn[j] * ep(j)[1];
              }
              if (x * x + y * y > radius * radius) continue;
              if (inside(wins[k - 1].vertices, u, w)) pos.push(x, y, 0);
            }
    return { positions: Float64Array.from(pos), species: new Uint16Array(pos.length / 3), dim: 2, provenance: { params: null, engine: 'test' } };
  }

  it('Penrose: ideal peaks are 10-fold symmetric; a cut-and-project patch (built in the test) has 10-fold intensities that match them', () => {
    const a = 1;
    const peaks = penrosePeaks({ family: 'penrose', aR: a, qmax: 9, qperpMax: 6, threshold: 0.02 }).filter((p) => p.qParNorm > 0);
    const key = (x: number, y: number) => `${Math.round(x * 1e6)},${Math.round(y * 1e6)}`;
    const map = new Map(peaks.map((p) => [key(p.qPar[0], p.qPar[1]), p.intensity]));
    const strong = peaks.filter((p) => p.relative > 5);
    expect(strong.length).toBeGreaterThanOrEqual(20);
    for (const p of strong) {
      for (let r = 1; r < 10; r++) {
        const c = Math.cos((r * Math.PI) / 5);
        const s = Math.sin((r * Math.PI) / 5);
        const rot = map.get(key(c * p.qPar[0] - s * p.qPar[1], s * p.qPar[0] + c * p.qPar[1]));
        expect(rot).toBeDefined();
        expect(rot!).toBeCloseTo(p.intensity, 9);
      }
    }
    const patch = penrosePatch(a, 22);
    const n = patch.species.length;
    // Vertex density of the Penrose tiling at edge 1 (Penrose/de Bruijn; penrose.ts PENROSE_DENSITY formula).
    const density = (TAU + 1) / (TAU * Math.sin((2 * Math.PI) / 5) + Math.sin(Math.PI / 5));
    expect(Math.abs(n / (Math.PI * 22 * 22) / density - 1)).toBeLessThan(0.03);
    const top = strong.slice(0, 10);
    const q: number[] = [];
    for (const p of top) q.push(p.qPar[0], p.qPar[1], 0);
    const direct = intensityAt(patch, Float64Array.from(q));
    top.forEach((p, i) => expect(Math.abs(direct[i] / n - p.intensity)).toBeLessThan(0.05 * p.intensity + 0.01));
  });

  it('CSG indexing: map is invertible; |Q∥|², |Q⊥|² from N, M agree with the hyperlattice projection', () => {
    // Worked by hand: one reciprocal basis vector E*_1 has |E*_1| = 2π/|E_1| = 2π/(√2 aR) and equal parallel and
    // perpendicular parts, so |Q∥|² = |Q⊥|² = π²/aR². In the CSG scheme (Cahn, Shechtman & Gratias 1986) it is
    // 1/0 0/1 0/0 with N = 1 + 1 = 2, M = 1, and c²(N + Mτ) = π²(2 + τ)/(aR²(2 + τ)) = π²/aR².
    const e1 = csgFromHyper([1, 0, 0, 0, 0, 0]);
    expect([e1.label, e1.N, e1.M]).toEqual(['1/0 0/1 0/0', 2, 1]);
    const q1 = qSquaredFromNM(e1.N, e1.M, 4.6);
    expect(q1.par).toBeCloseTo(Math.PI ** 2 / 4.6 ** 2, 12);
    expect(q1.perp).toBeCloseTo(Math.PI ** 2 / 4.6 ** 2, 12);
    const peaks = icosahedralPeaks({ family: 'icosahedral', aR: 4.6, qmax: 3.2, threshold: 1e-3 });
    expect(peaks.length).toBeGreaterThan(50);
    for (const p of peaks) {
      const c = csgFromHyper(p.indices);
      expect(hyperFromCsg(c.hh)).toEqual(p.indices.map((v) => v + 0));
      const q2 = qSquaredFromNM(c.N, c.M, 4.6);
      expect(q2.par).toBeCloseTo(p.qParNorm ** 2, 9);
      expect(q2.perp).toBeCloseTo(p.qPerpNorm ** 2, 9);
    }
  });

  it('icosahedral: intensity at Q = 0 is 1 and the peak set is invariant under the 5-fold rotation about u1 ∝ (1, τ, 0)', () => {
    const peaks = icosahedralPeaks({ family: 'icosahedral', aR: 4.6, qmax: 3.0, threshold: 1e-3 });
    expect(peaks[0].qParNorm).toBe(0);
    expect(peaks[0].intensity).toBeCloseTo(1, 12);
    const u = [1, TAU, 0].map((x) => x / Math.hypot(1, TAU));
    const ang = (2 * Math.PI) / 5;
    const rot = (v: number[]) => {
      const c = Math.cos(ang), s = Math.sin(ang);
      const d = u[0] * v[0] + u[1] * v[1] + u[2] * v[2];
      const cr = [u[1] * v[2] - u[2] * v[1], u[2] * v[0] - u[0] * v[2], u[0] * v[1] - u[1] * v[0]];
      return [0, 1, 2].map((i) => v[i] * c + cr[i] * s + u[i] * d * (1 - c));
    };
    const key = (v: number[]) => v.map((x) => Math.round(x * 1e6)).join(',');
    const map = new Map(peaks.map((p) => [key(p.qPar), p.intensity]));
    let n = 0;
    for (const p of peaks.filter((x) => x.relative > 1 && x.qParNorm < 2.8)) {
      const r = map.get(key(rot(p.qPar)));
      expect(r).toBeDefined();
      expect(r!).toBeCloseTo(p.intensity, 9);
      n++;
    }
    expect(n).toBeGreaterThan(20);
  });

  it('F and I hyperlattices: strongest ideal peaks (F has half-integer indices) match direct sums on patches from lib/models/icosahedral/patch.ts within 15 %', () => {
    const aR = 4.6;
    for (const lattice of ['F', 'I'] as const) {
      // Tiny generic offset: whole atoms, the points of the former half-open rule at offset 0 (see zone-axis.test.ts).
      const patch = icosahedralPatch({ aR, radius: lattice === 'F' ? 40 : 28, lattice, offset: [-1e-7, -1e-10, -1e-13] });
      // Points = occupancy sum (boundary nodes of the symmetric cut at offset 0 carry fractions).
      const n = patch.occupancy ? patch.occupancy.reduce((x, y) => x + y, 0) : patch.species.length;
      expect(n).toBeGreaterThan(800);
      const peaks = icosahedralPeaks({ family: 'icosahedral', aR, qmax: 3.0, lattice, threshold: 1e-2 }).filter((p) => p.qParNorm > 0.5);
      if (lattice === 'F') expect(peaks.some((p) => !Number.isInteger(p.indices[0]))).toBe(true);
      if (lattice === 'I') for (const p of peaks) expect(Math.abs(p.indices.reduce((a, b) => a + b) % 2)).toBe(0);
      const top = peaks.slice().sort((a, b) => b.intensity - a.intensity).slice(0, 8);
      expect(top).toHaveLength(8);
      const q: number[] = [];
      for (const p of top) q.push(...p.qPar);
      const direct = intensityAt(patch, Float64Array.from(q));
      top.forEach((p, i) => expect(Math.abs(direct[i] / n - p.intensity) / p.intensity, `${lattice} ${p.indices}`).toBeLessThan(0.15));
    }
  });

  it('Penrose tiling from lib/models/penrose/generate.ts (generic γ, Σγ = 0): its strongest peaks match the ideal intensities within 5 %', () => {
    const t = generate({ family: 'penrose', radius: 25, edge: 1, gamma: [0.11, -0.07, 0.23, -0.19, -0.08] });
    const n = t.species.length;
    const peaks = penrosePeaks({ family: 'penrose', aR: 1, qmax: 9, qperpMax: 6, threshold: 0.02 })
      .filter((p) => p.qParNorm > 0)
      .sort((a, b) => b.intensity - a.intensity)
      .slice(0, 20);
    expect(peaks).toHaveLength(20);
    const q: number[] = [];
    for (const p of peaks) q.push(p.qPar[0], p.qPar[1], 0);
    const direct = intensityAt(t, Float64Array.from(q));
    peaks.forEach((p, i) => expect(Math.abs(direct[i] / n - p.intensity)).toBeLessThan(0.05 * p.intensity + 0.01));
  });

  it('refuses enumerations that are far too large, naming qmax', () => {
    expect(() => icosahedralPeaks({ family: 'icosahedral', aR: 4.6, qmax: 40 })).toThrow(/qmax/);
    expect(() => fibonacciPeaks({ family: 'fibonacci', aR: -1, qmax: 2 })).toThrow(/aR/);
  });
});
