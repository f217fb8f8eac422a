/**
 * Atomic radii for the Check step: which contacts are physically impossible.
 *
 * Source: metallic radii for twelve-fold coordination (CN 12) from pymatgen 2022.11.7
 * (`Element.metallic_radius`, the "Metallic radius" field of pymatgen/core/periodic_table.json), written to
 * ./data/radii-data.ts by ./data/generate-radii.py. pymatgen names no reference for the field; the values are
 * the usual CN-12 table (e.g. Greenwood & Earnshaw, Chemistry of the Elements, 2nd ed. 1997 — from memory).
 * Quasicrystals and their approximants are intermetallics with coordination numbers 12–16, so CN-12 metallic
 * radii are the natural yardstick. For elements without a metallic radius (non-metals: B, C, Si, P, …) we fall
 * back to the Cordero et al. (2008) covalent radius already in ./elements.ts, and say so through
 * `radiusSource`.
 */
import { METALLIC_RADII } from './data/radii-data';
import { covalentRadius, MAX_Z } from './elements';

/** Where a contact radius came from. */
export type RadiusSource = 'metallic' | 'covalent' | 'none';

/**
 * Fraction of r₁ + r₂ below which a pair is "too close".
 *
 * Common practice (from memory): structure-search and model-building codes reject contacts shorter than about
 * 0.7–0.8 of the sum of the atomic radii. We take 0.8 because real intermetallics stay above it: the shortest
 * contacts known in Al–transition-metal phases (Al–Co, Al–Fe ≈ 2.35–2.45 Å in Al₁₃Co₄ / Al₁₃Fe₄, from memory) are
 * about 0.87–0.90 of the CN-12 sum, and ordinary nearest neighbours are ≈ 0.95–1.0 of it. Anything below 0.8
 * means two atoms overlap — a decoration error, not chemistry.
 */
export const TOO_CLOSE_FRACTION = 0.8;

function checkZ(z: number): void {
  if (!Number.isInteger(z) || z < 0 || z > MAX_Z) {
    throw new RangeError(`atomic number ${z} is out of range (expected an integer 0..${MAX_Z})`);
  }
}

/** Metallic radius (CN 12) in Å from the pymatgen table; NaN where it has none (non-metals, X). */
export function metallicRadius(z: number): number {
  checkZ(z);
  return METALLIC_RADII[z];
}

/** Which table `contactRadius(z)` comes from. */
export function radiusSource(z: number): RadiusSource {
  if (Number.isFinite(metallicRadius(z))) return 'metallic';
  if (Number.isFinite(covalentRadius(z))) return 'covalent';
  return 'none';
}

/**
 * Radius used for contacts: the CN-12 metallic radius, else the covalent radius (Cordero 2008), else NaN
 * (X = unassigned tiling vertex, Bk, Cf).
 */
export function contactRadius(z: number): number {
  const m = metallicRadius(z);
  return Number.isFinite(m) ? m : covalentRadius(z);
}

/**
 * Shortest acceptable distance in Å between atoms z₁ and z₂: TOO_CLOSE_FRACTION · (r₁ + r₂) with contact radii.
 * NaN when either element has no radius (for example X, an unassigned vertex): callers then skip the test.
 */
export function tooCloseThreshold(z1: number, z2: number): number {
  return TOO_CLOSE_FRACTION * (contactRadius(z1) + contactRadius(z2));
}
