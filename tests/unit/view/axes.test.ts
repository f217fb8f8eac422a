import { describe, expect, it } from 'vitest';
import * as THREE from 'three';
import {
  axesOfFold,
  cellDirections,
  directionLabel,
  directionVector,
  formatIndices,
  icosahedralAxes,
  icosahedralAxisLabel,
  latticeDirection,
  planeNormal,
  planeSpacing,
  tauLabel,
  viewPose,
} from '@/lib/view/axes';
import { TAU } from '@/lib/math/golden';
import { angleDeg, cross, dot, norm, normalize, type Vec3 } from '@/lib/math/vec3';

/** sin of the angle between u and v (0 when parallel), exact enough near 0 unlike acos. */
const sinBetween = (u: Vec3, v: Vec3) => norm(cross(u, v)) / (norm(u) * norm(v));
import { icosahedralBasis } from '@/lib/models/icosahedral/hyperlattice';
import { cellFromParameters, type Cell } from '@/lib/math/cell';

/** Smallest angle between two axes (either sense), degrees. */
const axisAngle = (u: Vec3, v: Vec3) => Math.min(angleDeg(u, v), 180 - angleDeg(u, v));
const nearest = (u: Vec3, list: Vec3[]) => Math.min(...list.map((v) => axisAngle(u, v)));

describe('icosahedral axes', () => {
  const { five, three, two } = icosahedralAxes();

  it('has 6 five-fold, 10 three-fold and 15 two-fold axes, all unit and distinct', () => {
    expect([five.length, three.length, two.length]).toEqual([6, 10, 15]);
    for (const list of [five, three, two]) {
      for (const v of list) expect(Math.hypot(...v)).toBeCloseTo(1, 12);
      for (let i = 0; i < list.length; i++) for (let j = i + 1; j < list.length; j++) expect(axisAngle(list[i], list[j])).toBeGreaterThan(1);
    }
  });

  it('takes the five-fold axes from the e_i∥ of lib/models/icosahedral/hyperlattice.ts', () => {
    const par = icosahedralBasis(4.6).par;
    for (let i = 0; i < 6; i++) {
      const e: Vec3 = [par[3 * i], par[3 * i + 1], par[3 * i + 2]];
      expect(axisAngle(e, five[i])).toBeLessThan(1e-6);
    }
  });

  // Standard icosahedral angles (textbook values, e.g. tables of the icosahedral group):
  // 5-fold to nearest 3-fold 37.377°, to nearest 2-fold 31.717°; 3-fold to nearest 2-fold 20.905°;
  // two 5-fold axes 63.435° (arccos 1/√5).
  it('reproduces the known angles between the axes', () => {
    for (const f of five) {
      expect(nearest(f, three)).toBeCloseTo(37.377, 3);
      expect(nearest(f, two)).toBeCloseTo(31.717, 3);
      for (const g of five) if (g !== f) expect(axisAngle(f, g)).toBeCloseTo(63.435, 3);
    }
    for (const t of three) expect(nearest(t, two)).toBeCloseTo(20.905, 3);
  });

  it('puts the Cartesian axes on two-fold axes and (1,1,1) on a three-fold axis (the (0, ±1, ±τ) setting)', () => {
    for (const e of [[1, 0, 0], [0, 1, 0], [0, 0, 1]] as Vec3[]) expect(nearest(e, two)).toBeLessThan(1e-9);
    expect(nearest([1, 1, 1], three)).toBeLessThan(1e-9);
  });

  it('each axis is a true n-fold rotation axis of the icosahedron (checked with three.js rotations)', () => {
    const rows = icosahedralBasis(1).par;
    const vertices: THREE.Vector3[] = [];
    for (let i = 0; i < 6; i++) {
      const v = new THREE.Vector3(rows[3 * i], rows[3 * i + 1], rows[3 * i + 2]);
      vertices.push(v, v.clone().negate());
    }
    const check = (axis: Vec3, fold: number) => {
      const m = new THREE.Matrix4().makeRotationAxis(new THREE.Vector3(...axis), (2 * Math.PI) / fold);
      for (const v of vertices) {
        const w = v.clone().applyMatrix4(m);
        expect(Math.min(...vertices.map((u) => u.distanceTo(w)))).toBeLessThan(1e-9);
      }
      // and not a rotation of a higher order that the icosahedron lacks: a quarter turn must fail
      const q = new THREE.Matrix4().makeRotationAxis(new THREE.Vector3(...axis), Math.PI / 2);
      const moved = vertices.map((v) => v.clone().applyMatrix4(q));
      expect(moved.some((w) => Math.min(...vertices.map((u) => u.distanceTo(w))) > 1e-3)).toBe(true);
    };
    for (const a of five) check(a, 5);
    for (const a of three) check(a, 3);
    for (const a of two) check(a, 2);
  });

  it('directionVector reads fold axes by index, wrapping', () => {
    expect(directionVector({ kind: 'fold', fold: 5, index: 2 })).toEqual(axesOfFold(5)[2]);
    expect(directionVector({ kind: 'fold', fold: 2, index: 15 })).toEqual(axesOfFold(2)[0]);
  });
});

/** Read a label such as "[0 1/τ −τ²]" back into numbers. */
function parseLabel(label: string): Vec3 {
  const inner = label.replace(/^\[|\]$/g, '').split(' ');
  return inner.map((t) => {
    const sign = t.startsWith('−') ? -1 : 1;
    const body = t.replace(/^−/, '');
    const m = /^(1\/)?τ([²³]?)$/.exec(body);
    if (!m) return sign * Number(body);
    const k = m[2] === '²' ? 2 : m[2] === '³' ? 3 : 1;
    return sign * TAU ** (m[1] ? -k : k);
  }) as Vec3;
}

describe('axis labels in the standard cubic setting', () => {
  // From memory (the standard setting, e.g. Coxeter, Regular Polytopes, and its dual): with the icosahedron's
  // vertices at the cyclic permutations of (0, ±1, ±τ), the five-fold axes are those vertices; the
  // three-fold axes are the face centres, i.e. the dual dodecahedron's vertices (±1, ±1, ±1) and the cyclic
  // permutations of (0, ±τ, ±1/τ); the two-fold axes are the edge midpoints, the cube axes and the cyclic
  // permutations of (±1, ±1/τ, ±τ). One of each ± pair, first non-zero index positive.
  const expected: Record<2 | 3 | 5, string[]> = {
    5: ['[0 1 τ]', '[0 1 −τ]', '[τ 0 1]', '[τ 0 −1]', '[1 τ 0]', '[1 −τ 0]'],
    3: ['[1 1 1]', '[1 1 −1]', '[1 −1 1]', '[1 −1 −1]', '[0 τ 1/τ]', '[0 τ −1/τ]', '[1/τ 0 τ]', '[1/τ 0 −τ]', '[τ 1/τ 0]', '[τ −1/τ 0]'],
    2: [
      '[1 0 0]', '[0 1 0]', '[0 0 1]',
      '[1 1/τ τ]', '[1 1/τ −τ]', '[1 −1/τ τ]', '[1 −1/τ −τ]',
      '[τ 1 1/τ]', '[τ 1 −1/τ]', '[τ −1 1/τ]', '[τ −1 −1/τ]',
      '[1/τ τ 1]', '[1/τ τ −1]', '[1/τ −τ 1]', '[1/τ −τ −1]',
    ],
  };

  for (const fold of [5, 3, 2] as const) {
    it(`labels the ${fold}-fold axes by their indices, and each label points along its axis`, () => {
      const axes = axesOfFold(fold);
      const labels = axes.map((_, i) => icosahedralAxisLabel(fold, i));
      expect([...labels].sort()).toEqual([...expected[fold]].sort());
      labels.forEach((l, i) => expect(sinBetween(parseLabel(l), axes[i])).toBeLessThan(1e-12));
    });
  }

  it('names a snapped direction by family and indices', () => {
    const i = axesOfFold(5).findIndex((_, k) => icosahedralAxisLabel(5, k) === '[0 1 τ]');
    expect(directionLabel({ kind: 'fold', fold: 5, index: i })).toBe('5-fold [0 1 τ]');
    expect(directionLabel({ kind: 'uvw', uvw: [1, -1, 0] })).toBe('[1 −1 0]');
    expect(directionLabel({ kind: 'hkl', hkl: [0, 0, 2] })).toBe('(0 0 2)');
  });

  it('finds no τ label for a direction that has none', () => {
    expect(tauLabel(normalize([1, 2, 3]))).toBeNull();
    expect(tauLabel(normalize([2, 0, 1]))).toBeNull();
    expect(tauLabel(normalize([0, -2, -2 * TAU]))).toBe('[0 −1 −τ]');
  });

  it('lists the 3 edges, 6 face diagonals and 4 body diagonals of a cell, one per ± pair', () => {
    // A cube has 3 four-fold, 6 two-fold and 4 three-fold axes (from memory); [111] is arccos(1/√3) =
    // 54.7356° from [001] and [110] is 45° from [100] (textbook angles in a cubic cell).
    const dirs = cellDirections();
    expect(dirs.filter((d) => d.kind === 'edge').length).toBe(3);
    expect(dirs.filter((d) => d.kind === 'face').length).toBe(6);
    expect(dirs.filter((d) => d.kind === 'body').length).toBe(4);
    for (let i = 0; i < dirs.length; i++) for (let j = i + 1; j < dirs.length; j++) expect(axisAngle(dirs[i].uvw, dirs[j].uvw)).toBeGreaterThan(1);
    const cube: Cell = [[5, 0, 0], [0, 5, 0], [0, 0, 5]];
    expect(angleDeg(latticeDirection([1, 1, 1], cube), [0, 0, 1])).toBeCloseTo(54.7356, 4);
    expect(angleDeg(latticeDirection([1, 1, 0], cube), [1, 0, 0])).toBeCloseTo(45, 9);
    expect(dirs.map((d) => formatIndices(d.uvw))).toContain('[−1 0 1]');
  });
});

describe('[uvw] and (hkl)', () => {
  const hex: Cell = cellFromParameters({ a: 3, b: 3, c: 5, alpha: 90, beta: 90, gamma: 120 });
  const tric: Cell = cellFromParameters({ a: 4.1, b: 5.3, c: 6.2, alpha: 81, beta: 97, gamma: 104 });

  it('(hkl) normal is perpendicular to the plane (two in-plane lattice vectors), [uvw] follows the cell', () => {
    const hkl: Vec3 = [1, 2, 3];
    const n = planeNormal(hkl, tric);
    const [a, b, c] = tric;
    // The plane (hkl) passes through a/h, b/k, c/l; a/h − b/k and b/k − c/l lie in it.
    const p = (v: Vec3, s: number): Vec3 => [v[0] / s, v[1] / s, v[2] / s];
    const inPlane1: Vec3 = [p(a, 1)[0] - p(b, 2)[0], p(a, 1)[1] - p(b, 2)[1], p(a, 1)[2] - p(b, 2)[2]];
    const inPlane2: Vec3 = [p(b, 2)[0] - p(c, 3)[0], p(b, 2)[1] - p(c, 3)[1], p(b, 2)[2] - p(c, 3)[2]];
    expect(dot(n, inPlane1)).toBeCloseTo(0, 12);
    expect(dot(n, inPlane2)).toBeCloseTo(0, 12);
    expect(sinBetween(latticeDirection([1, 1, 0], tric), [a[0] + b[0], a[1] + b[1], a[2] + b[2]])).toBeLessThan(1e-12);
  });

  it('hexagonal cell: (001) normal ∥ c, [001] ∥ c, (100) not ∥ a, d100 = a·√3/2', () => {
    expect(sinBetween(planeNormal([0, 0, 1], hex), [0, 0, 1])).toBeLessThan(1e-12);
    expect(sinBetween(latticeDirection([0, 0, 1], hex), [0, 0, 1])).toBeLessThan(1e-12);
    expect(angleDeg(planeNormal([1, 0, 0], hex), hex[0])).toBeCloseTo(30, 9);
    expect(planeSpacing([1, 0, 0], hex)).toBeCloseTo((3 * Math.sqrt(3)) / 2, 12);
  });

  it('without a cell both read the integers as Cartesian', () => {
    expect(latticeDirection([1, 1, 0])[0]).toBeCloseTo(Math.SQRT1_2, 12);
    expect(planeNormal([0, 0, 2])).toEqual([0, 0, 1]);
    expect(() => latticeDirection([0, 0, 0])).toThrow(/zero vector/);
  });
});

describe('viewPose', () => {
  it('sits on the axis at the distance, with up perpendicular and on the hint side', () => {
    const axis = axesOfFold(5)[0];
    const pose = viewPose([1, 2, 3], axis, 10, [0, 1, 0]);
    const back: Vec3 = [(pose.position[0] - 1) / 10, (pose.position[1] - 2) / 10, (pose.position[2] - 3) / 10];
    expect(sinBetween(back, axis)).toBeLessThan(1e-12);
    expect(dot(pose.up, axis)).toBeCloseTo(0, 12);
    expect(dot(pose.up, [0, 1, 0])).toBeGreaterThan(0);
  });

  it('picks another up when the hint lies along the axis', () => {
    const pose = viewPose([0, 0, 0], [0, 1, 0], 5, [0, 1, 0]);
    expect(dot(pose.up, [0, 1, 0])).toBeCloseTo(0, 12);
    expect(Math.hypot(...pose.up)).toBeCloseTo(1, 12);
  });
});
