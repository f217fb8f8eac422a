import type { Cell, Vec3 } from './types';

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

function dot(u: Vec3, v: Vec3): number {
  return u[0] * v[0] + u[1] * v[1] + u[2] * v[2];
}

/** Lengths and angles of the cell vectors. */
export function cellParameters(cell: Cell): CellParameters {
  const [a, b, c] = cell;
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

/** Signed volume a·(b×c) in Å³. */
export function cellVolume(cell: Cell): number {
  const [a, b, c] = cell;
  return (
    a[0] * (b[1] * c[2] - b[2] * c[1]) - a[1] * (b[0] * c[2] - b[2] * c[0]) + a[2] * (b[0] * c[1] - b[1] * c[0])
  );
}

/**
 * Inverse of the cell matrix (rows a, b, c) as rows, so that fractional f = r · inv
 * (r = f · M with M rows a, b, c). Throws on a degenerate cell.
 */
export function inverseCell(cell: Cell): Cell {
  const [a, b, c] = cell;
  const det = cellVolume(cell);
  if (!(Math.abs(det) > 1e-12)) throw new RangeError('cell vectors are degenerate (zero volume)');
  // adjugate / det; columns of the inverse are (b×c, c×a, a×b)/det.
  const bc: Vec3 = [b[1] * c[2] - b[2] * c[1], b[2] * c[0] - b[0] * c[2], b[0] * c[1] - b[1] * c[0]];
  const ca: Vec3 = [c[1] * a[2] - c[2] * a[1], c[2] * a[0] - c[0] * a[2], c[0] * a[1] - c[1] * a[0]];
  const ab: Vec3 = [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
  return [
    [bc[0] / det, ca[0] / det, ab[0] / det],
    [bc[1] / det, ca[1] / det, ab[1] / det],
    [bc[2] / det, ca[2] / det, ab[2] / det],
  ];
}

/** Cartesian (packed xyz) → fractional (packed), r = f·M. */
export function toFractional(cell: Cell, cart: Float64Array): Float64Array {
  const inv = inverseCell(cell);
  const out = new Float64Array(cart.length);
  for (let i = 0; i < cart.length; i += 3) {
    const x = cart[i];
    const y = cart[i + 1];
    const z = cart[i + 2];
    out[i] = x * inv[0][0] + y * inv[1][0] + z * inv[2][0];
    out[i + 1] = x * inv[0][1] + y * inv[1][1] + z * inv[2][1];
    out[i + 2] = x * inv[0][2] + y * inv[1][2] + z * inv[2][2];
  }
  return out;
}

/** Fractional (packed) → Cartesian (packed xyz), r = f·M. */
export function toCartesian(cell: Cell, frac: Float64Array): Float64Array {
  const [a, b, c] = cell;
  const out = new Float64Array(frac.length);
  for (let i = 0; i < frac.length; i += 3) {
    const u = frac[i];
    const v = frac[i + 1];
    const w = frac[i + 2];
    out[i] = u * a[0] + v * b[0] + w * c[0];
    out[i + 1] = u * a[1] + v * b[1] + w * c[1];
    out[i + 2] = u * a[2] + v * b[2] + w * c[2];
  }
  return out;
}

/** Perpendicular distances between opposite cell faces (V/|b×c|, V/|c×a|, V/|a×b|), in Å. */
export function faceSpacings(cell: Cell): Vec3 {
  const inv = inverseCell(cell);
  // Row i of inv^T is the reciprocal vector a_i* (without 2π); spacing = 1/|a_i*|.
  const r = (i: number) => 1 / Math.hypot(inv[0][i], inv[1][i], inv[2][i]);
  return [r(0), r(1), r(2)];
}
