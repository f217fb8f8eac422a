/**
 * 3-vectors as plain tuples [x, y, z], so the same helpers serve the science in lib/ (no three.js, no DOM).
 * Each function keeps one fixed floating-point operation order — the order the engines, checks and
 * writers used before they shared these helpers — because results reach output bytes.
 */

/** A Cartesian or fractional 3-vector. */
export type Vec3 = [number, number, number];

/** u·v = u₀v₀ + u₁v₁ + u₂v₂, summed left to right. */
export function dot(u: ArrayLike<number>, v: ArrayLike<number>): number {
  return u[0] * v[0] + u[1] * v[1] + u[2] * v[2];
}

/** u × v (right-handed): (u₁v₂ − u₂v₁, u₂v₀ − u₀v₂, u₀v₁ − u₁v₀). */
export function cross(u: ArrayLike<number>, v: ArrayLike<number>): Vec3 {
  return [u[1] * v[2] - u[2] * v[1], u[2] * v[0] - u[0] * v[2], u[0] * v[1] - u[1] * v[0]];
}

export function add(u: Vec3, v: Vec3): Vec3 {
  return [u[0] + v[0], u[1] + v[1], u[2] + v[2]];
}

export function sub(u: Vec3, v: Vec3): Vec3 {
  return [u[0] - v[0], u[1] - v[1], u[2] - v[2]];
}

export function scale(u: Vec3, s: number): Vec3 {
  return [u[0] * s, u[1] * s, u[2] * s];
}

/** |u| by Math.hypot, which avoids overflow and underflow of the squares. */
export function norm(u: ArrayLike<number>): number {
  return Math.hypot(u[0], u[1], u[2]);
}

/** Unit vector along u (each component divided by |u|); throws on a zero vector, which has no direction. */
export function normalize(u: ArrayLike<number>): Vec3 {
  const n = norm(u);
  if (!(n > 1e-12)) throw new RangeError('cannot take the direction of a zero vector');
  return [u[0] / n, u[1] / n, u[2] / n];
}

/** |u − v|. */
export function distance(u: Vec3, v: Vec3): number {
  return Math.hypot(u[0] - v[0], u[1] - v[1], u[2] - v[2]);
}

/** Angle between two vectors in degrees, 0..180: acos(u·v / |u||v|), the cosine clamped to [−1, 1] against rounding. */
export function angleDeg(u: Vec3, v: Vec3): number {
  const c = dot(u, v) / (norm(u) * norm(v));
  return (Math.acos(Math.max(-1, Math.min(1, c))) * 180) / Math.PI;
}

/** Point i of a packed x y z x y z … array. */
export function pointAt(positions: ArrayLike<number>, i: number): Vec3 {
  return [positions[3 * i], positions[3 * i + 1], positions[3 * i + 2]];
}
