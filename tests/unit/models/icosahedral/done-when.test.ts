/**
 * Issue #10, "Done when", end to end at unit level: a modeller cuts a 1/1 or 2/1 approximant with a cluster
 * preset on its intended site (presetDecoration: the preset's cluster-centre class and companions, its usual
 * species, the a_R it is sized for) through generate(), and hands the result to the writers. For each preset and
 * order we check, against references outside the project:
 *  - a cubic space group: moyo (our finder) and spglib (python3-spglib, the outside check) agree, and the CIF
 *    written with that group (H-M symbol, number, operations, asymmetric unit) is read back by gemmi
 *    (python3-gemmi), which finds the same group number and expands it to our atom count and cell;
 *  - no pair closer than 0.8 × the sum of CN-12 metallic radii, with the radii taken from pymatgen's
 *    Element.metallic_radius and the distances from ASE's neighbour list (minimum image) — the Check step's rule;
 *  - a plausible density: atoms per Å³ within 10 % of the published phase the preset is modelled on (named
 *    below, values from memory) — except the Mackay 2/1, which has no published counterpart and is asserted as
 *    measured — and
 *    the Check step's band of 80–120 % of the Zen's-law close-packed ideal (report.ts, common practice);
 *  - a VASP POSCAR and a LAMMPS data file that ASE reads (format 'vasp'; 'lammps-data', atomic style) with our atom
 *    count, the cubic cell and the composition.
 * Published phases (from memory): YbCd6 cI168, Im-3, a = 15.638 Å (Gómez & Lidin, Angew. Chem. Int. Ed. 40 (2001)
 * 4037); R-phase Mg32(Al,Zn)49 cI162, Im-3, a = 14.16 Å (Bergman, Waugh & Pauling, Acta Cryst. 10 (1957) 254);
 * α-(Al,Mn,Si) cP138, Pm-3, a = 12.68 Å (Cooper & Robinson, Acta Cryst. 20 (1966) 614).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { ensureSymmetry } from '../../../../lib/server/symmetry-wasm';
import { findSpaceGroup, siteTypes, spaceGroupOf } from '../../../../lib/structure/symmetry';
import { generate } from '../../../../lib/models';
import { presetDecoration } from '../../../../lib/models/icosahedral/decorate';
import { CLUSTER_PRESETS } from '../../../../lib/models/icosahedral/clusters';
import { exportFile, writeExport } from '../../../../lib/formats/write';
import { checkStructure } from '../../../../lib/structure/checks/report';
import type { DecorationParams } from '../../../../lib/models/icosahedral/decoration-schema';
import type { Structure } from '../../../../lib/structure/types';
import { runPython } from '../../../helpers/python';

beforeAll(() => ensureSymmetry());

type Preset = 'mackay' | 'bergman' | 'tsai';

/** Published cells (from memory, see the header): a in Å and atoms per conventional cell. */
const PUBLISHED: Record<Preset, { name: string; a: number; atoms: number }> = {
  tsai: { name: 'YbCd6 (Gómez & Lidin 2001)', a: 15.638, atoms: 168 },
  bergman: { name: 'Mg32(Al,Zn)49 (Bergman, Waugh & Pauling 1957)', a: 14.16, atoms: 162 },
  mackay: { name: 'α-(Al,Mn,Si) (Cooper & Robinson 1966)', a: 12.68, atoms: 138 },
};

/**
 * What we expect, per case: the space group (both finders) and why it may differ from the published one.
 *  - Im-3 (204) in the 1/1, Pa-3 (205) in the 2/1 — the m-3 cut with identical clusters on the bcc sites (1/1) and
 *    on the 8 cluster centres of the 2/1; the published R-phase is Im-3, the published α-phase Pm-3 (its glue
 *    differs between the origin and the body centre, which our identical clusters do not).
 *  - Tsai: one ordered orientation of the Cd4 tetrahedron (tetrahedral, not centrosymmetric) removes the inversion:
 *    I23 (197) and P2₁3 (198). The published YbCd6 is Im-3 because the tetrahedron is orientationally disordered.
 */
const EXPECTED_GROUP: Record<Preset, Record<'1/1' | '2/1', number>> = {
  mackay: { '1/1': 204, '2/1': 205 },
  bergman: { '1/1': 204, '2/1': 205 },
  tsai: { '1/1': 197, '2/1': 198 },
};

/**
 * Bergman's usual species are 50:50 (Al, Zn) mixed sites, which CIF keeps and POSCAR/LAMMPS cannot hold: the
 * modeller sets the preset's Species per shell. This ordered choice (Zn on the icosahedra, Al on the truncated
 * icosahedron) is ours, for the test — not a published ordering.
 */
const BERGMAN_ORDERED = ['Zn', 'Mg', 'Zn', 'Al', 'Mg'];

function decorationOf(preset: Preset): DecorationParams {
  const d = presetDecoration(preset);
  if (preset === 'bergman') d.clusters = [{ ...d.clusters![0], species: BERGMAN_ORDERED }];
  return d;
}

const ORDERS = ['1/1', '2/1'] as const;
const CASES = (['tsai', 'bergman', 'mackay'] as const).flatMap((preset) => ORDERS.map((order) => ({ preset, order })));

interface Ref {
  spglib: number;
  gemmi: { number: number; hm: string; sites: number; a: number };
  poscar: { n: number; cellpar: number[]; counts: Record<string, number> };
  lammps: { n: number; cellpar: number[]; counts: Record<string, number> };
  closePairs: number;
  worstRatio: number;
}

/** One Python run for every case: spglib, gemmi, ASE and pymatgen's radii. */
const REFERENCE = `
import sys, json, io, warnings
warnings.filterwarnings('ignore')
import numpy as np, spglib, gemmi
from ase import Atoms
from ase.io import read
from ase.neighborlist import neighbor_list
from ase.data import atomic_masses_iupac2016, chemical_symbols
from pymatgen.core.periodic_table import Element
out = []
for c in json.load(sys.stdin):
    cell = np.array(c['cell']); pos = np.array(c['positions']).reshape(-1, 3)
    frac = pos @ np.linalg.inv(cell)
    sg = spglib.get_symmetry_dataset((cell, frac, c['types']), symprec=1e-3)
    blk = gemmi.cif.read_string(c['cif']).sole_block()
    st = gemmi.make_small_structure_from_block(blk)
    gnum = int(blk.find_value('_space_group_IT_number'))
    p = read(io.StringIO(c['poscar']), format='vasp')
    l = read(io.StringIO(c['lammps']), format='lammps-data', style='atomic', units='metal')
    def counts(syms):
        d = {}
        for s in syms: d[s] = d.get(s, 0) + 1
        return d
    lsyms = [chemical_symbols[int(np.argmin(np.abs(atomic_masses_iupac2016 - m)))] for m in l.get_masses()]
    atoms = Atoms(numbers=c['numbers'], positions=pos, cell=cell, pbc=True)
    i, j, d = neighbor_list('ijd', atoms, 3.6)
    r = {z: float(Element.from_Z(z).metallic_radius) for z in set(c['numbers'])}
    z = np.array(c['numbers'])
    thr = 0.8 * (np.array([r[k] for k in z[i]]) + np.array([r[k] for k in z[j]]))
    ratio = d / thr
    out.append({
        'spglib': int(sg['number']),
        'gemmi': {'number': gnum, 'hm': st.spacegroup_hm, 'sites': len(st.get_all_unit_cell_sites()), 'a': st.cell.a},
        'poscar': {'n': len(p), 'cellpar': p.cell.cellpar().tolist(), 'counts': counts(p.get_chemical_symbols())},
        'lammps': {'n': len(l), 'cellpar': l.cell.cellpar().tolist(), 'counts': counts(lsyms)},
        'closePairs': int((ratio < 1).sum()) // 2,
        'worstRatio': float(ratio.min()),
    })
print(json.dumps(out))
`;

function symbolCounts(s: Structure): Record<string, number> {
  const sym: Record<number, string> = { 12: 'Mg', 13: 'Al', 25: 'Mn', 30: 'Zn', 48: 'Cd', 70: 'Yb' };
  const out: Record<string, number> = {};
  for (const z of s.species) out[sym[z]] = (out[sym[z]] ?? 0) + 1;
  return out;
}

const built = CASES.map(({ preset, order }) => {
  const s = generate({ family: 'icosahedral', mode: 'approximant', order, aR: CLUSTER_PRESETS[preset].aR!, decoration: decorationOf(preset) });
  return { preset, order, s };
});
let refs: Ref[] = [];
const files = new Map<string, { cif: string; poscar: string; lammps: string }>();

beforeAll(() => {
  for (const { preset, order, s } of built) {
    files.set(`${preset} ${order}`, {
      cif: writeExport(s, 'cif', { cifSymmetry: 'found' }),
      poscar: exportFile(s, 'poscar', { spaceGroup: spaceGroupOf }).text,
      lammps: exportFile(s, 'lammps', { spaceGroup: spaceGroupOf }).text,
    });
  }
  refs = runPython<Ref[]>(
    REFERENCE,
    JSON.stringify(
      built.map(({ preset, order, s }) => ({
        cell: s.cell,
        positions: Array.from(s.positions),
        numbers: Array.from(s.species),
        types: siteTypes(s),
        ...files.get(`${preset} ${order}`)!,
      })),
    ),
  );
});

describe('issue #10 "Done when": each preset on its site in the 1/1 and the 2/1, through generate() and the writers', () => {
  it.each(CASES.map((c, k) => [`${c.preset} ${c.order}`, k] as const))('%s', (_label, k) => {
    const { preset, order, s } = built[k];
    const ref = refs[k];
    const n = s.species.length;
    const a = s.cell![0][0];

    // Whole atoms: the preset's windows avoid the boundary sites of the symmetric cut (no fractional weight).
    expect(s.occupancy === undefined || s.occupancy.every((w) => w === 1)).toBe(true);
    expect(s.notes?.join('\n')).not.toMatch(/warning/);

    // Cubic space group: moyo and spglib agree; the CIF carries it and gemmi reads it back and expands it.
    const g = findSpaceGroup(s);
    expect(g.number).toBe(EXPECTED_GROUP[preset][order]);
    expect(g.crystalSystem.toLowerCase()).toBe('cubic');
    expect(ref.spglib).toBe(g.number);
    expect(files.get(`${preset} ${order}`)!.cif).toMatch(new RegExp(`_space_group_IT_number\\s+${g.number}\\b`));
    expect(ref.gemmi.number).toBe(g.number);
    expect(ref.gemmi.hm.replace(/\s/g, '')).toBe(g.hmSymbol.replace(/\s/g, ''));
    expect(ref.gemmi.sites).toBe(n);
    expect(ref.gemmi.a).toBeCloseTo(a, 4);

    // No pair below 0.8 × (r₁ + r₂), pymatgen's CN-12 metallic radii, ASE's minimum-image neighbour list.
    expect(ref.closePairs).toBe(0);
    expect(ref.worstRatio).toBeGreaterThanOrEqual(1);

    // Density against the published phase, and the Check step's Zen band (80–120 % of the ideal).
    const ratio = n / a ** 3 / (PUBLISHED[preset].atoms / PUBLISHED[preset].a ** 3);
    if (preset === 'mackay' && order === '2/1') {
      // No published 2/1 to compare with (clusters.ts, MACKAY_GLUE): the glue window that gives the 1/1 the 24
      // Al6/Al7 glue atoms of α-(AlMnSi) (Sugiyama, Kaji & Hiraga 1998) keeps 24 in the 2/1's 8 clusters, 22 %
      // below the α-phase's density. Asserted as measured so a change shows.
      expect(ratio).toBeCloseTo(0.78, 2);
    } else {
      expect(Math.abs(ratio - 1)).toBeLessThan(0.1);
    }
    const report = checkStructure(s, { spaceGroup: spaceGroupOf });
    expect(report.density!.ratio!).toBeGreaterThan(0.8);
    expect(report.density!.ratio!).toBeLessThan(1.2);
    expect(report.warnings.filter((w) => w.severity !== 'info').map((w) => w.code)).toEqual([]);
    expect(report.spaceGroup?.number).toBe(g.number);

    // POSCAR and LAMMPS data read by ASE: atom count, cubic cell a × a × a, composition.
    for (const f of [ref.poscar, ref.lammps]) {
      expect(f.n).toBe(n);
      f.cellpar.slice(0, 3).forEach((x) => expect(x).toBeCloseTo(a, 4));
      f.cellpar.slice(3).forEach((x) => expect(x).toBeCloseTo(90, 6));
      expect(f.counts).toEqual(symbolCounts(s));
    }
  });
});

describe('the way to whole atoms is stated where the symmetric cut cannot give them', () => {
  it('Bergman with its usual (Al, Zn) mixes: CIF keeps Im-3; POSCAR refuses and names the Species per shell', () => {
    const s = generate({ family: 'icosahedral', mode: 'approximant', order: '1/1', aR: CLUSTER_PRESETS.bergman.aR!, decoration: presetDecoration('bergman') });
    expect(findSpaceGroup(s).number).toBe(204);
    expect(() => writeExport(s, 'poscar')).toThrow(/mixed site \(50 % Al, 50 % Zn\).*set its Species per shell/);
  });

  it('the P 1/1 vertices at the symmetric position: POSCAR refuses the boundary weights and says to use a generic offset; with it, POSCAR is written', () => {
    const sym = generate({ family: 'icosahedral', mode: 'approximant', order: '1/1', aR: 4.6, species: 'Al' });
    expect(() => writeExport(sym, 'poscar')).toThrow(/lies on the window boundary of the symmetric cut and carries the weight 50 % Al.*generic phason offset, e\.g\. \(0\.1, 0\.2, 0\.3\) Å/);
    const off = generate({ family: 'icosahedral', mode: 'approximant', order: '1/1', aR: 4.6, species: 'Al', offset: [0.1, 0.2, 0.3] });
    // 32 vertices per 1/1 cell (Elser & Henley 1985), now whole.
    expect(off.species.length).toBe(32);
    const text = writeExport(off, 'poscar');
    const back = runPython<{ n: number }>(
      "import sys, io, json\nfrom ase.io import read\na = read(io.StringIO(sys.stdin.read()), format='vasp')\nprint(json.dumps({'n': len(a)}))",
      text,
    );
    expect(back.n).toBe(32);
  });

  it('a bad decoration is flagged before export: the Mackay preset on every vertex of a 2/1 cut with a_R = 4.2 Å', () => {
    const s = generate({
      family: 'icosahedral', mode: 'approximant', order: '2/1', aR: 4.2,
      decoration: { classes: [{ name: 'vertex', position: 'node', species: 'Mn' }], clusters: [{ at: 'vertex', preset: 'mackay' }] },
    });
    const { text, report } = exportFile(s, 'poscar', { spaceGroup: spaceGroupOf });
    expect(report.severe).toBe(true);
    expect(text.split('\n')[0]).toMatch(/pairs? closer than 80 % of the sum of metallic radii/);
  });
});
