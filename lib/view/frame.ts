/**
 * Framing: where a camera that looks along a chosen direction, with a chosen up, must stand so that every
 * atom (and every cell corner) is in the picture with a small margin — and no farther. Fitting the bounding
 * sphere instead wastes a third of a wide window on a cube seen face-on; fitting what is actually seen from
 * this side lets the structure fill the view.
 *
 * In camera axes (right r, up u, back b = from the target towards the camera) a point at lateral offsets
 * (x, y) from the target and z along b is in a perspective picture when |x| ≤ (D − z)·tan(φx) and
 * |y| ≤ (D − z)·tan(φy), D the camera's distance from the target and φ the half angles of view; so the
 * smallest D is max over the points of z + max(|x|/tan φx, |y|/tan φy). An orthographic picture needs only
 * the lateral extents.
 */
import { add, dot, scale, type Vec3 } from '../math/vec3';

export interface Framing {
  /** Point the camera looks at (the middle of what is seen). */
  target: Vec3;
  /** Perspective: distance from the target to the camera, Å. */
  distance: number;
  /** Orthographic: half the visible height, Å. */
  halfHeight: number;
}

export interface FrameOptions {
  /** Unit vector from the target towards the camera. */
  back: Vec3;
  /** Unit up vector, perpendicular to `back`. */
  up: Vec3;
  /** Vertical field of view of the perspective camera, radians. */
  fovY: number;
  /** Width / height of the picture. */
  aspect: number;
  /** Added around every point (the largest drawn atom radius), Å. */
  pad?: number;
  /** Picture size over the tight fit (1.05: 5 % to spare). */
  margin?: number;
}

/** Camera target, perspective distance and orthographic half height that show all points. */
export function frameView(points: ArrayLike<number>, extra: readonly Vec3[], o: FrameOptions): Framing {
  const { back: b, up: u, fovY, aspect } = o;
  const pad = o.pad ?? 0;
  const margin = o.margin ?? 1.05;
  const r: Vec3 = [u[1] * b[2] - u[2] * b[1], u[2] * b[0] - u[0] * b[2], u[0] * b[1] - u[1] * b[0]];
  const n = points.length / 3;
  const total = n + extra.length;
  if (total === 0) return { target: [0, 0, 0], distance: 10, halfHeight: 5 };
  const coord = (k: number): Vec3 => (k < n ? [points[3 * k], points[3 * k + 1], points[3 * k + 2]] : extra[k - n]);
  let x0 = Infinity, x1 = -Infinity, y0 = Infinity, y1 = -Infinity, z0 = Infinity, z1 = -Infinity;
  for (let k = 0; k < total; k++) {
    const p = coord(k);
    const x = dot(p, r), y = dot(p, u), z = dot(p, b);
    if (x < x0) x0 = x;
    if (x > x1) x1 = x;
    if (y < y0) y0 = y;
    if (y > y1) y1 = y;
    if (z < z0) z0 = z;
    if (z > z1) z1 = z;
  }
  const xc = (x0 + x1) / 2, yc = (y0 + y1) / 2, zc = (z0 + z1) / 2;
  const target = add(add(scale(r, xc), scale(u, yc)), scale(b, zc));
  const halfW = (x1 - x0) / 2 + pad;
  const halfH = (y1 - y0) / 2 + pad;
  const halfHeight = Math.max(halfH, halfW / aspect, 1e-3) * margin;
  const ty = Math.tan(fovY / 2) / margin;
  const tx = ty * aspect;
  let distance = 0;
  for (let k = 0; k < total; k++) {
    const p = coord(k);
    const x = Math.abs(dot(p, r) - xc) + pad, y = Math.abs(dot(p, u) - yc) + pad, z = dot(p, b) - zc + pad;
    const need = z + Math.max(x / tx, y / ty);
    if (need > distance) distance = need;
  }
  // Never inside the structure: keep the camera beyond the nearest point along b.
  distance = Math.max(distance, (z1 - zc) + pad + 1e-3);
  return { target, distance, halfHeight };
}
