/**
 * POSCAR and LAMMPS data files hold whole atoms of one element each: no partial occupancy, no mixed sites,
 * no dummy atoms. A cut that has them cannot be written there without changing the model, so the writers
 * refuse it and name the site — silently keeping the majority element would hand a DFT or MD code a
 * different material than the one on screen.
 */
import { symbolOf } from '../structure/elements';
import type { Structure } from '../structure/types';
import { atomContributions } from '../structure/checks/weights';

/** Throws when some atom is not one whole atom of a real element; the message names the site and the way out. */
export function requireOrderedSites(s: Structure, format: string): void {
  for (let i = 0; i < s.species.length; i++) {
    const c = atomContributions(s, i);
    const cls = s.site && s.siteClasses ? s.siteClasses[s.site[i]] : undefined;
    const where = cls ? `site class "${cls.name}" (atom ${i + 1})` : `atom ${i + 1}`;
    if (c.length > 1 || c.some(([, w]) => Math.abs(w - 1) > 1e-9)) {
      const what = c.map(([z, w]) => `${(100 * w).toFixed(1).replace(/\.0$/, '')} % ${symbolOf(z)}`).join(', ');
      // A weight the class did not ask for comes from the cut: a site on the occupation-domain boundary of a
      // symmetric cut (approximant.ts gives it the m-3-averaged weight, e.g. ½ in the P 1/1).
      if (c.length === 1 && cls && cls.occupancy === undefined && !cls.mix) {
        throw new Error(
          `${format} holds whole atoms only, but ${where} lies on the window boundary of the symmetric cut and carries the weight ${what} ` +
            '(no whole-atom choice keeps the cubic symmetry there). For whole atoms: give the cut a generic phason offset, e.g. (0.1, 0.2, 0.3) Å — the cell keeps its size and atom count, the space group may drop (the notes say which) — ' +
            'or use a site class whose window avoids the boundary (the cluster presets’ classes do); or export as CIF or extended XYZ, which keep the weights.',
        );
      }
      const preset = cls && c.length > 1 && /: /.test(cls.name) ? ' For a cluster preset, set its Species per shell (one element per shell).' : '';
      throw new Error(
        `${format} holds whole atoms only, but ${where} is a ${c.length > 1 ? 'mixed' : 'partially occupied'} site (${what}). ` +
          'Build an ordered variant first: give the site one element with full occupancy (for example its majority element, or order the mix over a supercell), or export as CIF or extended XYZ, which keep occupancies.' +
          preset,
      );
    }
    if (c[0][0] === 0) {
      throw new Error(
        `${format} needs an element on every atom, but ${where} is an unassigned vertex (X). Decorate the model or give the vertices an element.`,
      );
    }
  }
}
