/**
 * Which atoms are shown: a slab (two parallel planes normal to a unit vector n, keeping lo ≤ n·r ≤ hi)
 * and a ball (a cluster and its shells: |r − centre| ≤ R). Membership is decided by the atom centre,
 * the convention for slices through a structure; the viewer applies the same rule in its vertex shader
 * (uniforms, no buffer rebuild) and the CPU picking applies it here, so both agree.
 */
import type { Vec3 } from '../math/vec3';

export interface Slab {
  /** Unit normal. */
  normal: Vec3;
  /** Lower and upper bound of n·r in Å. */
  lo: number;
  hi: number;
}

export interface Ball {
  centre: Vec3;
  /** Radius in Å. */
  radius: number;
}

export interface ProjectionRange {
  min: number;
  max: number;
  /** n·r of the centroid. */
  mid: number;
}

/** Range of n·r over all atoms (and of the centroid), for slider bounds. */
export function projectionRange(positions: ArrayLike<number>, normal: Vec3): ProjectionRange {
  const n = positions.length / 3;
  if (n === 0) return { min: 0, max: 0, mid: 0 };
  let min = Infinity;
  let max = -Infinity;
  let sum = 0;
  for (let i = 0; i < n; i++) {
    const s = normal[0] * positions[3 * i] + normal[1] * positions[3 * i + 1] + normal[2] * positions[3 * i + 2];
    if (s < min) min = s;
    if (s > max) max = s;
    sum += s;
  }
  return { min, max, mid: sum / n };
}

/** A slab of the given thickness (Å) centred at n·r = centre. */
export function slabAround(normal: Vec3, centre: number, thickness: number): Slab {
  const h = Math.max(0, thickness) / 2;
  return { normal, lo: centre - h, hi: centre + h };
}

export function inSlab(slab: Slab, x: number, y: number, z: number): boolean {
  const s = slab.normal[0] * x + slab.normal[1] * y + slab.normal[2] * z;
  return s >= slab.lo && s <= slab.hi;
}

export function inBall(ball: Ball, x: number, y: number, z: number): boolean {
  const dx = x - ball.centre[0];
  const dy = y - ball.centre[1];
  const dz = z - ball.centre[2];
  return dx * dx + dy * dy + dz * dz <= ball.radius * ball.radius;
}

/** 1 for every atom that passes the slab and the ball (either may be absent), else 0. */
export function visibleMask(positions: ArrayLike<number>, slab?: Slab | null, ball?: Ball | null): Uint8Array {
  const n = positions.length / 3;
  const out = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const x = positions[3 * i];
    const y = positions[3 * i + 1];
    const z = positions[3 * i + 2];
    out[i] = (!slab || inSlab(slab, x, y, z)) && (!ball || inBall(ball, x, y, z)) ? 1 : 0;
  }
  return out;
}
