import { MAX_Z } from './elements';
import type { Structure } from './types';

/**
 * Throws a clear error if the arrays of a Structure disagree in length or hold non-finite values.
 * Writers and checks call this first so a bad Structure fails loudly instead of writing a bad file.
 */
export function validateStructure(s: Structure): void {
  const n = s.species.length;
  if (s.positions.length !== 3 * n) {
    throw new Error(`structure: positions has ${s.positions.length} numbers, expected 3 × ${n} species = ${3 * n}`);
  }
  for (let i = 0; i < s.positions.length; i++) {
    if (!Number.isFinite(s.positions[i])) {
      throw new Error(`structure: atom ${Math.floor(i / 3)} has a non-finite coordinate (${s.positions[i]})`);
    }
  }
  for (let i = 0; i < n; i++) {
    if (s.species[i] > MAX_Z) throw new Error(`structure: atom ${i} has atomic number ${s.species[i]} > ${MAX_Z}`);
  }
  if (s.site) {
    if (s.site.length !== n) throw new Error(`structure: site has ${s.site.length} entries, expected ${n}`);
    const k = s.siteClasses?.length;
    if (k !== undefined) {
      for (let i = 0; i < n; i++) {
        if (s.site[i] >= k) throw new Error(`structure: atom ${i} has site class ${s.site[i]} but only ${k} classes exist`);
      }
    }
  }
  if (s.occupancy && s.occupancy.length !== n) {
    throw new Error(`structure: occupancy has ${s.occupancy.length} entries, expected ${n}`);
  }
  if (s.perp) {
    const d = s.perpDim ?? (n > 0 ? s.perp.length / n : 0);
    if (n > 0 && (!Number.isInteger(d) || s.perp.length !== d * n)) {
      throw new Error(`structure: perp has ${s.perp.length} numbers, which is not perpDim × ${n} atoms`);
    }
  }
  if (s.cell) {
    for (const v of s.cell) {
      if (v.length !== 3 || !v.every(Number.isFinite)) throw new Error('structure: cell vectors must be three finite numbers each');
    }
  }
}

/** perpendicular-space dimension per point, inferred from perp when perpDim is absent. */
export function perpDimension(s: Structure): number {
  if (!s.perp) return 0;
  if (s.perpDim !== undefined) return s.perpDim;
  const n = s.species.length;
  return n > 0 ? s.perp.length / n : 0;
}
