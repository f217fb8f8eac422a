/**
 * CPU picking and measuring: a ray against every visible atom sphere, nearest hit wins. No GPU read-back,
 * so a pick costs one pass over the atoms (about a millisecond at 10⁵) and follows the slab exactly.
 */
import { angleDeg, distance, pointAt, sub, type Vec3 } from '../math/vec3';

export interface Ray {
  origin: Vec3;
  /** Unit direction. */
  direction: Vec3;
}

/**
 * Distance t ≥ 0 along a ray (unit direction) to its first crossing of a sphere, or null if it misses.
 * t = b − √(b² − (|c − o|² − r²)) with b = d·(c − o); an origin inside the sphere gives the exit point.
 */
export function raySphere(ray: Ray, centre: Vec3, radius: number): number | null {
  const ox = centre[0] - ray.origin[0];
  const oy = centre[1] - ray.origin[1];
  const oz = centre[2] - ray.origin[2];
  const b = ray.direction[0] * ox + ray.direction[1] * oy + ray.direction[2] * oz;
  const c = ox * ox + oy * oy + oz * oz - radius * radius;
  const disc = b * b - c;
  if (disc < 0) return null;
  const s = Math.sqrt(disc);
  const t0 = b - s;
  if (t0 >= 0) return t0;
  const t1 = b + s;
  return t1 >= 0 ? t1 : null;
}

export interface Hit {
  index: number;
  /** Distance along the ray. */
  t: number;
}

/**
 * Nearest atom hit by the ray. `radii[i]` is the drawn radius of atom i; `visible` (optional, 1 = shown)
 * skips atoms the slab or the cluster hides.
 */
export function pickAtom(ray: Ray, positions: ArrayLike<number>, radii: ArrayLike<number>, visible?: ArrayLike<number>): Hit | null {
  const n = positions.length / 3;
  const [dx, dy, dz] = ray.direction;
  const [px, py, pz] = ray.origin;
  let best: Hit | null = null;
  for (let i = 0; i < n; i++) {
    if (visible && !visible[i]) continue;
    const ox = positions[3 * i] - px;
    const oy = positions[3 * i + 1] - py;
    const oz = positions[3 * i + 2] - pz;
    const b = dx * ox + dy * oy + dz * oz;
    const r = radii[i];
    const c = ox * ox + oy * oy + oz * oz - r * r;
    const disc = b * b - c;
    if (disc < 0) continue;
    const s = Math.sqrt(disc);
    const t = b - s >= 0 ? b - s : b + s;
    if (t < 0) continue;
    if (!best || t < best.t) best = { index: i, t };
  }
  return best;
}

/** Distance between atoms i and j in Å. */
export function distanceBetween(positions: ArrayLike<number>, i: number, j: number): number {
  return distance(pointAt(positions, i), pointAt(positions, j));
}

/** Angle i–j–k at atom j, in degrees. */
export function angleAt(positions: ArrayLike<number>, i: number, j: number, k: number): number {
  const pj = pointAt(positions, j);
  return angleDeg(sub(pointAt(positions, i), pj), sub(pointAt(positions, k), pj));
}
