import { describe, expect, it } from 'vitest';
import { icosahedralBasis } from '../../../../lib/models/icosahedral/hyperlattice';
import { TAU } from '../../../../lib/math/golden';
import { zonotopeWindow, sphereWindow, shellWindow, windowContains, windowVolume, windowInradius, windowOuterRadius, scaleWindow, boundaryWeight, windowContainsClosed } from '../../../../lib/models/icosahedral/window';
import { directionOrbit, icosahedralGroup, pyritohedralGroup } from '../../../../lib/models/icosahedral/cut';

describe('occupation domains', () => {
  const b = icosahedralBasis(1);
  const W = zonotopeWindow(b.perp);

  it('projected 6-cube = rhombic triacontahedron: 30 faces, volume 4√(5+2√5)·a³ ≈ 12.3107 a³ (handbook value, e.g. Wolfram MathWorld "Rhombic Triacontahedron")', () => {
    expect(W.support.length).toBe(15); // 15 normals × 2 sides = 30 faces
    expect(windowVolume(W)).toBeCloseTo(4 * Math.sqrt(5 + 2 * Math.sqrt(5)), 10);
    expect(windowVolume(scaleWindow(W, 2))).toBeCloseTo(8 * windowVolume(W), 9);
  });

  it('triacontahedron with edge a has inradius τ²a/√(1+τ²) ≈ 1.3764a (handbook value, from memory)', () => {
    expect(windowInradius(W)).toBeCloseTo((TAU * TAU) / Math.sqrt(1 + TAU * TAU), 10);
    // Circumradius (the 12 five-fold vertices) τ·a ≈ 1.618 a (handbook, from memory)
    expect(windowOuterRadius(W)).toBeCloseTo(TAU, 10);
  });

  it('Monte Carlo volume agrees with the formula (independent check of the face planes; deterministic LCG)', () => {
    let seed = 12345;
    const rnd = () => ((seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 2 ** 32) * 2 * TAU - TAU;
    let hit = 0;
    const n = 200_000;
    for (let i = 0; i < n; i++) if (windowContains(W, rnd(), rnd(), rnd())) hit++;
    expect((hit / n) * (2 * TAU) ** 3).toBeCloseTo(windowVolume(W), 0);
  });

  it('half-open rule: of two boundary points related by a lattice vector across opposite faces, exactly one is inside', () => {
    // Face pair with normal ∝ e1⊥ × e2⊥; the two face centres differ by the perp image of a lattice vector.
    for (let f = 0; f < W.support.length; f++) {
      const n = [W.normals[3 * f], W.normals[3 * f + 1], W.normals[3 * f + 2]];
      const h = W.support[f];
      const plus = windowContains(W, n[0] * h, n[1] * h, n[2] * h);
      const minus = windowContains(W, -n[0] * h, -n[1] * h, -n[2] * h);
      expect(plus).toBe(true);
      expect(minus).toBe(false);
    }
  });

  it('spheres and shells: closed outside, open inside; volumes 4π/3 (r2³ − r1³)', () => {
    const s = sphereWindow(2);
    expect(windowContains(s, 2, 0, 0)).toBe(true);
    expect(windowContains(s, 2.0001, 0, 0)).toBe(false);
    const sh = shellWindow(1, 2);
    expect(windowContains(sh, 1, 0, 0)).toBe(false);
    expect(windowContains(sh, 1.5, 0, 0)).toBe(true);
    expect(windowVolume(sh)).toBeCloseTo((4 / 3) * Math.PI * 7, 12);
    expect(() => shellWindow(2, 1)).toThrow(/r2/);
    expect(() => sphereWindow(0)).toThrow(/radius/);
  });
});

describe('symmetric boundary weights (boundaryWeight)', () => {
  // A cube [−1, 1]³ as the zonotope of the three axes scaled by 2: the share of directions pointing into
  // the cube from a face centre, an edge midpoint and a corner is 1/2, 1/4, 1/8 (elementary solid geometry),
  // and the m-3 orbit of a generic direction has equal numbers in every octant (m-3 holds every sign change).
  it('cube: inside 1, face ½, edge ¼, corner ⅛, outside 0 with the m-3 orbit of a generic direction', () => {
    const cube = zonotopeWindow([1, 0, 0, 0, 1, 0, 0, 0, 1], { scale: 2 });
    const dirs = directionOrbit(pyritohedralGroup());
    expect(dirs.length / 3).toBe(24);
    expect(boundaryWeight(cube, 0.2, -0.3, 0.5, dirs)).toBe(1);
    expect(boundaryWeight(cube, 1, 0.3, -0.2, dirs)).toBe(1 / 2);
    expect(boundaryWeight(cube, -1, 1, 0.4, dirs)).toBe(1 / 4);
    expect(boundaryWeight(cube, 1, -1, 1, dirs)).toBe(1 / 8);
    expect(boundaryWeight(cube, 1.001, 0, 0, dirs)).toBe(0);
    expect(windowContainsClosed(cube, 1, -1, 1)).toBe(true);
  });

  it('the icosahedral group of the perpendicular frame has order 120 (m-3-5, textbook) and permutes the six ±e_i⊥', () => {
    const b = icosahedralBasis(1);
    const g = icosahedralGroup([b.perp[0], b.perp[1], b.perp[2]]);
    expect(g.length).toBe(120);
    for (const m of g) {
      for (let i = 0; i < 6; i++) {
        const v = [0, 1, 2].map((r) => m[3 * r] * b.perp[3 * i] + m[3 * r + 1] * b.perp[3 * i + 1] + m[3 * r + 2] * b.perp[3 * i + 2]);
        const hit = [0, 1, 2, 3, 4, 5].some((j) => [1, -1].some((s) => [0, 1, 2].every((c) => Math.abs(v[c] - s * b.perp[3 * j + c]) < 1e-9)));
        expect(hit).toBe(true);
      }
    }
  });
});
