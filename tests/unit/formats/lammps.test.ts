import { describe, expect, it } from 'vitest';
import { lammpsCell, writeLammpsData } from '@/lib/formats/lammps';
import { generate } from '@/lib/models';
import type { Structure } from '@/lib/structure';
import { runPython } from '../../helpers/python';
import { approximant21, asJson, triclinic } from './simulation-fixtures';

/**
 * ase.io.read(format='lammps-data', style='atomic') on our text. ASE 3.22 gives each atom its type as atomic number
 * and the Masses as masses; the element comes back through the mass (ase.data.atomic_masses_iupac2016). The original
 * is built as ase.Atoms; the LAMMPS box is a rotated (and possibly tilt-reduced) copy of its lattice, so we compare
 * what is frame-independent: cell lengths/angles when no reduction was needed, the volume, and the full matrix of
 * minimum-image distances (ASE's get_all_distances(mic=True)), atom by atom in file order.
 */
const READ_BACK = `
import sys, json, io
import numpy as np
from ase import Atoms
from ase.io import read
from ase.data import atomic_masses_iupac2016, chemical_symbols
src = json.loads(sys.stdin.readline())
text = sys.stdin.read()
a = read(io.StringIO(text), format='lammps-data', style='atomic', units='metal')
ref = Atoms(numbers=src['numbers'], positions=np.array(src['positions']).reshape(-1, 3), cell=src['cell'], pbc=True)
def element(m):
    return chemical_symbols[int(np.argmin(np.abs(atomic_masses_iupac2016 - m)))]
print(json.dumps({
  'cellpar': a.cell.cellpar().tolist(),
  'refCellpar': ref.cell.cellpar().tolist(),
  'volume': a.get_volume(), 'refVolume': ref.get_volume(),
  'symbols': [element(m) for m in a.get_masses()],
  'refSymbols': ref.get_chemical_symbols(),
  'scaled': a.get_scaled_positions(wrap=False).tolist(),
  'dist': np.abs(a.get_all_distances(mic=True) - ref.get_all_distances(mic=True)).max(),
}))
`;

interface Back {
  cellpar: number[];
  refCellpar: number[];
  volume: number;
  refVolume: number;
  symbols: string[];
  refSymbols: string[];
  scaled: number[][];
  dist: number;
}

function readBack(s: Structure): Back {
  // With a check comment (the words "atoms" in it must not upset ASE's header parser).
  return runPython<Back>(READ_BACK, `${asJson(s)}\n${writeLammpsData(s, { comment: 'check: WARNING 3 atoms lie outside the cell' })}`);
}

describe('LAMMPS data, atom style atomic (read back with ase.io.read format="lammps-data", ASE 3.22)', () => {
  it('writes counts, box, Masses with element comments and Atoms # atomic', () => {
    const text = writeLammpsData(approximant21(), { comment: 'check: SEVERE 12 atoms overlap. WARNING odd' });
    const lines = text.split('\n');
    expect(lines[0]).toMatch(/^Tauforge \S+ Al102Mn34 \| check: 1 severe, 1 warning - see the comment below$/);
    expect(lines[1]).toBe('# check: SEVERE 12 atoms overlap. WARNING odd');
    expect(writeLammpsData(approximant21()).split('\n')[0]).toMatch(/^Tauforge \S+ Al102Mn34$/);
    expect(text).toContain('136 atoms\n2 atom types\n');
    expect(text).toMatch(/\nMasses\n\n1 26\.98\d* # Al\n2 54\.93\d* # Mn\n\nAtoms # atomic\n\n1 2 /);
    expect(text).not.toContain('xy xz yz'); // cubic: no tilt line
  });

  it('cubic 2/1 approximant: same cell, species and minimum-image distances as ASE', () => {
    const b = readBack(approximant21());
    b.cellpar.forEach((v, k) => expect(v).toBeCloseTo(b.refCellpar[k], 7));
    expect(b.symbols).toEqual(b.refSymbols);
    expect(b.dist).toBeLessThan(1e-7);
    for (const f of b.scaled) for (const x of f) expect(x >= -1e-12 && x < 1).toBe(true);
  });

  it('triclinic cell (tilts xy xz yz, atoms outside the cell): same lattice, species and distances', () => {
    const s = triclinic();
    const b = readBack(s);
    expect(b.volume).toBeCloseTo(b.refVolume, 6);
    expect(b.symbols).toEqual(b.refSymbols);
    expect(b.dist).toBeLessThan(1e-7);
    expect(writeLammpsData(s)).toMatch(/\n\S+ \S+ \S+ xy xz yz\n/);
  });

  it('reduces large tilts to |xy|, |xz| ≤ lx/2 and |yz| ≤ ly/2 without changing the lattice', () => {
    const s: Structure = { ...triclinic(), cell: [[6, 0, 0], [5.5, 5, 0], [4.8, 4.1, 7]] };
    const [[lx], [xy, ly], [xz, yz]] = lammpsCell(s.cell!);
    expect(Math.abs(xy)).toBeLessThanOrEqual(lx / 2);
    expect(Math.abs(xz)).toBeLessThanOrEqual(lx / 2);
    expect(Math.abs(yz)).toBeLessThanOrEqual(ly / 2);
    const b = readBack(s);
    expect(b.volume).toBeCloseTo(b.refVolume, 6);
    expect(b.dist).toBeLessThan(1e-7);
  });

  it('refuses finite patches and mixed sites with clear errors', () => {
    const p = generate({ family: 'icosahedral', mode: 'patch', radius: 6, aR: 4.6, species: 'Al' });
    expect(() => writeLammpsData(p)).toThrow(/LAMMPS data needs a periodic cell/);
    const m: Structure = { ...triclinic(), site: new Uint16Array(6), siteClasses: [{ name: 'shell', species: 13, mix: { 13: 0.5, 30: 0.5 } }] };
    expect(() => writeLammpsData(m)).toThrow(/LAMMPS data holds whole atoms only, but site class "shell" \(atom 1\) is a mixed site/);
  });
});
