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
 *
 * Labels. An icosahedral axis is named by its direction in the standard cubic setting, where the
 * icosahedron's vertices are the cyclic permutations of (0, ±1, ±τ): every component of every axis is
 * then 0 or ±τ^k, so the label reads like [0 1 τ], [0 τ 1/τ] or [1 1/τ τ]. A lattice direction keeps its
 * integers, [1 −1 0]. Negative indices get a minus sign (U+2212) rather than a bar, which survives copying.
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
 * An up direction for looking down `axis`: of the candidates (the cell rows c, b, a, or z, y, x without a
 * cell), the one most nearly perpendicular to the axis, the earlier one on a tie. Snapping then gives the
 * same picture every time, square to the cell: down [1 0 0] the cube stays a square with c up, and down a
 * five-fold axis such as [0 1 τ] the perpendicular two-fold axis [1 0 0] points up.
 */
export function uprightFor(axis: Vec3, candidates: readonly Vec3[]): Vec3 {
  const d = normalize(axis);
  let best = candidates[0];
  let bestDot = Infinity;
  for (const c of candidates) {
    const x = Math.abs(dot(normalize(c), d));
    if (x < bestDot - 1e-9) {
      bestDot = x;
      best = c;
    }
  }
  return normalize(best);
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

/** Short label for a Direction, e.g. "5-fold [0 1 τ]", "[1 1 0]", "(1 0 0)". */
export function directionLabel(direction: Direction): string {
  switch (direction.kind) {
    case 'fold':
      return `${direction.fold}-fold ${icosahedralAxisLabel(direction.fold, direction.index)}`;
    case 'uvw':
      return formatIndices(direction.uvw, '[', ']');
    case 'hkl':
      return formatIndices(direction.hkl, '(', ')');
  }
}

/** Integers in brackets with a true minus sign: [1 −1 0]. */
export function formatIndices(v: ArrayLike<number>, open = '[', close = ']'): string {
  return `${open}${Array.from(v, (x) => (x < 0 ? `−${-x}` : `${x}`)).join(' ')}${close}`;
}

/**
 * One component of an axis in the cubic setting: 0 (sign 0) or sign·τ^power. Powers of τ are the only
 * numbers that occur: (0, 1, τ) for five-fold, (1, 1, 1) and (0, τ, 1/τ) for three-fold, (1, 0, 0) and
 * (1, 1/τ, τ) for two-fold axes, up to sign and order.
 */
export interface TauIndex {
  sign: -1 | 0 | 1;
  power: number;
}

const TAU_TOL = 1e-9;

/** Write x as ±τ^k (|k| ≤ 3) or 0, or return null. */
function asTauPower(x: number): TauIndex | null {
  if (Math.abs(x) < TAU_TOL) return { sign: 0, power: 0 };
  const k = Math.round(Math.log(Math.abs(x)) / Math.log(TAU));
  if (Math.abs(k) > 3 || Math.abs(Math.abs(x) - TAU ** k) > TAU_TOL * Math.max(1, Math.abs(x))) return null;
  return { sign: x < 0 ? -1 : 1, power: k };
}

/**
 * The components of a direction as 0 or ±τ^k, scaled so that the powers are as small as they can be
 * (the largest |k| first, then no needless negative powers): (0, 1/√(2+τ), τ/√(2+τ)) gives 0, 1, τ.
 * Null when the direction is not of that kind (a general [uvw] in an oblique cell).
 */
export function tauIndices(v: Vec3): [TauIndex, TauIndex, TauIndex] | null {
  let best: [TauIndex, TauIndex, TauIndex] | null = null;
  let bestCost = Infinity;
  for (const c of v) {
    if (Math.abs(c) < TAU_TOL) continue;
    // Any admissible scaling makes this component a power of τ; try the few that keep powers small.
    for (let k = -3; k <= 3; k++) {
      const s = TAU ** k / Math.abs(c);
      const idx = v.map((x) => asTauPower(x * s));
      if (idx.some((t) => t === null)) continue;
      const t = idx as [TauIndex, TauIndex, TauIndex];
      const powers = t.filter((x) => x.sign !== 0).map((x) => x.power);
      const cost = 100 * Math.max(...powers.map(Math.abs)) - Math.min(...powers);
      if (cost < bestCost) {
        bestCost = cost;
        best = t;
      }
    }
  }
  return best;
}

/** τ^k as text: 1, τ, τ², 1/τ, 1/τ². */
function tauPowerText(k: number): string {
  const sup = ['', '', '²', '³'];
  if (k === 0) return '1';
  return k > 0 ? `τ${sup[k]}` : `1/τ${sup[-k]}`;
}

/** [0 1 τ]-style label of a direction, or null when its components are not 0 or ±τ^k. */
export function tauLabel(v: Vec3): string | null {
  const t = tauIndices(v);
  if (!t) return null;
  return `[${t.map((x) => (x.sign === 0 ? '0' : `${x.sign < 0 ? '−' : ''}${tauPowerText(x.power)}`)).join(' ')}]`;
}

/** The label of an icosahedral axis of one fold, by its index in axesOfFold(fold). */
export function icosahedralAxisLabel(fold: Fold, index: number): string {
  const list = axesOfFold(fold);
  const v = list[((index % list.length) + list.length) % list.length];
  return tauLabel(v) ?? `axis ${index + 1}`;
}

export interface CellDirection {
  uvw: Vec3;
  /** Cell edge, face diagonal or body diagonal. */
  kind: 'edge' | 'face' | 'body';
}

/**
 * The thirteen short lattice rows of a cell, one of each ± pair: the three edges [100], the six face
 * diagonals [110] and the four body diagonals [111]. In a cubic lattice these are the 4-, 2- and 3-fold
 * axes of its point symmetry m3̄m; in any cell they are the rows a person reaches for first.
 */
export function cellDirections(): CellDirection[] {
  const out: CellDirection[] = [];
  for (const uvw of [[1, 0, 0], [0, 1, 0], [0, 0, 1]] as Vec3[]) out.push({ uvw, kind: 'edge' });
  for (const uvw of [[1, 1, 0], [1, -1, 0], [0, 1, 1], [0, 1, -1], [1, 0, 1], [-1, 0, 1]] as Vec3[]) out.push({ uvw, kind: 'face' });
  for (const uvw of [[1, 1, 1], [-1, 1, 1], [1, -1, 1], [1, 1, -1]] as Vec3[]) out.push({ uvw, kind: 'body' });
  return out;
}
