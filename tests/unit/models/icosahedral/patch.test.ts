import { describe, expect, it } from 'vitest';
import { icosahedralPatch } from '../../../../lib/models/icosahedral/patch';
import { icosahedralBasis, toPerp } from '../../../../lib/models/icosahedral/hyperlattice';
import { TAU } from '../../../../lib/math/golden';
import { zonotopeWindow, windowContains } from '../../../../lib/models/icosahedral/window';
import { IntVectorSet } from '../../../../lib/math/int-vector-set';

const OFF: [number, number, number] = [0.0123, -0.0271, 0.0316]; // generic phason offset (no boundary ties)

/** Spatial hash of positions quantised to 1e-6 Å, for exact-ish lookups. */
function positionMap(p: Float64Array): Map<string, number> {
  const m = new Map<string, number>();
  for (let i = 0; i < p.length / 3; i++) m.set(`${Math.round(p[3 * i] * 1e5)},${Math.round(p[3 * i + 1] * 1e5)},${Math.round(p[3 * i + 2] * 1e5)}`, i);
  return m;
}

describe('icosahedral patch (3D Penrose tiling from Z⁶)', () => {
  it('vertex density = vol(window)/vol(6D cell) (model-set density, Baake & Grimm, Aperiodic Order 1, 2013) within 1 % for R = 16 aR', () => {
    const aR = 1;
    const s = icosahedralPatch({ aR, radius: 16, offset: OFF });
    const rho = s.species.length / ((4 / 3) * Math.PI * 16 ** 3);
    // Window: rhombic triacontahedron of edge |e⊥| = aR, volume 4√(5+2√5)·aR³ (handbook value, as in
    // window.test.ts); the 6D cell of Z⁶ with |E_i|² = 2aR² has volume (√2 aR)⁶ = 8aR⁶.
    const expected = (4 * Math.sqrt(5 + 2 * Math.sqrt(5)) * aR ** 3) / (8 * aR ** 6);
    expect(Math.abs(rho / expected - 1)).toBeLessThan(0.01);
    // F has half, I twice the nodes per 6D volume (hyperlattice.ts, item 3)
    const f = icosahedralPatch({ aR, radius: 12, offset: OFF, lattice: 'F' }).species.length;
    const i = icosahedralPatch({ aR, radius: 12, offset: OFF, lattice: 'I' }).species.length;
    const v = (4 / 3) * Math.PI * 12 ** 3;
    expect(Math.abs(f / v / (expected / 2) - 1)).toBeLessThan(0.03);
    expect(Math.abs(i / v / (expected * 2) - 1)).toBeLessThan(0.03);
  });

  it('every vertex has ≥ 4 tiling edges of length exactly aR, and nearest-neighbour distances are only aR or the oblate short body diagonal √(3 − 6/√5)·aR (rhombohedron geometry)', () => {
    const aR = 4.6;
    const s = icosahedralPatch({ aR, radius: 7 * aR, offset: OFF });
    const P = s.positions;
    const N = s.species.length;
    const short = Math.sqrt(3 - 6 / Math.sqrt(5)) * aR;
    let inner = 0;
    for (let i = 0; i < N; i++) {
      if (Math.hypot(P[3 * i], P[3 * i + 1], P[3 * i + 2]) > 4 * aR) continue;
      inner++;
      let dmin = Infinity;
      let edges = 0;
      for (let j = 0; j < N; j++) {
        if (j === i) continue;
        const d = Math.hypot(P[3 * i] - P[3 * j], P[3 * i + 1] - P[3 * j + 1], P[3 * i + 2] - P[3 * j + 2]);
        dmin = Math.min(dmin, d);
        if (Math.abs(d - aR) < 1e-9) edges++;
      }
      expect(edges).toBeGreaterThanOrEqual(4);
      expect(Math.min(Math.abs(dmin - aR), Math.abs(dmin - short))).toBeLessThan(1e-9);
    }
    expect(inner).toBeGreaterThan(300);
  });

  it('prolate/oblate rhombohedra counts → τ and the tiles fill the ball (3D Penrose tiling, Levine & Steinhardt 1984 / Socolar & Steinhardt 1986 — ratio from memory)', () => {
    // A 3-face n + Σ_{i∈I}[0,1]e_i is a tile iff the cut meets its dual Voronoi face:
    // π⊥(n + ½Σ_{i∈I} e_i) − offset ∈ Σ_{j∉I}[−½,½] e_j⊥ (dual-cell construction, Oguey, Duneau & Katz 1988, from memory).
    const aR = 1;
    const R = 14;
    const b = icosahedralBasis(aR);
    const s = icosahedralPatch({ aR, radius: R + 3, offset: OFF });
    const n6 = new IntVectorSet(6, s.species.length);
    const X = new Float64Array(6);
    // Recover integer nodes from positions: toHyper needs perp too, which the Structure stores.
    for (let i = 0; i < s.species.length; i++) {
      const par = s.positions.subarray(3 * i, 3 * i + 3);
      const perp = s.perp!.subarray(3 * i, 3 * i + 3);
      for (let k = 0; k < 6; k++)
        X[k] = Math.round((par[0] * b.par[3 * k] + par[1] * b.par[3 * k + 1] + par[2] * b.par[3 * k + 2] + perp[0] * b.perp[3 * k] + perp[1] * b.perp[3 * k + 1] + perp[2] * b.perp[3 * k + 2]) / 2);
      n6.add(Int32Array.from(X));
    }
    let prolate = 0;
    let oblate = 0;
    let volume = 0;
    const det = (i: number, j: number, k: number) => {
      const p = b.par;
      return Math.abs(
        p[3 * i] * (p[3 * j + 1] * p[3 * k + 2] - p[3 * j + 2] * p[3 * k + 1]) -
          p[3 * i + 1] * (p[3 * j] * p[3 * k + 2] - p[3 * j + 2] * p[3 * k]) +
          p[3 * i + 2] * (p[3 * j] * p[3 * k + 1] - p[3 * j + 1] * p[3 * k]),
      );
    };
    const vP = Math.max(det(0, 1, 2), det(0, 1, 3));
    const triples: number[][] = [];
    for (let i = 0; i < 6; i++) for (let j = i + 1; j < 6; j++) for (let k = j + 1; k < 6; k++) triples.push([i, j, k]);
    const duals = triples.map((I) => {
      const rest = [0, 1, 2, 3, 4, 5].filter((x) => !I.includes(x));
      const v: number[] = [];
      for (const r of rest) v.push(b.perp[3 * r], b.perp[3 * r + 1], b.perp[3 * r + 2]);
      return zonotopeWindow(v, { centre: OFF });
    });
    const c = new Float64Array(6);
    const q = new Float64Array(3);
    for (let e = 0; e < n6.size; e++) {
      triples.forEach((I, t) => {
        for (let k = 0; k < 6; k++) c[k] = n6.coords[6 * e + k] + (I.includes(k) ? 0.5 : 0);
        // tile centre in parallel space must be inside the counting ball
        let x = 0, y = 0, z = 0;
        for (let k = 0; k < 6; k++) {
          x += c[k] * b.par[3 * k];
          y += c[k] * b.par[3 * k + 1];
          z += c[k] * b.par[3 * k + 2];
        }
        if (x * x + y * y + z * z > R * R) return;
        toPerp(c, b, q);
        if (!windowContains(duals[t], q[0], q[1], q[2])) return;
        const v = det(I[0], I[1], I[2]);
        volume += v;
        if (Math.abs(v - vP) < 1e-9) prolate++;
        else oblate++;
      });
    }
    expect(Math.abs(prolate / oblate / TAU - 1)).toBeLessThan(0.03);
    expect(Math.abs(volume / ((4 / 3) * Math.PI * R ** 3) - 1)).toBeLessThan(0.03);
  });

  it('zero offset, centred on a vertex: five-fold rotation about e1∥ maps the patch onto itself except points on the window boundary (half-open rule)', () => {
    const aR = 1;
    const b = icosahedralBasis(aR);
    const s = icosahedralPatch({ aR, radius: 6 });
    const u = [1 / Math.sqrt(2 + TAU), TAU / Math.sqrt(2 + TAU), 0];
    const ang = (2 * Math.PI) / 5;
    const [cs, sn] = [Math.cos(ang), Math.sin(ang)];
    // Rodrigues rotation matrix (standard formula)
    const K = [0, -u[2], u[1], u[2], 0, -u[0], -u[1], u[0], 0];
    const R = new Array(9).fill(0).map((_, k) => {
      const i = Math.floor(k / 3), j = k % 3;
      let kk = 0;
      for (let l = 0; l < 3; l++) kk += K[3 * i + l] * K[3 * l + j];
      return (i === j ? 1 : 0) + sn * K[k] + (1 - cs) * kk;
    });
    const map = positionMap(s.positions);
    const W = zonotopeWindow(b.perp);
    let mapped = 0;
    for (let i = 0; i < s.species.length; i++) {
      const p = s.positions.subarray(3 * i, 3 * i + 3);
      const r = [0, 1, 2].map((a) => R[3 * a] * p[0] + R[3 * a + 1] * p[1] + R[3 * a + 2] * p[2]);
      if (map.has(`${Math.round(r[0] * 1e5)},${Math.round(r[1] * 1e5)},${Math.round(r[2] * 1e5)}`)) {
        mapped++;
        continue;
      }
      // Not mapped: its perpendicular image must sit on a face plane of the window.
      const q = s.perp!.subarray(3 * i, 3 * i + 3);
      let onFace = false;
      for (let f = 0; f < W.support.length; f++) {
        const d = W.normals[3 * f] * q[0] + W.normals[3 * f + 1] * q[1] + W.normals[3 * f + 2] * q[2];
        if (Math.abs(Math.abs(d) - W.support[f]) < 1e-9) onFace = true;
      }
      expect(onFace).toBe(true);
    }
    expect(mapped / s.species.length).toBeGreaterThan(0.9);
    expect(s.positions.slice(0, 3)).toEqual(new Float64Array(3)); // the centre vertex (n = 0) comes first
  });

  it('refuses oversize patches before allocating, naming maxPoints and the estimate', () => {
    // Worked by hand: density 4√(5+2√5)/8 = 1.538842 per aR³ times the ball 4π/3·200³ = 3.3510322e7 → 51.57 million.
    expect(() => icosahedralPatch({ aR: 1, radius: 200, maxPoints: 1000 })).toThrow(/maxPoints: .*about 51,5\d\d,\d\d\d points/);
    expect(() => icosahedralPatch({ aR: -1, radius: 2 })).toThrow(/aR/);
    expect(() => icosahedralPatch({ aR: 1, radius: 0 })).toThrow(/radius/);
  });
});
