/**
 * A lattice cell given as rows a, b, c (Å): its lengths and angles, volume and the spacings between its
 * faces. Fractional ↔ Cartesian conversion is in frac.ts.
 */
import { determinant, reciprocal, type Mat3 } from './mat3';
import { dot, type Vec3 } from './vec3';

/** Lattice vectors a, b, c as rows, in Å. */
export type Cell = Mat3;

/** Cell lengths in Å and angles in degrees (α = ∠(b,c), β = ∠(a,c), γ = ∠(a,b)). */
export interface CellParameters {
  a: number;
  b: number;
  c: number;
  alpha: number;
  beta: number;
  gamma: number;
}

const DEG = Math.PI / 180;

/** Lengths √(a·a) … and angles acos(b·c / |b||c|) … of the cell vectors (the cosine clamped against rounding). */
export function cellParameters(cell: Cell): CellParameters {
  const [a, b, c] = cell;
  // √(u·u) rather than Math.hypot: the CIF writer prints these, and its bytes are pinned.
  const la = Math.sqrt(dot(a, a));
  const lb = Math.sqrt(dot(b, b));
  const lc = Math.sqrt(dot(c, c));
  const ang = (u: Vec3, v: Vec3, lu: number, lv: number) =>
    Math.acos(Math.max(-1, Math.min(1, dot(u, v) / (lu * lv)))) / DEG;
  return { a: la, b: lb, c: lc, alpha: ang(b, c, lb, lc), beta: ang(a, c, la, lc), gamma: ang(a, b, la, lb) };
}

/** Cosine of an angle in degrees, snapped to exactly 0 at 90° so orthogonal cells stay exactly orthogonal. */
function cosDeg(x: number): number {
  return Math.abs(x - 90) < 1e-12 ? 0 : Math.cos(x * DEG);
}

/**
 * Cell vectors from lengths and angles in the usual crystallographic setting: a along x, b in the
 * xy plane, c completing a right-handed set (International Tables Vol. B §1.1; the same convention
 * ase.geometry.cellpar_to_cell uses by default).
 */
export function cellFromParameters(p: CellParameters): Cell {
  const { a, b, c, alpha, beta, gamma } = p;
  for (const [k, v] of Object.entries(p)) {
    if (!Number.isFinite(v) || v <= 0) throw new RangeError(`cell parameter ${k} = ${v} must be a positive number`);
  }
  const ca = cosDeg(alpha);
  const cb = cosDeg(beta);
  const cg = cosDeg(gamma);
  const sg = Math.abs(gamma - 90) < 1e-12 ? 1 : Math.sin(gamma * DEG);
  const cx = c * cb;
  const cy = (c * (ca - cb * cg)) / sg;
  const cz2 = c * c - cx * cx - cy * cy;
  if (!(cz2 > 0)) throw new RangeError(`cell angles α=${alpha}°, β=${beta}°, γ=${gamma}° do not form a cell`);
  return [
    [a, 0, 0],
    [b * cg, b * sg, 0],
    [cx, cy, Math.sqrt(cz2)],
  ];
}

/** Signed volume a·(b×c) in Å³: the determinant of the rows (negative for a left-handed cell). */
export function cellVolume(cell: Cell): number {
  return determinant(cell);
}

/**
 * Perpendicular distances between opposite cell faces, V/|b×c|, V/|c×a|, V/|a×b| in Å: the spacing of
 * the lattice planes (100), (010), (001), i.e. 1/|a_i*| with a_i* the reciprocal vectors (no 2π).
 */
export function faceSpacings(cell: Cell): Vec3 {
  const r = reciprocal(cell);
  const s = (i: number) => 1 / Math.hypot(r[i][0], r[i][1], r[i][2]);
  return [s(0), s(1), s(2)];
}
