/** Shared helpers for the diffraction tests: small crystals built from a cell and fractional sites. */
import type { Cell, Structure } from '../../../lib/structure/types';

/** A crystal from a cell and fractional sites (species per site). */
export function crystal(cell: Cell, sites: [number, number, number, number][], biso?: number): Structure {
  const n = sites.length;
  const positions = new Float64Array(3 * n);
  const species = new Uint16Array(n);
  sites.forEach(([z, x, y, w], i) => {
    species[i] = z;
    for (let c = 0; c < 3; c++) positions[3 * i + c] = x * cell[0][c] + y * cell[1][c] + w * cell[2][c];
  });
  const s: Structure = { positions, species, cell, provenance: { params: { test: true }, engine: 'test' } };
  if (biso !== undefined) {
    s.site = new Uint16Array(n);
    const zs = [...new Set(sites.map((t) => t[0]))];
    s.siteClasses = zs.map((z) => ({ name: `Z${z}`, species: z, biso }));
    sites.forEach(([z], i) => (s.site![i] = zs.indexOf(z)));
  }
  return s;
}

export function cubic(a: number): Cell {
  return [
    [a, 0, 0],
    [0, a, 0],
    [0, 0, a],
  ];
}

export const FCC: [number, number, number][] = [
  [0, 0, 0],
  [0, 0.5, 0.5],
  [0.5, 0, 0.5],
  [0.5, 0.5, 0],
];
