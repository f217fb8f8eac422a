/** Small 3-vector helpers on plain tuples, so lib/view stays free of three.js and the DOM. */
import type { Vec3 } from '../structure/types';

export type { Vec3 };

export function dot(u: Vec3, v: Vec3): number {
  return u[0] * v[0] + u[1] * v[1] + u[2] * v[2];
}

export function cross(u: Vec3, v: Vec3): Vec3 {
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

export function norm(u: Vec3): number {
  return Math.hypot(u[0], u[1], u[2]);
}

/** Unit vector along u; throws on a zero vector because a direction of length 0 has no meaning here. */
export function normalize(u: Vec3): Vec3 {
  const n = norm(u);
  if (!(n > 1e-12)) throw new RangeError('cannot take the direction of a zero vector');
  return [u[0] / n, u[1] / n, u[2] / n];
}

/** Angle between two vectors in degrees, 0..180. */
export function angleDeg(u: Vec3, v: Vec3): number {
  const c = dot(u, v) / (norm(u) * norm(v));
  return (Math.acos(Math.max(-1, Math.min(1, c))) * 180) / Math.PI;
}

/** Position i of a packed xyz array. */
export function pointAt(positions: ArrayLike<number>, i: number): Vec3 {
  return [positions[3 * i], positions[3 * i + 1], positions[3 * i + 2]];
}
