/**
 * Space groups from moyo (WebAssembly) against spglib (python3-spglib, a separate implementation of the same
 * method, run as the outside reference) on a cubic approximant, hexagonal Mg (P6₃/mmc, No. 194 — handbook
 * structure of magnesium, hcp, a = 3.209 Å, c = 5.211 Å, from memory), a CIF as a user would upload it
 * (NaCl in F m -3 m, No. 225, a = 5.64 Å — textbook rock salt) and a jittered cell that `symmetrise` snaps back.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { ensureSymmetry } from '../../../lib/server/symmetry-wasm';
import { findSpaceGroup, inStandardOrigin, nearSymmetry, siteTypes, spaceGroupOf, symmetrise } from '../../../lib/structure/symmetry';
import { icosahedralApproximant } from '../../../lib/models/icosahedral/approximant';
import { readCif } from '../../../lib/formats/cif';
import type { Cell, Structure } from '../../../lib/structure/types';
import { runPython } from '../../helpers/python';

beforeAll(() => ensureSymmetry());

const SPG = `
import sys, json, numpy as np, spglib
out = []
for s in json.load(sys.stdin):
    a = np.array(s['cell']); frac = np.array(s['pos']).reshape(-1, 3) @ np.linalg.inv(a)
    ds = spglib.get_symmetry_dataset((a, frac, s['types']), symprec=s['symprec'])
    out.append({'number': int(ds['number']), 'ops': len(ds['rotations']), 'pg': ds['pointgroup'], 'equiv': [int(x) for x in ds['equivalent_atoms']]})
print(json.dumps(out))
`;

function spglib(list: { s: Structure; symprec?: number }[]): { number: number; ops: number; pg: string; equiv: number[] }[] {
  return runPython(SPG, JSON.stringify(list.map(({ s, symprec }) => ({ cell: s.cell, pos: Array.from(s.positions), types: siteTypes(s), symprec: symprec ?? 1e-3 }))));
}

function crystal(cell: Cell, frac: number[][], species: number[]): Structure {
  const positions = new Float64Array(3 * frac.length);
  frac.forEach((f, i) => {
    for (let k = 0; k < 3; k++) positions[3 * i + k] = f[0] * cell[0][k] + f[1] * cell[1][k] + f[2] * cell[2][k];
  });
  return { positions, species: Uint16Array.from(species), cell, provenance: { params: null, engine: 'test' } };
}

const a = 3.209;
const c = 5.211;
const mg = crystal([[a, 0, 0], [-a / 2, (a * Math.sqrt(3)) / 2, 0], [0, 0, c]], [[1 / 3, 2 / 3, 1 / 4], [2 / 3, 1 / 3, 3 / 4]], [12, 12]);

const NACL = `data_nacl
_cell_length_a 5.64
_cell_length_b 5.64
_cell_length_c 5.64
_cell_angle_alpha 90
_cell_angle_beta 90
_cell_angle_gamma 90
_symmetry_space_group_name_H-M 'F m -3 m'
loop_
_symmetry_equiv_pos_as_xyz
x,y,z
-x,-y,z
-x,y,-z
x,-y,-z
z,x,y
z,-x,-y
-z,-x,y
-z,x,-y
y,z,x
-y,z,-x
y,-z,-x
-y,-z,x
-x,-y,-z
x,y,-z
x,-y,z
-x,y,z
-z,-x,-y
-z,x,y
z,x,-y
z,-x,y
-y,-z,-x
y,-z,x
-y,z,x
y,z,-x
x,y+1/2,z+1/2
x+1/2,y,z+1/2
x+1/2,y+1/2,z
loop_
_atom_site_label
_atom_site_type_symbol
_atom_site_fract_x
_atom_site_fract_y
_atom_site_fract_z
Na1 Na 0 0 0
Cl1 Cl 0.5 0.5 0.5
`;

describe('findSpaceGroup (moyo) agrees with spglib', () => {
  it('on a 2/1 and a 1/1 cubic approximant, hexagonal Mg and an uploaded NaCl CIF: number, order of the group, point group', () => {
    const nacl = readCif(NACL);
    // The listed operations above are a generating subset (m-3 and the centring): enough for rock salt's 8 atoms.
    expect(nacl.species.length).toBe(8);
    const cases = [icosahedralApproximant({ p: 2, q: 1, aR: 4.6 }), icosahedralApproximant({ p: 1, q: 1, aR: 4.6 }), mg, nacl];
    const ref = spglib(cases.map((s) => ({ s })));
    const expected = [205, 204, 194, 225];
    cases.forEach((s, k) => {
      const g = findSpaceGroup(s);
      expect(g.number).toBe(ref[k].number);
      expect(g.number).toBe(expected[k]);
      expect(g.operations.length).toBe(ref[k].ops);
      expect(g.pointGroup).toBe(ref[k].pg);
      // Same partition into orbits (representatives may differ; compare the induced equivalence).
      const same = (eq: number[]) => eq.map((r) => eq.indexOf(r));
      expect(same(g.orbits)).toEqual(same(ref[k].equiv));
    });
    expect(findSpaceGroup(mg).hmSymbol).toBe('P 6_3/m m c');
    expect(spaceGroupOf(nacl)).toEqual({ number: 225, symbol: 'F m -3 m' });
  });

  it('spaceGroupOf is null for a finite patch; findSpaceGroup says why', () => {
    const patch: Structure = { positions: new Float64Array(3), species: Uint16Array.from([13]), provenance: { params: null, engine: 'test' } };
    expect(spaceGroupOf(patch)).toBeNull();
    expect(() => findSpaceGroup(patch)).toThrow(/periodic cell/);
  });

  it('symmetrise snaps a cell jittered by up to 2e-4 Å back: spglib at symprec 1e-6 then finds the full group again', () => {
    const s = icosahedralApproximant({ p: 2, q: 1, aR: 4.6 });
    const jittered = { ...s, positions: s.positions.map((x, i) => x + 2e-4 * Math.sin(1.7 * i + 0.3)) };
    const [before] = spglib([{ s: jittered, symprec: 1e-6 }]);
    expect(before.number).toBe(1);
    const { structure, spaceGroup, maxShift } = symmetrise(jittered, { symprec: 1e-3 });
    expect(spaceGroup.number).toBe(205);
    expect(maxShift).toBeLessThan(1e-3);
    const [after] = spglib([{ s: structure, symprec: 1e-6 }]);
    expect(after.number).toBe(205);
  });

  it('nearSymmetry: a 2/1 cell jittered by 2 mÅ is P 1 strictly (as spglib at 1e-3) and P a -3 at 0.01 Å, so a snap is offered', () => {
    const s = icosahedralApproximant({ p: 2, q: 1, aR: 4.6 });
    const jittered = { ...s, positions: s.positions.map((x, i) => x + 2e-3 * Math.sin(1.7 * i + 0.3)) };
    const [strict, loose] = spglib([{ s: jittered, symprec: 1e-3 }, { s: jittered, symprec: 0.01 }]);
    const near = nearSymmetry(jittered)!;
    expect(near.strict.number).toBe(strict.number);
    expect(near.loose.number).toBe(loose.number);
    expect(near.loose).toMatchObject({ number: 205, symbol: 'P a -3', order: 24 });
    expect(near.higher).toBe(true);
    expect(nearSymmetry(s)!.higher).toBe(false);
  });

  it('inStandardOrigin moves the 2/1 cell so its operations are the tabulated ones of P a -3 (origin at -3)', () => {
    const std = inStandardOrigin(icosahedralApproximant({ p: 2, q: 1, aR: 4.6 }))!;
    expect(std.spaceGroup.stdOriginShift.every((x) => Math.abs(x - Math.round(x)) < 1e-6)).toBe(true);
    // International Tables: P a -3 contains the inversion through the origin.
    expect(std.spaceGroup.operations.some((o) => o.rotation.join() === '-1,0,0,0,-1,0,0,0,-1' && o.translation.every((t) => Math.abs(t - Math.round(t)) < 1e-9))).toBe(true);
  });
});
