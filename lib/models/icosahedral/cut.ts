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

/**
 * Point groups acting on perpendicular space, as 3×3 matrices (row-major, 9 numbers each).
 * m-3 (T_h, order 24): cyclic permutations of the axes times every sign change — the symmetry of the
 * strained approximant window (its rows are signed cyclic permutations of (p, −q, 0)) and the largest cubic
 * subgroup of m-3-5. m-3-5 (I_h, order 120): m-3 and the 72° rotation about e1⊥, closed under products
 * (the group generated is the full icosahedral group: standard, e.g. Coxeter, Regular Polytopes — from memory;
 * the test checks the order and that it permutes the six ±e_i⊥).
 */
export function pyritohedralGroup(): Float64Array[] {
  const out: Float64Array[] = [];
  for (const perm of [[0, 1, 2], [1, 2, 0], [2, 0, 1]])
    for (let sg = 0; sg < 8; sg++) {
      const g = new Float64Array(9);
      for (let r = 0; r < 3; r++) g[3 * r + perm[r]] = sg & (1 << r) ? -1 : 1;
      out.push(g);
    }
  return out;
}

function mul3(a: Float64Array, b: Float64Array): Float64Array {
  const c = new Float64Array(9);
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) for (let k = 0; k < 3; k++) c[3 * i + j] += a[3 * i + k] * b[3 * k + j];
  return c;
}

/** The icosahedral group m-3-5 in the perpendicular frame of hyperlattice.ts (120 matrices). */
export function icosahedralGroup(axis: ArrayLike<number>): Float64Array[] {
  const ax = axis[0];
  const ay = axis[1];
  const az = axis[2];
  const l = Math.hypot(ax, ay, az);
  const [x, y, z] = [ax / l, ay / l, az / l];
  const c = Math.cos((2 * Math.PI) / 5);
  const s = Math.sin((2 * Math.PI) / 5);
  const t = 1 - c;
  // Rodrigues rotation by 72° about the five-fold axis.
  const r5 = Float64Array.from([t * x * x + c, t * x * y - s * z, t * x * z + s * y, t * x * y + s * z, t * y * y + c, t * y * z - s * x, t * x * z - s * y, t * y * z + s * x, t * z * z + c]);
  const group: Float64Array[] = [];
  const key = (g: Float64Array) => Array.from(g, (v) => Math.round(v * 1e6)).join(',');
  const seen = new Set<string>();
  const th = pyritohedralGroup();
  const gens = [r5, th[1], th[8]];
  const queue = [...th, r5];
  while (queue.length) {
    const g = queue.pop()!;
    const k = key(g);
    if (seen.has(k)) continue;
    seen.add(k);
    group.push(g);
    if (group.length > 120) throw new Error('icosahedral group: closure exceeded 120 elements');
    for (const h of gens) queue.push(mul3(g, h));
  }
  return group;
}

/** A generic direction (no rational relation to any facet normal) for the symmetric boundary rule. */
const GENERIC_DIR = [0.8147236863931789, 0.3211563727203121, 0.4826301488432133];

/** The orbit {g·d₀} of the generic direction under a group, 3 numbers per direction. */
export function directionOrbit(group: Float64Array[]): Float64Array {
  const out = new Float64Array(3 * group.length);
  group.forEach((g, k) => {
    for (let r = 0; r < 3; r++) out[3 * k + r] = g[3 * r] * GENERIC_DIR[0] + g[3 * r + 1] * GENERIC_DIR[1] + g[3 * r + 2] * GENERIC_DIR[2];
  });
  return out;
}
