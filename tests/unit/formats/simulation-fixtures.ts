/** Structures shared by the POSCAR / LAMMPS / supercell tests (not a test file itself). */
import { generate } from '@/lib/models';
import type { Structure } from '@/lib/structure';

/** A triclinic cell with atoms inside and outside it (fractional −0.3 … 1.4), three species. */
export function triclinic(): Structure {
  return {
    positions: new Float64Array([0.1, 0.2, 0.3, 5.5, 1.6, 1.7, 2.25, -0.9, 3.5, 9.2, 8.4, 10.1, -1.3, 3.3, 4.4, 4.0, 4.0, 12.5]),
    species: new Uint16Array([13, 25, 13, 29, 13, 25]),
    cell: [
      [8.1, 0.2, -0.1],
      [2.3, 7.9, 0.4],
      [-1.4, 1.2, 9.3],
    ],
    provenance: { engine: 'tauforge-engine/0.1.0', params: { test: 'triclinic' } },
  };
}

/** The default 2/1 approximant (136 vertices) with two species, alternating, as a realistic cubic cell. */
export function approximant21(): Structure {
  const s = generate({ family: 'icosahedral', mode: 'approximant', order: '2/1', aR: 4.6, lattice: 'P', species: 'Al' });
  const species = Uint16Array.from(s.species, (_, i) => (i % 4 === 0 ? 25 : 13));
  return { ...s, species, site: undefined, siteClasses: undefined };
}

export function asJson(s: Structure): string {
  return JSON.stringify({ cell: s.cell, positions: Array.from(s.positions), numbers: Array.from(s.species) });
}
