/**
 * Scattering groups: atoms that share one scattering factor g(Q) — the same composition (species or
 * a site class's mixed occupancy) and the same isotropic B. Sums are done per group, so the form
 * factor and Debye–Waller factor are evaluated once per group and |Q|, not once per atom.
 *
 * g(s) = Σ_z x_z f_z(s) · exp(−B s²), s = sinθ/λ (Debye–Waller for isotropic B; U_iso = B / 8π²).
 * Per-atom weight = occupancy: Structure.occupancy[i] when present, else the site class occupancy, else 1.
 */
import type { Structure } from '../structure/types';
import { scatteringFactor, tableSymbol, type Radiation } from './form-factors';

export interface ScatteringGroup {
  /** [atomic number, fraction] pairs. */
  parts: [number, number][];
  /** Isotropic displacement parameter B in Å². */
  biso: number;
  /** Human-readable label, e.g. "Al" or "Al0.6Pd0.4 B=0.5". */
  label: string;
}

export interface GroupedAtoms {
  groups: ScatteringGroup[];
  /** Group index per atom. */
  groupOf: Uint16Array;
  /** Occupancy weight per atom. */
  weight: Float64Array;
}

/** Assign every atom of a structure to a scattering group (deterministic order of first appearance). */
export function groupAtoms(s: Structure): GroupedAtoms {
  const n = s.species.length;
  const groupOf = new Uint16Array(n);
  const weight = new Float64Array(n);
  const groups: ScatteringGroup[] = [];
  const keyIndex = new Map<string, number>();
  for (let i = 0; i < n; i++) {
    const sc = s.site && s.siteClasses ? s.siteClasses[s.site[i]] : undefined;
    if (s.site && s.siteClasses && !sc) {
      throw new Error(`site: atom ${i} refers to site class ${s.site[i]}, but only ${s.siteClasses.length} exist`);
    }
    let parts: [number, number][];
    if (sc?.mix && Object.keys(sc.mix).length > 0) {
      parts = Object.entries(sc.mix)
        .map(([z, x]) => [Number(z), x] as [number, number])
        .sort((a, b) => a[0] - b[0]);
    } else {
      parts = [[s.species[i], 1]];
    }
    const biso = sc?.biso ?? 0;
    if (!Number.isFinite(biso)) throw new Error(`siteClasses[${s.site?.[i]}].biso: must be a finite number`);
    const occ = s.occupancy ? s.occupancy[i] : (sc?.occupancy ?? 1);
    if (!Number.isFinite(occ) || occ < 0) throw new Error(`occupancy: atom ${i} has invalid occupancy ${occ}`);
    const key = parts.map(([z, x]) => `${z}:${x}`).join(',') + `|${biso}`;
    let g = keyIndex.get(key);
    if (g === undefined) {
      g = groups.length;
      if (g > 65535) throw new Error('siteClasses: too many distinct scattering groups (over 65535)');
      keyIndex.set(key, g);
      const label =
        parts.map(([z, x]) => (parts.length === 1 ? tableSymbol(z) : `${tableSymbol(z)}${x}`)).join('') + (biso ? ` B=${biso}` : '');
      groups.push({ parts, biso, label });
    }
    groupOf[i] = g;
    weight[i] = occ;
  }
  return { groups, groupOf, weight };
}

/** g(s²) for one group: composition-weighted scattering factor times exp(−B s²). */
export function groupFactor(group: ScatteringGroup, radiation: Radiation, s2: number): number {
  let f = 0;
  for (const [z, x] of group.parts) f += x * scatteringFactor(radiation, z, s2);
  return group.biso ? f * Math.exp(-group.biso * s2) : f;
}

/**
 * Mean squared scattering factor of a group, ⟨f²⟩ = Σ_z x_z f_z(s)² (no Debye–Waller factor): the self
 * (i = j) term of the Debye sum for a site occupied at random by species z with fractions x_z. It is
 * larger than ⟨f⟩² = (Σ x_z f_z)² by the Laue monotonic term Σ x_z (f_z − ⟨f⟩)² (Warren, X-ray
 * Diffraction, 1969, ch. 12).
 */
export function groupSelfFactor(group: ScatteringGroup, radiation: Radiation, s2: number): number {
  let f2 = 0;
  for (const [z, x] of group.parts) f2 += x * scatteringFactor(radiation, z, s2) ** 2;
  return f2;
}
