/**
 * View directions: the symmetry axes of the icosahedral setting, lattice directions [uvw] and plane
 * normals (hkl).
 *
 * Icosahedral axes. The six five-fold axes are the parallel-space basis directions e_i∥ of
 * lib/models/icosahedral/hyperlattice.ts (the twelve vertices ±u_i of an icosahedron). The fifteen two-fold axes
 * pass through edge midpoints, u_a + u_b for neighbouring vertices (u_a·u_b = 1/√5), and the ten
 * three-fold axes through face centres, u_a + u_b + u_c for mutually neighbouring vertices. Each axis
 * is kept once (one of ±).
 *
 * [uvw] and (hkl). With a cell (rows a, b, c), [uvw] is the real-space vector u·a + v·b + w·c and the
 * normal of the plane (hkl) is the reciprocal vector h·a* + k·b* + l·c*, a* = (b × c)/V and cyclic
 * (so a_i·a_j* = δ_ij, no 2π). Without a cell both read the three integers as Cartesian x y z.
 */
import { icosahedralDirections } from '../models/icosahedral/hyperlattice';
import { TAU } from '../math/golden';
import type { Cell } from '../math/cell';
import { reciprocal, vecMat } from '../math/mat3';
import { add, dot, norm, normalize, scale, type Vec3 } from '../math/vec3';

export type Fold = 2 | 3 | 5;

export interface IcosahedralAxes {
  five: Vec3[];
  three: Vec3[];
  two: Vec3[];
}

/** Keep one of each ± pair, with a stable sign: first non-zero component positive. */
function canonical(v: Vec3): Vec3 {
  for (const c of v) {
    if (Math.abs(c) > 1e-9) return c > 0 ? v : scale(v, -1);
  }
  return v;
}

function pushUnique(list: Vec3[], v: Vec3): void {
  const u = canonical(normalize(v));
  if (!list.some((w) => Math.abs(Math.abs(dot(w, u)) - 1) < 1e-9)) list.push(u);
}

let cached: IcosahedralAxes | undefined;

/** The 6 five-fold, 10 three-fold and 15 two-fold axes of the icosahedral setting (unit vectors). */
export function icosahedralAxes(): IcosahedralAxes {
  if (cached) return cached;
  const rows = icosahedralDirections(TAU, 'par');
  const five: Vec3[] = [];
  for (let i = 0; i < 6; i++) five.push(normalize([rows[3 * i], rows[3 * i + 1], rows[3 * i + 2]]));
  const vertices: Vec3[] = [...five, ...five.map((v) => scale(v, -1))];
  const neighbour = 1 / Math.sqrt(5);
  const adjacent = (a: Vec3, b: Vec3) => Math.abs(dot(a, b) - neighbour) < 1e-9;
  const two: Vec3[] = [];
  const three: Vec3[] = [];
  for (let a = 0; a < 12; a++) {
    for (let b = a + 1; b < 12; b++) {
      if (!adjacent(vertices[a], vertices[b])) continue;
      pushUnique(two, add(vertices[a], vertices[b]));
      for (let c = b + 1; c < 12; c++) {
        if (adjacent(vertices[a], vertices[c]) && adjacent(vertices[b], vertices[c])) {
          pushUnique(three, add(add(vertices[a], vertices[b]), vertices[c]));
        }
      }
    }
  }
  cached = { five: five.map(canonical), three, two };
  return cached;
}

/** The axes of one fold. */
export function axesOfFold(fold: Fold): Vec3[] {
  const a = icosahedralAxes();
  return fold === 5 ? a.five : fold === 3 ? a.three : a.two;
}

/** Unit Cartesian direction of [uvw] = u·a + v·b + w·c when there is a cell, Cartesian otherwise. */
export function latticeDirection(uvw: Vec3, cell?: Cell): Vec3 {
  if (!cell) return normalize(uvw);
  return normalize(vecMat(uvw, cell));
}

/** Unit normal of the plane (hkl), along h·a* + k·b* + l·c*; Cartesian (hkl) without a cell. */
export function planeNormal(hkl: Vec3, cell?: Cell): Vec3 {
  if (!cell) return normalize(hkl);
  return normalize(vecMat(hkl, reciprocal(cell)));
}

/** Spacing d_hkl = 1/|h a* + k b* + l c*| in Å (needs a cell). */
export function planeSpacing(hkl: Vec3, cell: Cell): number {
  const g = vecMat(hkl, reciprocal(cell));
  return 1 / Math.sqrt(dot(g, g));
}

export interface ViewPose {
  /** Camera position. */
  position: Vec3;
  /** Camera up vector, perpendicular to the view direction. */
  up: Vec3;
}

/**
 * Camera pose that looks down `axis` at `target` from `distance` away (the camera sits at
 * target + distance·axis and looks along −axis). The up vector is the part of `upHint` perpendicular
 * to the axis, so snapping keeps the picture as upright as it can; when the hint is (nearly) parallel
 * to the axis another reference direction is used.
 */
export function viewPose(target: Vec3, axis: Vec3, distance: number, upHint: Vec3 = [0, 1, 0]): ViewPose {
  const d = normalize(axis);
  const candidates: Vec3[] = [upHint, [0, 1, 0], [0, 0, 1], [1, 0, 0]];
  for (const h of candidates) {
    const p: Vec3 = [h[0] - d[0] * dot(h, d), h[1] - d[1] * dot(h, d), h[2] - d[2] * dot(h, d)];
    if (norm(p) > 0.1 * norm(h)) {
      return { position: add(target, scale(d, distance)), up: normalize(p) };
    }
  }
  throw new RangeError('no up direction found');
}

/**
 * A direction as a person chooses it: an icosahedral symmetry axis (fold and which one), a lattice
 * direction [uvw] or a plane normal (hkl).
 */
export type Direction =
  | { kind: 'fold'; fold: Fold; index: number }
  | { kind: 'uvw'; uvw: Vec3 }
  | { kind: 'hkl'; hkl: Vec3 };

/** Unit Cartesian vector of a Direction ([uvw] and (hkl) in the cell's basis when there is a cell). */
export function directionVector(direction: Direction, cell?: Cell): Vec3 {
  switch (direction.kind) {
    case 'fold': {
      const list = axesOfFold(direction.fold);
      return list[((direction.index % list.length) + list.length) % list.length];
    }
    case 'uvw':
      return latticeDirection(direction.uvw, cell);
    case 'hkl':
      return planeNormal(direction.hkl, cell);
  }
}

/** Short label for a Direction, e.g. "5-fold axis 2", "[1 1 0]", "(1 0 0)". */
export function directionLabel(direction: Direction): string {
  switch (direction.kind) {
    case 'fold':
      return `${direction.fold}-fold axis ${direction.index + 1}`;
    case 'uvw':
      return `[${direction.uvw.join(' ')}]`;
    case 'hkl':
      return `(${direction.hkl.join(' ')})`;
  }
}
