import { describe, expect, it } from 'vitest';
import { expDividedDifference, symmetricBodyTransform, zonotopeBody, polygonTransform, ballTransform } from '../../../lib/diffraction/window-transform';
import { icosahedralBasis } from '../../../lib/models/icosahedral/hyperlattice';

// Brute-force reference: midpoint-rule integral of e^{−ik·y} over the body by a fine grid (numerical quadrature, common practice).
function insideZonotope(vectors: Float64Array, y: number[]): boolean {
  // Support-function test: inside iff for every facet normal n_ij, |n·y| ≤ ½ Σ|n·v_l|.
  const m = vectors.length / 3;
  for (let i = 0; i < m; i++) {
    for (let j = i + 1; j < m; j++) {
      const n = [
        vectors[3 * i + 1] * vectors[3 * j + 2] - vectors[3 * i + 2] * vectors[3 * j + 1],
        vectors[3 * i + 2] * vectors[3 * j] - vectors[3 * i] * vectors[3 * j + 2],
        vectors[3 * i] * vectors[3 * j + 1] - vectors[3 * i + 1] * vectors[3 * j],
      ];
      let h = 0;
      for (let l = 0; l < m; l++) h += Math.abs(n[0] * vectors[3 * l] + n[1] * vectors[3 * l + 1] + n[2] * vectors[3 * l + 2]) / 2;
      if (Math.abs(n[0] * y[0] + n[1] * y[1] + n[2] * y[2]) > h) return false;
    }
  }
  return true;
}

describe('window transforms', () => {
  it('divided differences of exp: series path agrees with the explicit closed form, and confluent limit e[0,0,0,0] = 1/3!', () => {
    const [a] = expDividedDifference([0, 0, 0, 0]);
    expect(a).toBeCloseTo(1 / 6, 12);
    const sep = expDividedDifference([0, 1.1, -2.3, 3.7]);
    const near = expDividedDifference([0, 1.1, -2.3, 3.7 + 1e-9]);
    expect(near[0]).toBeCloseTo(sep[0], 8);
    expect(near[1]).toBeCloseTo(sep[1], 8);
    // Explicit Σ_j e^{ib_j}/Π_{m≠j} i(b_j − b_m) at spread 0.45 (< 0.5, so the library takes the series path).
    const b = [0, 0.15, 0.3, 0.45];
    let er = 0, ei = 0;
    for (let j = 0; j < 4; j++) {
      let p = 1;
      for (let m = 0; m < 4; m++) if (m !== j) p *= b[j] - b[m];
      er += Math.cos(b[j]) / p;
      ei += Math.sin(b[j]) / p;
    }
    const got = expDividedDifference([0, 0.15, 0.3, 0.45 + 1e-3 * 0]);
    // divide by i³ = −i: (er + i ei)/(−i) = −ei + i er
    expect(got[0]).toBeCloseTo(-ei, 9);
    expect(got[1]).toBeCloseTo(er, 9);
    // e[0, x] = (e^{ix} − 1)/(ix)
    const [r, i] = expDividedDifference([0, 0.7]);
    expect(r).toBeCloseTo(Math.sin(0.7) / 0.7, 12);
    expect(i).toBeCloseTo((1 - Math.cos(0.7)) / 0.7, 12);
  });

  it('triacontahedron: volume 4√(5+2√5)·a³ (rhombic triacontahedron, edge a; handbook value) and transform vs grid quadrature', () => {
    const aR = 1;
    const basis = icosahedralBasis(aR);
    const body = zonotopeBody(basis.perp);
    expect(body.volume).toBeCloseTo(4 * Math.sqrt(5 + 2 * Math.sqrt(5)), 9);
    expect(symmetricBodyTransform(body, [0, 0, 0])).toBeCloseTo(1, 12);
    const ks = [
      [0.9, 0.2, -0.4],
      [1.5, 0, 0],
      [0, 0, 2.2],
      [0.3, 1.1, 0.8],
    ];
    const n = 60;
    const R = 1.8; // outer radius of the edge-1 triacontahedron is τ·... < 1.8
    const h = (2 * R) / n;
    const pts: number[][] = [];
    for (let a = 0; a < n; a++)
      for (let b = 0; b < n; b++)
        for (let c = 0; c < n; c++) {
          const y = [-R + (a + 0.5) * h, -R + (b + 0.5) * h, -R + (c + 0.5) * h];
          if (insideZonotope(basis.perp, y)) pts.push(y);
        }
    expect(Math.abs((pts.length * h ** 3) / body.volume - 1)).toBeLessThan(0.01);
    for (const k of ks) {
      let s = 0;
      for (const y of pts) s += Math.cos(k[0] * y[0] + k[1] * y[1] + k[2] * y[2]);
      expect(symmetricBodyTransform(body, k)).toBeCloseTo(s / pts.length, 2);
    }
  });

  it('square polygon transform = product of sincs (separable closed form)', () => {
    const sq = [-1, -1, 1, -1, 1, 1, -1, 1];
    const [re, im] = polygonTransform(sq, [0, 0], [0.8, 1.9]);
    expect(re).toBeCloseTo((Math.sin(0.8) / 0.8) * (Math.sin(1.9) / 1.9), 12);
    expect(im).toBeCloseTo(0, 12);
    const [re2, im2] = polygonTransform([0, 0, 2, 0, 2, 2, 0, 2], [1, 1], [0.8, 1.9]);
    const ph = -(0.8 + 1.9);
    const mag = (Math.sin(0.8) / 0.8) * (Math.sin(1.9) / 1.9);
    expect(re2).toBeCloseTo(mag * Math.cos(ph), 12);
    expect(im2).toBeCloseTo(mag * Math.sin(ph), 12);
  });

  it('ball transform: 3(sin x − x cos x)/x³ → 1 at 0, first zero at x = 4.4934 (tan x = x)', () => {
    expect(ballTransform(0, 1)).toBe(1);
    expect(Math.abs(ballTransform(4.493409, 1))).toBeLessThan(1e-6);
  });
});
