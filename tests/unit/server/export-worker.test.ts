/**
 * What the export queue writes (lib/server/export-worker.ts renderExport), read back by outside libraries: the CIF
 * of a revision carries its space group by default (gemmi, python3-gemmi 0.5: the symbol and number it reads, and
 * the atom count after expanding the asymmetric unit with the listed operations, must equal spglib's group of the
 * cut and its atom count); 'cif-p1' is P 1 with every atom; a comment line says which and why. The Check report
 * carries the space group too. Uploads' summaries (lib/server/datasets.ts parseUpload) carry theirs.
 */
import { describe, expect, it } from 'vitest';
import { renderExport } from '../../../lib/server/export-worker';
import { parseUpload } from '../../../lib/server/datasets';
import { generate } from '../../../lib/models';
import { toFractional } from '../../../lib/math/frac';
import type { Structure } from '../../../lib/structure/types';
import { runPython } from '../../helpers/python';

const GEMMI = `
import sys, json, gemmi
st = gemmi.make_small_structure_from_block(gemmi.cif.read_string(sys.stdin.read()).sole_block())
g = st.find_spacegroup()
print(json.dumps({'number': g.number if g else None, 'hm': st.spacegroup_hm, 'asu': len(st.sites), 'expanded': len(st.get_all_unit_cell_sites())}))
`;

const SPGLIB = `
import sys, json, spglib
d = json.load(sys.stdin)
r = spglib.get_symmetry_dataset((d['lattice'], d['frac'], d['numbers']), symprec=1e-3)
print(json.dumps(r['number'] if isinstance(r, dict) else r.number))
`;

function spglibNumber(s: Structure): number {
  const f = toFractional(s.cell!, s.positions);
  const frac = Array.from({ length: s.species.length }, (_, i) => [f[3 * i], f[3 * i + 1], f[3 * i + 2]]);
  return runPython<number>(SPGLIB, JSON.stringify({ lattice: s.cell, frac, numbers: Array.from(s.species) }));
}

const params = { family: 'icosahedral', mode: 'approximant', order: '2/1', aR: 4.6, lattice: 'P', species: 'Al' };

describe('exports through the queue carry the space group', () => {
  it('CIF of a 2/1 cut: gemmi reads the group spglib finds and expands the asymmetric unit to every atom', () => {
    const s = generate(params);
    const want = spglibNumber(s);
    expect(want).toBe(205); // P a -3 (issue #10's symmetric cut)
    const text = renderExport(params, 'cif');
    expect(text).toMatch(/^# Tauforge symmetry: space group P a -3 \(No\. 205\) found by moyo \(symprec 0\.001 A\): 24 operations, asymmetric unit of \d+ of 136 atoms/m);
    const back = runPython<{ number: number; asu: number; expanded: number }>(GEMMI, text);
    expect(back.number).toBe(want);
    expect(back.asu).toBeLessThan(136 / 4);
    expect(back.expanded).toBe(s.species.length);
  });

  it("'cif-p1' writes P 1 with every atom and says it was chosen; a supercell is P 1 and says why", () => {
    const p1 = renderExport(params, 'cif-p1');
    expect(p1).toMatch(/^# Tauforge symmetry: P 1 with all 136 atoms: the 'P 1, all atoms' choice$/m);
    const back = runPython<{ number: number; asu: number; expanded: number }>(GEMMI, p1);
    expect(back).toMatchObject({ number: 1, asu: 136, expanded: 136 });
    const sc = renderExport(params, 'cif@2x1x1');
    expect(sc).toMatch(/^# Tauforge symmetry: P 1 with all 272 atoms: a supercell \(2x1x1\) is written in P 1 with every atom$/m);
    expect(runPython<{ expanded: number }>(GEMMI, sc).expanded).toBe(272);
  });

  it('the check report of a revision names the space group', () => {
    const report = JSON.parse(renderExport(params, 'check'));
    expect(report.spaceGroup).toEqual({ number: 205, symbol: 'P a -3' });
  });

  it("an uploaded CIF's summary carries its space group (rock salt written by ASE: spglib's F m -3 m, No. 225)", () => {
    const cif = runPython<string>("import io, json\nfrom ase.build import bulk\nfrom ase.io import write\nb = io.BytesIO()\nwrite(b, bulk('NaCl', 'rocksalt', a=5.64, cubic=True), format='cif')\nprint(json.dumps(b.getvalue().decode()))");
    const parsed = parseUpload(cif, 'nacl.cif', 'auto');
    expect(parsed.summary.spaceGroup).toEqual({ number: 225, symbol: 'F m -3 m' });
    const xyz = parseUpload('2\nmolecule\nAl 0 0 0\nAl 2.8 0 0\n', 'pair.xyz', 'auto');
    expect(xyz.summary).toMatchObject({ spaceGroup: null, spaceGroupNote: 'no periodic cell' });
  });
});
