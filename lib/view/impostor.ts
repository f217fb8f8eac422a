/**
 * The sphere-impostor geometry, in plain numbers: the same formulas the viewer's vertex and fragment
 * shaders use (components/viewer/impostorMaterial.ts), here so they can be checked against three.js's
 * own camera maths. All in view (eye) space: the camera at the origin looking down −z.
 *
 * Quad. Orthographic: a screen-aligned square of half-size r at the centre. Perspective: a square at the
 * centre, perpendicular to the line of sight to the centre, of half-size r·d/√(d² − r²) (d = |c|): the
 * cone from the eye tangent to the sphere has half-angle asin(r/d), and its cross-section through the
 * centre has exactly that radius, so the quad covers the silhouette.
 * Fragment. The eye ray through the fragment meets the sphere at t = b − √(b² − |c|² + r²), b = d̂·c
 * (orthographic: the ray along −z through the fragment's xy); the fragment's depth is that point's
 * window depth, ½·z_ndc + ½, so spheres cut into each other correctly.
 */
import { cross, dot, normalize, type Vec3 } from '../math/vec3';

/** Column-major 4×4 (the layout of three.js Matrix4.elements). */
export type Mat4 = ArrayLike<number>;

/** Orthographic iff the projection's w row is (0, 0, 0, 1). */
export function isOrthographic(projection: Mat4): boolean {
  return projection[11] === 0;
}

/** Half-size of the impostor quad for a sphere at view-space centre c. 0 when the eye is inside. */
export function quadHalfSize(c: Vec3, r: number, ortho: boolean): number {
  if (ortho) return r;
  const d2 = dot(c, c);
  if (d2 <= r * r * 1.0001) return 0;
  return (r * Math.sqrt(d2)) / Math.sqrt(d2 - r * r);
}

/** The in-plane axes (u, v) of the quad. */
export function quadAxes(c: Vec3, ortho: boolean): [Vec3, Vec3] {
  if (ortho) return [[1, 0, 0], [0, 1, 0]];
  const w = normalize(c);
  const ref: Vec3 = Math.abs(w[1]) > 0.99 ? [1, 0, 0] : [0, 1, 0];
  // u × v = −w: the quad faces the eye (counter-clockwise as seen from it), like the ortho quad.
  const u = normalize(cross(w, ref));
  const v = cross(u, w);
  return [u, v];
}

/** View-space corner (sx, sy ∈ {−1, 1}) of the quad. */
export function quadCorner(c: Vec3, r: number, ortho: boolean, sx: number, sy: number): Vec3 {
  const h = quadHalfSize(c, r, ortho);
  const [u, v] = quadAxes(c, ortho);
  return [c[0] + (u[0] * sx + v[0] * sy) * h, c[1] + (u[1] * sx + v[1] * sy) * h, c[2] + (u[2] * sx + v[2] * sy) * h];
}

/** The point where the eye ray through view-space point q (on the quad) first meets the sphere, or null. */
export function surfacePoint(c: Vec3, r: number, q: Vec3, ortho: boolean): Vec3 | null {
  if (ortho) {
    const dx = q[0] - c[0];
    const dy = q[1] - c[1];
    const h2 = r * r - dx * dx - dy * dy;
    return h2 < 0 ? null : [q[0], q[1], c[2] + Math.sqrt(h2)];
  }
  const d = normalize(q);
  const b = dot(d, c);
  const h2 = b * b - dot(c, c) + r * r;
  if (h2 < 0) return null;
  const t = b - Math.sqrt(h2);
  return [d[0] * t, d[1] * t, d[2] * t];
}

/** Window depth (0 near … 1 far, default depth range) of a view-space point. */
export function windowDepth(p: Vec3, projection: Mat4): number {
  const m = projection;
  const z = m[2] * p[0] + m[6] * p[1] + m[10] * p[2] + m[14];
  const w = m[3] * p[0] + m[7] * p[1] + m[11] * p[2] + m[15];
  return 0.5 * (z / w) + 0.5;
}
