/** What the scene needs from a Structure, computed once per structure (and per radius scale). */
import type { Structure } from '@/lib/structure/types';
import { distinctSpecies, speciesColour, speciesRadius } from '@/lib/view/palette';
import type { Vec3 } from '@/lib/math/vec3';

export interface SpeciesBatch {
  z: number;
  colour: string;
  /** Atom indices of this species. */
  indices: Uint32Array;
  /** Their centres, packed xyz, Float32 for the GPU. */
  centres: Float32Array;
}

export interface SceneData {
  batches: SpeciesBatch[];
  /** Centre of the bounding box. */
  centre: Vec3;
  /** Radius of the bounding sphere about `centre`, including the largest atom. */
  radius: number;
  largestAtom: number;
}

export function sceneData(structure: Structure, radiusScale: number): SceneData {
  const { positions, species } = structure;
  const n = species.length;
  let x0 = Infinity, y0 = Infinity, z0 = Infinity, x1 = -Infinity, y1 = -Infinity, z1 = -Infinity;
  for (let i = 0; i < n; i++) {
    const x = positions[3 * i], y = positions[3 * i + 1], z = positions[3 * i + 2];
    x0 = Math.min(x0, x); y0 = Math.min(y0, y); z0 = Math.min(z0, z);
    x1 = Math.max(x1, x); y1 = Math.max(y1, y); z1 = Math.max(z1, z);
  }
  if (structure.cell) {
    // Frame the cell too: its eight corners from the origin.
    const [a, b, c] = structure.cell;
    for (let k = 0; k < 8; k++) {
      const p = [0, 1, 2].map((d) => (k & 1 ? a[d] : 0) + (k & 2 ? b[d] : 0) + (k & 4 ? c[d] : 0));
      x0 = Math.min(x0, p[0]); y0 = Math.min(y0, p[1]); z0 = Math.min(z0, p[2]);
      x1 = Math.max(x1, p[0]); y1 = Math.max(y1, p[1]); z1 = Math.max(z1, p[2]);
    }
  }
  if (!Number.isFinite(x0)) {
    x0 = y0 = z0 = -1;
    x1 = y1 = z1 = 1;
  }
  const centre: Vec3 = [(x0 + x1) / 2, (y0 + y1) / 2, (z0 + z1) / 2];
  const zs = distinctSpecies(species);
  const largestAtom = Math.max(0.1, ...zs.map((z) => speciesRadius(z, radiusScale)));
  // Bounding sphere about the box centre (tighter than half the box diagonal for a ball of atoms).
  let r2 = 0;
  for (let i = 0; i < n; i++) {
    const dx = positions[3 * i] - centre[0], dy = positions[3 * i + 1] - centre[1], dz = positions[3 * i + 2] - centre[2];
    r2 = Math.max(r2, dx * dx + dy * dy + dz * dz);
  }
  if (structure.cell) r2 = Math.max(r2, ((x1 - x0) ** 2 + (y1 - y0) ** 2 + (z1 - z0) ** 2) / 4);
  const radius = Math.max(1, Math.sqrt(r2) + largestAtom);
  const counts = new Map<number, number>(zs.map((z) => [z, 0]));
  for (let i = 0; i < n; i++) counts.set(species[i], (counts.get(species[i]) ?? 0) + 1);
  const batches: SpeciesBatch[] = zs.map((z) => ({
    z,
    colour: speciesColour(z),
    indices: new Uint32Array(counts.get(z) ?? 0),
    centres: new Float32Array(3 * (counts.get(z) ?? 0)),
  }));
  const slot = new Map<number, { b: SpeciesBatch; k: number }>(batches.map((b) => [b.z, { b, k: 0 }]));
  for (let i = 0; i < n; i++) {
    const s = slot.get(species[i])!;
    s.b.indices[s.k] = i;
    s.b.centres.set([positions[3 * i], positions[3 * i + 1], positions[3 * i + 2]], 3 * s.k);
    s.k++;
  }
  return { batches, centre, radius, largestAtom };
}

/** Drawn radius of every atom, for picking. */
export function atomRadii(species: Uint16Array, radiusScale: number): Float32Array {
  const byZ = new Map<number, number>();
  const out = new Float32Array(species.length);
  for (let i = 0; i < species.length; i++) {
    let r = byZ.get(species[i]);
    if (r === undefined) {
      r = speciesRadius(species[i], radiusScale);
      byZ.set(species[i], r);
    }
    out[i] = r;
  }
  return out;
}
