/**
 * Supercells n₁ × n₂ × n₃ of a periodic structure: the cell vectors multiplied by nᵢ and every atom repeated at
 * the lattice translations i·a + j·b + k·c, 0 ≤ i < n₁ … — the same order as ase.Atoms.repeat (the whole
 * original cell first for translation (0,0,0), then (0,0,1), … with the last index fastest), so a test can
 * compare atom by atom with ASE.
 */
import type { Structure } from './types';
import { validateStructure } from './validate';

export type SupercellSize = [number, number, number];

/** Most copies of the cell one supercell may hold (a 10×10×10 block): larger requests are a typo or a mistake. */
export const MAX_SUPERCELL_COPIES = 1000;

/** Parse "2x2x1" (also "2×2×1", "2,2,1", "2 2 1") into [2, 2, 1]; clear errors for anything else. */
export function parseSupercell(text: string): SupercellSize {
  const parts = text.trim().split(/\s*[x×,\s]\s*/i);
  if (parts.length !== 3 || !parts.every((p) => /^\d+$/.test(p))) {
    throw new Error(`supercell: expected three positive whole numbers such as 2x2x1, got "${text}"`);
  }
  const n = parts.map(Number) as SupercellSize;
  checkSupercell(n);
  return n;
}

export function checkSupercell(n: readonly number[]): void {
  if (n.length !== 3 || !n.every((k) => Number.isInteger(k) && k >= 1)) {
    throw new Error(`supercell: each repeat must be a whole number ≥ 1, got ${n.join('×')}`);
  }
  if (n[0] * n[1] * n[2] > MAX_SUPERCELL_COPIES) {
    throw new Error(`supercell: ${n.join('×')} = ${n[0] * n[1] * n[2]} copies of the cell is more than ${MAX_SUPERCELL_COPIES}`);
  }
}

/** The n₁×n₂×n₃ supercell. Per-atom arrays (species, site, occupancy, perp) are repeated with the atoms. */
export function supercell(s: Structure, n: SupercellSize): Structure {
  validateStructure(s);
  if (!s.cell) throw new Error('supercell: the structure has no cell; only periodic structures (approximants) can be repeated');
  checkSupercell(n);
  const [n1, n2, n3] = n;
  if (n1 === 1 && n2 === 1 && n3 === 1) return s;
  const copies = n1 * n2 * n3;
  const atoms = s.species.length;
  const [a, b, c] = s.cell;
  const positions = new Float64Array(3 * atoms * copies);
  const species = new Uint16Array(atoms * copies);
  const site = s.site ? new Uint16Array(atoms * copies) : undefined;
  const occupancy = s.occupancy ? new Float64Array(atoms * copies) : undefined;
  const d = s.perp && atoms > 0 ? s.perp.length / atoms : 0;
  const perp = s.perp ? new Float64Array(s.perp.length * copies) : undefined;
  let m = 0;
  for (let i = 0; i < n1; i++)
    for (let j = 0; j < n2; j++)
      for (let k = 0; k < n3; k++, m++) {
        const t = [0, 1, 2].map((x) => i * a[x] + j * b[x] + k * c[x]);
        for (let q = 0; q < atoms; q++) {
          const o = m * atoms + q;
          for (let x = 0; x < 3; x++) positions[3 * o + x] = s.positions[3 * q + x] + t[x];
        }
        species.set(s.species, m * atoms);
        if (site && s.site) site.set(s.site, m * atoms);
        if (occupancy && s.occupancy) occupancy.set(s.occupancy, m * atoms);
        if (perp && s.perp) perp.set(s.perp, m * atoms * d);
      }
  const out: Structure = {
    ...s,
    positions,
    species,
    cell: [a.map((v) => v * n1), b.map((v) => v * n2), c.map((v) => v * n3)] as Structure['cell'],
    notes: [...(s.notes ?? []), `supercell ${n1}×${n2}×${n3} of the cut (${atoms} atoms per cell, ${atoms * copies} in all)`],
  };
  if (site) out.site = site;
  if (occupancy) out.occupancy = occupancy;
  if (perp) out.perp = perp;
  // Tiles index into the original cell's points; they do not carry over.
  delete out.tiles;
  return out;
}
