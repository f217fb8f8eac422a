import { ATOMIC_WEIGHTS, COVALENT_RADII, SYMBOLS } from './data/elements-data';

/** Highest atomic number Tauforge knows (Cf). */
export const MAX_Z = 98;

const BY_SYMBOL: ReadonlyMap<string, number> = new Map(SYMBOLS.map((s, z) => [s.toLowerCase(), z]));

function checkZ(z: number): void {
  if (!Number.isInteger(z) || z < 0 || z > MAX_Z) {
    throw new RangeError(`atomic number ${z} is out of range (expected an integer 0..${MAX_Z}; 0 = X, unassigned)`);
  }
}

/** Element symbol for an atomic number; 0 → "X" (unassigned tiling vertex). */
export function symbolOf(z: number): string {
  checkZ(z);
  return SYMBOLS[z];
}

/**
 * Atomic number for an element symbol, case-insensitive ("al", "AL", "Al" → 13); "X" → 0.
 * Throws a clear error on anything else.
 */
export function atomicNumber(symbol: string): number {
  const z = BY_SYMBOL.get(symbol.trim().toLowerCase());
  if (z === undefined) {
    throw new Error(`unknown element symbol "${symbol}" (expected H..Cf, or X for an unassigned site)`);
  }
  return z;
}

/** Like atomicNumber but returns undefined instead of throwing. */
export function tryAtomicNumber(symbol: string): number | undefined {
  return BY_SYMBOL.get(symbol.trim().toLowerCase());
}

/**
 * IUPAC standard atomic weight in u (Meija et al., Pure Appl. Chem. 88 (2016) 265, as tabulated
 * by ase.data.atomic_masses_iupac2016). 0 for X.
 */
export function atomicWeight(z: number): number {
  checkZ(z);
  return ATOMIC_WEIGHTS[z];
}

/** Covalent radius in Å (Cordero et al., Dalton Trans. (2008) 2832); NaN where unknown (X, Bk, Cf). */
export function covalentRadius(z: number): number {
  checkZ(z);
  return COVALENT_RADII[z];
}
