import { cellVolume } from '../../math/cell';
import { atomicWeight } from '../elements';
import type { Structure } from '../types';
import { validateStructure } from '../validate';
import { atomContributions } from './weights';

/** 1 u/Å³ in g/cm³: 1.66053906660e-24 g / 1e-24 cm³ (CODATA 2018 atomic mass constant). */
export const U_PER_A3_TO_G_PER_CM3 = 1.6605390666;

export interface DensityOptions {
  /** Volume in Å³ to use instead of the cell (e.g. a measured sample volume). */
  volume?: number;
  /** For finite patches: radius of the inner ball (Å) about the centroid; default see below. */
  innerRadius?: number;
}

export interface DensityRegion {
  method: 'cell' | 'volume' | 'inner-ball' | 'patch-sphere';
  /** Volume counted, Å³. */
  volume: number;
  /** Indices of the atoms counted (all atoms for cell/volume). */
  atoms: Uint32Array | null;
  /** Ball centre and radius for 'inner-ball'. */
  centre?: [number, number, number];
  radius?: number;
}

/**
 * Which atoms and which volume a density refers to. Periodic: the cell. Given volume: all atoms.
 * Icosahedral patch (s.model says so): the patch's own ball. 1D/2D: refused (see modelDensity).
 * Other finite sets: the atoms inside a ball about the centroid — no convex hull, and the ball stays away
 * from the ragged surface, where a cut-and-project patch is under-filled. Default radius: half the
 * distance from the centroid to the nearest face of the bounding box. Edge effects scale as
 * (surface/volume), so prefer large patches or give innerRadius.
 */
export function densityRegion(s: Structure, opts: DensityOptions = {}): DensityRegion {
  validateStructure(s);
  const n = s.species.length;
  if (opts.volume !== undefined) {
    if (!(opts.volume > 0)) throw new RangeError(`volume must be positive, got ${opts.volume}`);
    return { method: 'volume', volume: opts.volume, atoms: null };
  }
  // A 1D or 2D model's cell has an invented thickness: no per-Å³ density (modelDensity gives per Å or per Å²).
  if ((s.dim ?? 3) !== 3) throw new Error('density: a number density per Å³ needs a 3D structure (this one is 1D/2D; see modelDensity)');
  if (s.cell) return { method: 'cell', volume: Math.abs(cellVolume(s.cell)), atoms: null };
  if (n === 0) throw new Error('density: the structure is empty and has no cell; give a volume');
  const m = s.model as { family?: string; mode?: string; radius?: number; centre?: number[] } | undefined;
  if (opts.innerRadius === undefined && m?.family === 'icosahedral' && m.mode === 'patch' && m.radius && m.radius > 0) {
    // An icosahedral patch keeps every point of the cut within R of its centre: its own ball is the region.
    const R = m.radius;
    const c: [number, number, number] = [m.centre?.[0] ?? 0, m.centre?.[1] ?? 0, m.centre?.[2] ?? 0];
    const r2 = (R * (1 + 1e-9)) ** 2;
    const idx: number[] = [];
    for (let i = 0; i < n; i++) {
      const d2 = (s.positions[3 * i] - c[0]) ** 2 + (s.positions[3 * i + 1] - c[1]) ** 2 + (s.positions[3 * i + 2] - c[2]) ** 2;
      if (d2 <= r2) idx.push(i);
    }
    return { method: 'patch-sphere', volume: (4 / 3) * Math.PI * R ** 3, atoms: Uint32Array.from(idx), centre: c, radius: R };
  }
  const c: [number, number, number] = [0, 0, 0];
  const lo = [Infinity, Infinity, Infinity];
  const hi = [-Infinity, -Infinity, -Infinity];
  for (let i = 0; i < n; i++)
    for (let k = 0; k < 3; k++) {
      const x = s.positions[3 * i + k];
      c[k] += x / n;
      lo[k] = Math.min(lo[k], x);
      hi[k] = Math.max(hi[k], x);
    }
  const r = opts.innerRadius ?? 0.5 * Math.min(...[0, 1, 2].map((k) => Math.min(c[k] - lo[k], hi[k] - c[k])));
  if (!(r > 0)) throw new Error('density: the patch is flat or a single point; give innerRadius or a volume');
  const idx: number[] = [];
  for (let i = 0; i < n; i++) {
    const dx = s.positions[3 * i] - c[0];
    const dy = s.positions[3 * i + 1] - c[1];
    const dz = s.positions[3 * i + 2] - c[2];
    if (dx * dx + dy * dy + dz * dz <= r * r) idx.push(i);
  }
  return { method: 'inner-ball', volume: (4 / 3) * Math.PI * r ** 3, atoms: Uint32Array.from(idx), centre: c, radius: r };
}

export interface DensityResult {
  /** atoms/Å³ (occupancy weighted) */
  numberDensity: number;
  /** g/cm³ from IUPAC standard atomic weights */
  massDensity: number;
  /** occupancy-weighted atoms counted */
  atoms: number;
  /** u counted */
  mass: number;
  region: DensityRegion;
}

/** Number density (atoms/Å³) and mass density (g/cm³), occupancy weighted; X vertices count as atoms of mass 0. */
export function density(s: Structure, opts: DensityOptions = {}): DensityResult {
  const region = densityRegion(s, opts);
  let atoms = 0;
  let mass = 0;
  const add = (i: number) => {
    for (const [z, w] of atomContributions(s, i)) {
      atoms += w;
      mass += w * atomicWeight(z);
    }
  };
  if (region.atoms) for (const i of region.atoms) add(i);
  else for (let i = 0; i < s.species.length; i++) add(i);
  return {
    numberDensity: atoms / region.volume,
    massDensity: (mass / region.volume) * U_PER_A3_TO_G_PER_CM3,
    atoms,
    mass,
    region,
  };
}

/** atoms/Å³ — see density(). */
export function numberDensity(s: Structure, opts: DensityOptions = {}): number {
  return density(s, opts).numberDensity;
}

/** g/cm³ — see density(). */
export function massDensity(s: Structure, opts: DensityOptions = {}): number {
  return density(s, opts).massDensity;
}
