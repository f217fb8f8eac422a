/**
 * Perpendicular-space pictures: project the lifted points (and the ideal window) onto a view plane, mark
 * the points that lie outside the ideal window (phason defects of an approximant: its linear phason strain
 * accepts them although the quasicrystal would not) and those near its boundary (they flip under a small
 * phason offset).
 */
import type { Structure } from '@/lib/structure/types';
import { icosahedralBasis } from '@/lib/models/icosahedral/hyperlattice';
import { scaleWindow, windowContains, zonotopeWindow, type Window } from '@/lib/models/icosahedral/window';

export type PerpMark = 0 | 1 | 2; // 0 inside, 1 near the boundary, 2 outside the ideal window

/** The ideal icosahedral window for these params (triacontahedron of a_R, shifted by the phason offset). */
export function idealWindow(s: Structure): Window | null {
  if (s.perpDim !== 3) return null;
  const p = s.model;
  if (p?.family !== 'icosahedral') return null;
  return zonotopeWindow(icosahedralBasis(p.aR).perp, { centre: p.offset });
}

/** Boundary band: inside the window but outside the window shrunk by this factor. */
export const BOUNDARY_SHRINK = 0.9;

export function markPoints(s: Structure, w: Window | null): Uint8Array {
  const n = s.species.length;
  const out = new Uint8Array(n);
  if (!w || !s.perp || s.perpDim !== 3) return out;
  const inner = scaleWindow(w, BOUNDARY_SHRINK);
  for (let i = 0; i < n; i++) {
    const x = s.perp[3 * i];
    const y = s.perp[3 * i + 1];
    const z = s.perp[3 * i + 2];
    out[i] = !windowContains(w, x, y, z) ? 2 : windowContains(inner, x, y, z) ? 0 : 1;
  }
  return out;
}

/** Rotation about y by `yaw` then about x by `pitch`; returns the 2D screen coordinates (x right, y up). */
export function project3(x: number, y: number, z: number, yaw: number, pitch: number): [number, number, number] {
  const cy = Math.cos(yaw);
  const sy = Math.sin(yaw);
  const x1 = cy * x + sy * z;
  const z1 = -sy * x + cy * z;
  const cp = Math.cos(pitch);
  const sp = Math.sin(pitch);
  const y2 = cp * y - sp * z1;
  const z2 = sp * y + cp * z1;
  return [x1, y2, z2];
}

/** Convex hull (Andrew's monotone chain) of 2D points, counter-clockwise. */
export function hull2(pts: [number, number][]): [number, number][] {
  const p = [...pts].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  if (p.length < 3) return p;
  const cross = (o: [number, number], a: [number, number], b: [number, number]) => (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
  const lower: [number, number][] = [];
  for (const q of p) {
    while (lower.length >= 2 && cross(lower[lower.length - 2], lower[lower.length - 1], q) <= 0) lower.pop();
    lower.push(q);
  }
  const upper: [number, number][] = [];
  for (let i = p.length - 1; i >= 0; i--) {
    const q = p[i];
    while (upper.length >= 2 && cross(upper[upper.length - 2], upper[upper.length - 1], q) <= 0) upper.pop();
    upper.push(q);
  }
  return lower.slice(0, -1).concat(upper.slice(0, -1));
}

/** Corners of a zonotope κ·Σ[−½,½]v_k + c (all sign choices; the hull of their projection is its outline). */
export function zonotopeCorners(w: Window): [number, number, number][] {
  if (w.kind !== 'zonotope') return [];
  const k = w.vectors.length / 3;
  const out: [number, number, number][] = [];
  for (let m = 0; m < 1 << k; m++) {
    let x = w.centre[0];
    let y = w.centre[1];
    let z = w.centre[2];
    for (let i = 0; i < k; i++) {
      const sgn = (m >> i) & 1 ? 0.5 : -0.5;
      x += sgn * w.scale * w.vectors[3 * i];
      y += sgn * w.scale * w.vectors[3 * i + 1];
      z += sgn * w.scale * w.vectors[3 * i + 2];
    }
    out.push([x, y, z]);
  }
  return out;
}
