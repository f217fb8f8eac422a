/**
 * VASP POSCAR (VASP 5 layout, as documented on the VASP wiki's POSCAR page): a comment line, the universal
 * scale 1.0, the three lattice vectors in Å (rows), the species line, the counts line, `Direct`, then one line of
 * fractional coordinates per atom, grouped by species in the order of the species line. Atoms are grouped by
 * increasing atomic number (their order within a species kept) and wrapped into [0, 1).
 */
import { ENGINE_VERSION } from '../version';
import { symbolOf } from '../structure/elements';
import type { Structure } from '../structure/types';
import { validateStructure } from '../structure/validate';
import { wrappedFractional } from '../structure/wrap';
import { composition } from '../structure/checks/composition';
import { fixed } from './number';
import { requireOrderedSites } from './ordered';

export interface SimulationWriteOptions {
  /** Check warnings to carry in the comment line (see lib/formats/write.ts exportComment). */
  comment?: string;
}

/** One comment line: engine, formula and whatever the caller adds (check warnings); never a newline. */
export function simulationComment(s: Structure, extra?: string): string {
  const formula = composition(s)
    .entries.map((e) => `${e.symbol}${Math.round(e.count)}`)
    .join('');
  const text = `Tauforge ${s.provenance.engine || ENGINE_VERSION} ${formula}${extra ? ` | ${extra}` : ''}`;
  return text.replace(/[\r\n]+/g, ' ');
}

/** Atom indices grouped by increasing atomic number, stable within a group; and the groups. */
export function groupBySpecies(s: Structure): { order: Uint32Array; species: number[]; counts: number[] } {
  const zs = [...new Set(s.species)].sort((a, b) => a - b);
  const order: number[] = [];
  const counts: number[] = [];
  for (const z of zs) {
    let k = 0;
    for (let i = 0; i < s.species.length; i++)
      if (s.species[i] === z) {
        order.push(i);
        k++;
      }
    counts.push(k);
  }
  return { order: Uint32Array.from(order), species: zs, counts };
}

export function writePoscar(s: Structure, opts: SimulationWriteOptions = {}): string {
  validateStructure(s);
  if (!s.cell) throw new Error('POSCAR needs a periodic cell: cut an approximant (a finite patch has no cell for VASP)');
  if (s.species.length === 0) throw new Error('POSCAR: the structure has no atoms');
  requireOrderedSites(s, 'POSCAR');
  const f = wrappedFractional(s);
  const { order, species, counts } = groupBySpecies(s);
  const out: string[] = [simulationComment(s, opts.comment), '1.0'];
  for (const v of s.cell) out.push(`  ${v.map((x) => fixed(x, 10).padStart(18)).join(' ')}`);
  out.push(`  ${species.map((z) => symbolOf(z).padStart(4)).join(' ')}`);
  out.push(`  ${counts.map((c) => String(c).padStart(4)).join(' ')}`);
  out.push('Direct');
  for (const i of order) out.push(`  ${fixed(f[3 * i], 10)} ${fixed(f[3 * i + 1], 10)} ${fixed(f[3 * i + 2], 10)}`);
  return out.join('\n') + '\n';
}
