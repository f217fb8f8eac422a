/**
 * Shared pieces of the icosahedral cut: one "class" of sites (a shifted copy of the hyperlattice with its
 * own occupation domain and species), the windows it needs, and the hard cap on points.
 *
 * Why the walk (BFS) is complete: for the projected hypercube W0 the accepted nodes are the vertices of a
 * tiling, connected by its edges ±e_i (F: by pairs of edges ±e_i ± e_j, which stay in D6). A window
 * κ·W0 with κ ≥ 1 is the union of translates W0 + t, t ∈ (κ−1)W0 (Minkowski sum), so its cut is a union of
 * tilings whose vertex sets overlap continuously in t — still connected. Any other window (smaller
 * hypercube, sphere, shell) is walked inside the smallest such κ·W0 that contains it and filtered.
 */
import type { SiteClass } from '../../structure/types';
import type { Window } from './window';
import { scaleWindow, shellWindow, sphereWindow, windowInradius, windowOuterRadius, zonotopeWindow } from './window';

/** Occupation domain of one site class, in perpendicular-space Å (see hyperlattice.ts for the scale). */
export type WindowSpec =
  | { kind: 'hypercube'; scale: number }
  | { kind: 'sphere'; radius: number }
  | { kind: 'shell'; r1: number; r2: number };

/** One site class of a cut, already resolved to numbers. */
export interface CutClass {
  name: string;
  /** 6D position in the hyperlattice unit cell (coordinates in the basis E_i). */
  position: ArrayLike<number>;
  window: WindowSpec;
  /** Atomic number (0 = unassigned vertex). */
  species: number;
  mix?: Record<number, number>;
  occupancy?: number;
}

/** Default: the plain tiling vertices (node class, full projected hypercube). */
export function vertexClass(species = 0): CutClass {
  return { name: 'vertex', position: [0, 0, 0, 0, 0, 0], window: { kind: 'hypercube', scale: 1 }, species };
}

/**
 * The windows for one class in a frame whose projected hypercube is `base` (centred at the phason offset):
 * `accept` is the class domain, `explore` a scaled hypercube containing it (connected walk, header).
 * `unit` converts Å in perpendicular space to the frame's units.
 */
export function classWindows(spec: WindowSpec, base: Window, unit: number): { accept: Window; explore: Window } {
  const inr = windowInradius(base);
  if (spec.kind === 'hypercube') {
    const accept = spec.scale === 1 ? base : scaleWindow(base, spec.scale);
    return { accept, explore: spec.scale >= 1 ? accept : base };
  }
  const r2 = (spec.kind === 'sphere' ? spec.radius : spec.r2) / unit;
  const accept = spec.kind === 'sphere' ? sphereWindow(r2, base.centre) : shellWindow(spec.r1 / unit, r2, base.centre);
  const k = Math.max(1, (r2 * (1 + 1e-6)) / inr);
  return { accept, explore: k === 1 ? base : scaleWindow(base, k) };
}

/** A base zonotope of six perpendicular vectors, centred at `centre`. */
export function baseWindow(perpVectors: Float64Array, centre: ArrayLike<number>): Window {
  return zonotopeWindow(perpVectors, { centre });
}

/** Public SiteClass records for a list of cut classes. */
export function siteClassesOf(classes: CutClass[]): SiteClass[] {
  return classes.map((c) => {
    const s: SiteClass = { name: c.name, species: c.species };
    if (c.mix) s.mix = c.mix;
    if (c.occupancy !== undefined) s.occupancy = c.occupancy;
    return s;
  });
}

export { windowOuterRadius };

/** (n + shift)·m for one 6D node, written at out[o..o+2]: m holds six 3D images (a projection, or a strained one). */
export function projectShifted(n: ArrayLike<number>, shift: ArrayLike<number>, m: Float64Array, out: Float64Array, o: number): void {
  let x = 0;
  let y = 0;
  let z = 0;
  for (let i = 0; i < 6; i++) {
    const c = n[i] + shift[i];
    x += c * m[3 * i];
    y += c * m[3 * i + 1];
    z += c * m[3 * i + 2];
  }
  out[o] = x;
  out[o + 1] = y;
  out[o + 2] = z;
}
