/**
 * Density over the region a model actually fills, in the unit that fits its dimension:
 * - 3D: atoms/Å³ and g/cm³ — the cell; an icosahedral patch over its own ball (density(): every point of the cut
 *   within radius R of the centre is kept, so N/(4/3 πR³) counts exactly the sphere); a finite decagonal stack over the
 *   cylinder of its layer discs; anything else (an uploaded cluster) over the inner ball of densityRegion.
 * - 2D tilings: points per Å² — a periodic tiling over its in-plane cell area |a × b|; a round patch (tiles whose
 *   centre lies within R) over the disc of radius R − edge, which every tile touching it has its centre inside,
 *   so that disc is completely tiled.
 * - 1D chains: points per Å — the period for an approximant, (N − 1)/length for a finite chain.
 * Occupancy-weighted, like density().
 */
import { cross, norm } from '../../math/vec3';
import { atomicWeight } from '../elements';
import type { Structure } from '../types';
import { validateStructure } from '../validate';
import { density, U_PER_A3_TO_G_PER_CM3 } from './density';
import { atomContributions } from './weights';

export type DensityUnit = 'atoms/Å³' | 'atoms/Å²' | 'atoms/Å';

export interface ModelDensity {
  dim: 1 | 2 | 3;
  unit: DensityUnit;
  /** Occupancy-weighted atoms per unit length, area or volume. */
  number: number;
  /** g/cm³ (3D only). */
  mass?: number;
  /** Atoms counted and the length (Å), area (Å²) or volume (Å³) they were counted in. */
  atoms: number;
  measure: number;
  /** In words: which region was used, e.g. "patch sphere, R = 10 Å". */
  region: string;
}

interface ModelLike {
  family?: string;
  mode?: string;
  radius?: number;
  centre?: number[];
  edge?: number;
  layers?: number;
  spacing?: number;
  shift?: number[];
}

function weightOf(s: Structure, i: number): [number, number] {
  let w = 0;
  let m = 0;
  for (const [z, f] of atomContributions(s, i)) {
    w += f;
    m += f * atomicWeight(z);
  }
  return [w, m];
}

function counted(s: Structure, keep: (i: number) => boolean): [number, number] {
  let atoms = 0;
  let mass = 0;
  for (let i = 0; i < s.species.length; i++) {
    if (!keep(i)) continue;
    const [w, m] = weightOf(s, i);
    atoms += w;
    mass += m;
  }
  return [atoms, mass];
}

function three(s: Structure): ModelDensity {
  const m = (s.model ?? {}) as ModelLike;
  const p = s.positions;
  if (!s.cell && m.family === 'decagonal' && m.radius && m.layers && m.spacing && m.edge) {
    const Rin = m.radius - m.edge;
    if (Rin > 0) {
      const shift = m.shift ?? [0, 0];
      const [atoms, mass] = counted(s, (i) => {
        const k = Math.round(p[3 * i + 2] / m.spacing!);
        return (p[3 * i] - k * shift[0]) ** 2 + (p[3 * i + 1] - k * shift[1]) ** 2 <= Rin * Rin * (1 + 1e-9);
      });
      const V = Math.PI * Rin * Rin * m.layers * m.spacing;
      return { dim: 3, unit: 'atoms/Å³', number: atoms / V, mass: (mass / V) * U_PER_A3_TO_G_PER_CM3, atoms, measure: V, region: `layer discs, R = ${Rin.toFixed(3)} Å × ${m.layers} layers of ${m.spacing} Å` };
    }
  }
  const d = density(s);
  const region =
    d.region.method === 'cell'
      ? 'cell'
      : d.region.method === 'patch-sphere'
        ? `patch sphere, R = ${d.region.radius} Å`
        : d.region.method === 'inner-ball'
          ? `inner ball, R = ${d.region.radius!.toFixed(3)} Å about the centroid`
          : 'given volume';
  return { dim: 3, unit: 'atoms/Å³', number: d.numberDensity, mass: d.massDensity, atoms: d.atoms, measure: d.region.volume, region };
}

function two(s: Structure): ModelDensity {
  const m = (s.model ?? {}) as ModelLike;
  const p = s.positions;
  const n = s.species.length;
  if (s.cell) {
    const area = norm(cross(s.cell[0], s.cell[1]));
    const [atoms] = counted(s, () => true);
    return { dim: 2, unit: 'atoms/Å²', number: atoms / area, atoms, measure: area, region: 'cell area |a × b|' };
  }
  let R: number;
  let cx = 0;
  let cy = 0;
  let region: string;
  if (m.radius && m.edge && m.radius > m.edge) {
    R = m.radius - m.edge;
    region = `disc R − edge = ${R.toFixed(3)} Å (fully tiled)`;
  } else {
    // Any other finite 2D set: the inner disc about the centroid, half the distance to the bounding box's nearest side.
    let lx = Infinity;
    let hx = -Infinity;
    let ly = Infinity;
    let hy = -Infinity;
    for (let i = 0; i < n; i++) {
      cx += p[3 * i] / n;
      cy += p[3 * i + 1] / n;
      lx = Math.min(lx, p[3 * i]);
      hx = Math.max(hx, p[3 * i]);
      ly = Math.min(ly, p[3 * i + 1]);
      hy = Math.max(hy, p[3 * i + 1]);
    }
    R = 0.5 * Math.min(cx - lx, hx - cx, cy - ly, hy - cy);
    region = `inner disc, R = ${R.toFixed(3)} Å about the centroid`;
  }
  if (!(R > 0)) throw new Error('density: the tiling is too small to measure (no inner disc)');
  const [atoms] = counted(s, (i) => (p[3 * i] - cx) ** 2 + (p[3 * i + 1] - cy) ** 2 <= R * R * (1 + 1e-9));
  const area = Math.PI * R * R;
  return { dim: 2, unit: 'atoms/Å²', number: atoms / area, atoms, measure: area, region };
}

function one(s: Structure): ModelDensity {
  const p = s.positions;
  const n = s.species.length;
  const [atoms] = counted(s, () => true);
  if (s.cell) {
    const L = norm(s.cell[0]);
    return { dim: 1, unit: 'atoms/Å', number: atoms / L, atoms, measure: L, region: 'period |a|' };
  }
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < n; i++) {
    lo = Math.min(lo, p[3 * i]);
    hi = Math.max(hi, p[3 * i]);
  }
  if (!(hi > lo)) throw new Error('density: the chain needs at least two points');
  // N points on a segment span N − 1 gaps.
  return { dim: 1, unit: 'atoms/Å', number: (atoms - atoms / n) / (hi - lo), atoms, measure: hi - lo, region: `segment of ${(hi - lo).toFixed(3)} Å` };
}

/** Density of a cut in the unit of its dimension, over the region it fills (see the file comment). */
export function modelDensity(s: Structure): ModelDensity {
  validateStructure(s);
  if (s.species.length === 0) throw new Error('density: the structure is empty');
  const dim = s.dim ?? 3;
  return dim === 3 ? three(s) : dim === 2 ? two(s) : one(s);
}
