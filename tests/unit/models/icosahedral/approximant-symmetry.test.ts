/**
 * Symmetric cuts and phason offsets of the cubic approximants and patches, checked against outside tools:
 * spglib (space group of each periodic cell, python3-spglib) and pymatgen's PointGroupAnalyzer (point group
 * of a finite patch, python3-pymatgen). Atoms with different occupancy are given different types, so a
 * symmetry the tools find also maps the fractional boundary sites onto each other.
 */
import { describe, expect, it } from 'vitest';
import { approximantFrame, approximantVertexCount, icosahedralApproximant, symmetricCentre } from '../../../../lib/models/icosahedral/approximant';
import { icosahedralPatch } from '../../../../lib/models/icosahedral/patch';
import type { Structure } from '../../../../lib/structure/types';
import { runPython } from '../../../helpers/python';

/** Ideal points per cell: model-set density × cell volume (Baake & Grimm, Aperiodic Order 1, 2013): P Σ|det M|, F half, I twice. */
function ideal(p: number, q: number, lattice: 'P' | 'F' | 'I'): number {
  const n = approximantVertexCount(p, q);
  return lattice === 'P' ? n : lattice === 'F' ? n / 2 : 2 * n;
}

function pointsPerCell(s: Structure): number {
  if (!s.occupancy) return s.species.length;
  return Math.round(Array.from(s.occupancy).reduce((a, b) => a + b, 0) * 1e6) / 1e6;
}

function typesByOccupancy(s: Structure): number[] {
  const occ = s.occupancy ?? new Float64Array(s.species.length).fill(1);
  const vals = [...new Set(Array.from(occ, (o) => Math.round(o * 1e6)))].sort((a, b) => a - b);
  return Array.from(occ, (o) => 1 + vals.indexOf(Math.round(o * 1e6)));
}

const SPGLIB = `
import sys, json, numpy as np, spglib
out = []
for s in json.load(sys.stdin):
    a = np.array(s['cell'])
    frac = np.array(s['pos']).reshape(-1, 3) @ np.linalg.inv(a)
    ds = spglib.get_symmetry_dataset((a, frac, s['types']), symprec=1e-3)
    out.append({'number': int(ds['number']), 'symbol': ds['international'], 'pointgroup': ds['pointgroup']})
print(json.dumps(out))
`;

function spglib(structures: Structure[]): { number: number; symbol: string; pointgroup: string }[] {
  const input = structures.map((s) => ({ cell: s.cell, pos: Array.from(s.positions), types: typesByOccupancy(s) }));
  return runPython(SPGLIB, JSON.stringify(input));
}

describe('symmetric approximant cuts (spglib, symprec 1e-3)', () => {
  const orders: [number, number][] = [[1, 1], [2, 1], [3, 2], [5, 3]];
  for (const lattice of ['P', 'F', 'I'] as const) {
    it(`${lattice}: 1/1, 2/1, 3/2, 5/3 have point group m-3 (or higher) and the ideal number of points per cell`, () => {
      const cells = orders.map(([p, q]) => icosahedralApproximant({ p, q, aR: 4.6, lattice }));
      const found = spglib(cells);
      cells.forEach((s, k) => {
        const [p, q] = orders[k];
        expect(['m-3', 'm-3m'], `${p}/${q} ${lattice}: ${found[k].symbol}`).toContain(found[k].pointgroup);
        expect(pointsPerCell(s)).toBe(ideal(p, q, lattice));
        // Whole atoms exactly when the reference position has no node on the window boundary.
        const whole = symmetricCentre(p, q, lattice).boundaryNodes === 0;
        expect(s.occupancy === undefined).toBe(whole);
        if (!whole) expect(s.notes?.join(' ')).toMatch(/fractional occupancy/);
      });
    });
  }

  it('2/1 and 3/2 P, and every I cell up to 5/3, come out with whole atoms (no node on the symmetric window boundary)', () => {
    for (const [p, q, l] of [[2, 1, 'P'], [3, 2, 'P'], [1, 1, 'I'], [2, 1, 'I'], [3, 2, 'I'], [5, 3, 'I']] as const) {
      const s = icosahedralApproximant({ p, q, aR: 4.6, lattice: l });
      expect(s.occupancy, `${p}/${q} ${l}`).toBeUndefined();
      expect(s.species.length).toBe(ideal(p, q, l));
    }
  });
});

/** Do two periodic point sets (same cubic cell) agree up to one translation? Brute force over the first point's partners. */
function sameUpToTranslation(a: Structure, b: Structure): boolean {
  if (a.species.length !== b.species.length) return false;
  const L = a.cell![0][0];
  const n = a.species.length;
  const key = (x: number, y: number, z: number) => [x, y, z].map((v) => Math.round((((v % L) + L) % L) / L * 1e5) % 1e5).join(',');
  const setB = new Set<string>();
  for (let j = 0; j < n; j++) setB.add(key(b.positions[3 * j], b.positions[3 * j + 1], b.positions[3 * j + 2]));
  for (let j = 0; j < n; j++) {
    const t = [0, 1, 2].map((c) => b.positions[3 * j + c] - a.positions[c]);
    let ok = true;
    for (let i = 0; i < n && ok; i++) ok = setB.has(key(a.positions[3 * i] + t[0], a.positions[3 * i + 1] + t[1], a.positions[3 * i + 2] + t[2]));
    if (ok) return true;
  }
  return false;
}

describe('phason offsets reduced modulo the perpendicular periods', () => {
  it('offset (60, 60, 60) Å gives the ideal count and the same cell as the reduced offset, up to a translation (1/1, 2/1, 5/3 P; 2/1 F; 3/2 I)', () => {
    for (const [p, q, l] of [[1, 1, 'P'], [2, 1, 'P'], [5, 3, 'P'], [2, 1, 'F'], [3, 2, 'I']] as const) {
      const far = icosahedralApproximant({ p, q, aR: 4.6, lattice: l, offset: [60, 60, 60] });
      expect(pointsPerCell(far), `${p}/${q} ${l}`).toBe(ideal(p, q, l));
      // The perpendicular periods contain 2λ along each axis (M₁ − M₂ = 2p·x̂, −M₅ − M₆ = 2q·x̂): reduce by hand.
      const lam = approximantFrame(p, q, 4.6).lambda;
      const red = 60 - 2 * lam * Math.round(60 / (2 * lam));
      const near = icosahedralApproximant({ p, q, aR: 4.6, lattice: l, offset: [red, red, red] });
      expect(sameUpToTranslation(far, near), `${p}/${q} ${l}`).toBe(true);
      expect(far.notes?.join(' ')).toMatch(/reduced modulo the perpendicular periods/);
    }
  });

  it('a generic offset gives whole atoms, the ideal count, and a note that the symmetry is lowered (spglib finds less than m-3)', () => {
    const s = icosahedralApproximant({ p: 2, q: 1, aR: 4.6, offset: [0.31, 0.17, 0.05] });
    expect(s.occupancy).toBeUndefined();
    expect(s.species.length).toBe(136);
    expect(s.notes?.join(' ')).toMatch(/moves the window off every m-3-symmetric position/);
    const [found] = spglib([s]);
    expect(['m-3', 'm-3m']).not.toContain(found.pointgroup);
  });
});

const PGA = `
import sys, json
from pymatgen.core import Molecule
from pymatgen.symmetry.analyzer import PointGroupAnalyzer
els = ['Al', 'Cu', 'Fe', 'Ni', 'Co', 'Zn', 'Mn', 'Si']
out = []
for s in json.load(sys.stdin):
    pos = s['pos']
    coords = [pos[3*i:3*i+3] for i in range(len(pos)//3)]
    mol = Molecule([els[t - 1] for t in s['types']], coords)
    out.append(PointGroupAnalyzer(mol, tolerance=0.01).sch_symbol)
print(json.dumps(out))
`;

describe('icosahedral patches (pymatgen PointGroupAnalyzer)', () => {
  it('patches of radius 10 Å about the origin at offset 0 keep the icosahedral point group Ih (P and I); a generic offset breaks it', () => {
    const patches = [
      icosahedralPatch({ aR: 4.6, radius: 10, lattice: 'P' }),
      icosahedralPatch({ aR: 4.6, radius: 10, lattice: 'I' }),
      icosahedralPatch({ aR: 4.6, radius: 10, lattice: 'F' }),
      icosahedralPatch({ aR: 4.6, radius: 10, lattice: 'P', offset: [0.31, 0.17, 0.05] }),
    ];
    const found = runPython<string[]>(PGA, JSON.stringify(patches.map((s) => ({ pos: Array.from(s.positions), types: typesByOccupancy(s) }))));
    expect(found.slice(0, 3)).toEqual(['Ih', 'Ih', 'Ih']);
    expect(found[3]).not.toBe('Ih');
    expect(patches[0].notes?.join(' ')).toMatch(/fractional occupancy/);
    expect(patches[3].notes?.join(' ')).toMatch(/lowers the point group of the patch/);
  });
});
