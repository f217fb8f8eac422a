import type { Structure } from '../types';

/**
 * Occupancy-weighted species contributions of atom i: [atomic number, weight][].
 * Per-atom occupancy wins over the site class's occupancy (default 1); a site class with `mix`
 * splits the weight by its fractions (a mix summing to < 1 leaves the rest vacant).
 */
export function atomContributions(s: Structure, i: number): [number, number][] {
  const cls = s.site && s.siteClasses ? s.siteClasses[s.site[i]] : undefined;
  const occ = s.occupancy ? s.occupancy[i] : (cls?.occupancy ?? 1);
  if (cls?.mix) {
    return Object.entries(cls.mix)
      .map(([z, f]) => [Number(z), occ * f] as [number, number])
      .sort((a, b) => a[0] - b[0]);
  }
  return [[s.species[i], occ]];
}
