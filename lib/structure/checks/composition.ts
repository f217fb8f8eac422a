import { symbolOf } from '../elements';
import type { Structure } from '../types';
import { validateStructure } from '../validate';
import { atomContributions } from './weights';

export interface CompositionEntry {
  z: number;
  symbol: string;
  /** Occupancy-weighted count. */
  count: number;
  /** count / total. */
  fraction: number;
}

export interface Composition {
  /** Occupancy-weighted number of atoms. */
  total: number;
  /** Number of sites (points), regardless of occupancy. */
  sites: number;
  /** One entry per element present, by increasing atomic number (X = 0 first). */
  entries: CompositionEntry[];
  /** Formula-like text, e.g. "Al0.7250 Mn0.2750" (fractions, 4 decimals, by increasing Z). */
  formula: string;
}

/** Counts and fractions by element, weighted by occupancy (and mixed-site fractions). */
export function composition(s: Structure): Composition {
  validateStructure(s);
  const acc = new Map<number, number>();
  for (let i = 0; i < s.species.length; i++) {
    for (const [z, w] of atomContributions(s, i)) acc.set(z, (acc.get(z) ?? 0) + w);
  }
  let total = 0;
  for (const w of acc.values()) total += w;
  const entries = [...acc.entries()]
    .filter(([, w]) => w > 0)
    .sort((a, b) => a[0] - b[0])
    .map(([z, count]) => ({ z, symbol: symbolOf(z), count, fraction: total > 0 ? count / total : 0 }));
  return {
    total,
    sites: s.species.length,
    entries,
    formula: entries.map((e) => `${e.symbol}${e.fraction.toFixed(4)}`).join(' '),
  };
}
