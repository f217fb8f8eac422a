/**
 * Reciprocal lattice helpers for diffraction. Convention: reciprocal vectors b_i with a_i · b_j = δ_ij
 * (no 2π), so G = h b1 + k b2 + l b3 has |G| = 1/d and Q = 2π G (|Q| = 2π/d, phase Q·r = 2π h·x).
 */
import type { Cell, Vec3 } from '../structure/types';

export function det3(m: Cell): number {
  const [a, b, c] = m;
  return (
    a[0] * (b[1] * c[2] - b[2] * c[1]) - a[1] * (b[0] * c[2] - b[2] * c[0]) + a[2] * (b[0] * c[1] - b[1] * c[0])
  );
}

function cross(u: Vec3, v: Vec3): Vec3 {
  return [u[1] * v[2] - u[2] * v[1], u[2] * v[0] - u[0] * v[2], u[0] * v[1] - u[1] * v[0]];
}

/** Reciprocal basis rows b1, b2, b3 (a_i · b_j = δ_ij). Throws when the cell is singular. */
export function reciprocalCell(cell: Cell): Cell {
  const v = det3(cell);
  const scale = Math.abs(cell[0][0]) + Math.abs(cell[1][1]) + Math.abs(cell[2][2]) + 1e-300;
  if (!(Math.abs(v) > 1e-12 * scale * scale * scale)) {
    throw new Error('cell: lattice vectors are linearly dependent (zero volume)');
  }
  const b1 = cross(cell[1], cell[2]).map((x) => x / v) as Vec3;
  const b2 = cross(cell[2], cell[0]).map((x) => x / v) as Vec3;
  const b3 = cross(cell[0], cell[1]).map((x) => x / v) as Vec3;
  return [b1, b2, b3];
}

/** Fractional coordinates x_i = r · b_i for packed Cartesian positions. */
export function fractional(cell: Cell, positions: Float64Array): Float64Array {
  const r = reciprocalCell(cell);
  const n = positions.length / 3;
  const out = new Float64Array(positions.length);
  for (let j = 0; j < n; j++) {
    const x = positions[3 * j];
    const y = positions[3 * j + 1];
    const z = positions[3 * j + 2];
    for (let i = 0; i < 3; i++) out[3 * j + i] = x * r[i][0] + y * r[i][1] + z * r[i][2];
  }
  return out;
}

/** Cartesian G = h b1 + k b2 + l b3 (1/Å, no 2π). */
export function gVector(recip: Cell, h: number, k: number, l: number): Vec3 {
  return [
    h * recip[0][0] + k * recip[1][0] + l * recip[2][0],
    h * recip[0][1] + k * recip[1][1] + l * recip[2][1],
    h * recip[0][2] + k * recip[1][2] + l * recip[2][2],
  ];
}

export function norm(v: Vec3): number {
  return Math.hypot(v[0], v[1], v[2]);
}
