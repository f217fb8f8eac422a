import { describe, expect, it } from 'vitest';
import { readExtxyz, writeExtxyz } from '@/lib/formats';
import type { Structure } from '@/lib/structure';
import { runPython } from '../../helpers/python';

function periodic(): Structure {
  return {
    positions: new Float64Array([0, 0, 0, 1.5, 1.6, 1.7, 2.25, -0.125, 3.5]),
    species: new Uint16Array([13, 48, 0]),
    site: new Uint16Array([0, 1, 2]),
    perp: new Float64Array([0.1, 0.2, 0.3, -0.1, 0, 0.5, 1, 2, 3]),
    perpDim: 3,
    cell: [
      [8.1, 0, 0],
      [0.3, 7.9, 0],
      [-0.4, 0.2, 9.3],
    ],
    provenance: { engine: 'tauforge-engine/0.1.0', params: { name: 'q "quoted" \\ back', n: 3 } },
  };
}

describe('extended XYZ', () => {
  it('writes the Lattice / Properties / pbc header', () => {
    const lines = writeExtxyz(periodic()).split('\n');
    expect(lines[0]).toBe('3');
    expect(lines[1]).toMatch(
      /^Lattice="8\.10000000 0\.00000000 0\.00000000 0\.30000000 7\.90000000 0\.00000000 -0\.40000000 0\.20000000 9\.30000000" Properties=species:S:1:pos:R:3:site:I:1:perp:R:3 pbc="T T T" engine="tauforge-engine\/0\.1\.0" params=".*"$/,
    );
    expect(lines[2]).toBe('Al 0.00000000 0.00000000 0.00000000 0 0.10000000 0.20000000 0.30000000');
  });

  it('writes pbc="F F F" and no Lattice for a finite patch', () => {
    const s = periodic();
    delete s.cell;
    const head = writeExtxyz(s).split('\n')[1];
    expect(head).not.toContain('Lattice');
    expect(head).toContain('pbc="F F F"');
  });

  it('round-trips cell, positions, site, perp and params', () => {
    const s = periodic();
    const r = readExtxyz(writeExtxyz(s));
    expect(r.cell).toEqual(s.cell);
    for (let i = 0; i < 9; i++) expect(Math.abs(r.positions[i] - s.positions[i])).toBeLessThan(1e-6);
    expect(Array.from(r.site!)).toEqual([0, 1, 2]);
    expect(Array.from(r.perp!)).toEqual(Array.from(s.perp!));
    expect(r.provenance).toEqual(s.provenance);
    expect(Array.from(r.species)).toEqual([13, 48, 0]);
  });

  it('gives clear errors naming the line', () => {
    expect(() => readExtxyz('1\nProperties=species:S:1:pos:R:3\nAl 0 0\n')).toThrow(/extended XYZ line 3: expected 4 columns/);
    expect(() => readExtxyz('1\nProperties=species:S:1:pos:R\nAl 0 0 0\n')).toThrow(/line 2: .*triples/);
    expect(() => readExtxyz('1\npbc="T T T"\nAl 0 0 0\n')).toThrow(/line 2: pbc is true but no Lattice/);
    expect(() => readExtxyz('1\nLattice="1 0 0 0 1 0 0 0"\nAl 0 0 0\n')).toThrow(/Lattice must hold 9 numbers/);
    expect(() => readExtxyz('1\nProperties=species:S:1:pos:R:3\nAl 0 a 0\n')).toThrow(/line 3: pos\[1\] "a" is not a number/);
  });

  it('loads in ase.io.read(format="extxyz"): cell, positions, site, perp, info to 1e-5', () => {
    const s = periodic();
    const ref = runPython<{ cell: number[][]; pos: number[][]; sym: string[]; site: number[]; perp: number[][]; pbc: boolean[]; params: unknown }>(
      `import sys, io, json
from ase.io import read
a = read(io.StringIO(sys.stdin.read()), format="extxyz")
print(json.dumps({"cell": a.cell.tolist(), "pos": a.positions.tolist(), "sym": a.get_chemical_symbols(),
  "site": a.arrays["site"].tolist(), "perp": a.arrays["perp"].tolist(), "pbc": a.pbc.tolist(),
  "params": json.loads(a.info["params"])}))`,
      writeExtxyz(s),
    );
    expect(ref.sym).toEqual(['Al', 'Cd', 'X']);
    expect(ref.pbc).toEqual([true, true, true]);
    for (let i = 0; i < 3; i++) for (let k = 0; k < 3; k++) {
      expect(Math.abs(ref.cell[i][k] - s.cell![i][k])).toBeLessThan(1e-5);
      expect(Math.abs(ref.pos[i][k] - s.positions[3 * i + k])).toBeLessThan(1e-5);
      expect(Math.abs(ref.perp[i][k] - s.perp![3 * i + k])).toBeLessThan(1e-5);
    }
    expect(ref.site).toEqual([0, 1, 2]);
    expect(ref.params).toEqual(s.provenance.params);
  });

  it('reads an extended XYZ file written by ase.io.write', () => {
    const text = runPython<string>(
      `import io, json
from ase.build import bulk
from ase.io import write
a = bulk("Cu", "fcc", a=3.6, cubic=True)
f = io.StringIO(); write(f, a, format="extxyz"); print(json.dumps(f.getvalue()))`,
    );
    const r = readExtxyz(text);
    expect(r.species.length).toBe(4);
    expect(Array.from(r.species)).toEqual([29, 29, 29, 29]);
    expect(r.cell![0][0]).toBeCloseTo(3.6, 9);
    expect(r.positions[3 * 1 + 1]).toBeCloseTo(1.8, 9);
  });

  it('writes a mixed site as one row per element with its fraction, which ase.io.read keeps (IUCr CIF core convention)', () => {
    const s: Structure = {
      positions: new Float64Array([0, 0, 0, 1, 1, 1, 2, 2, 2]),
      species: new Uint16Array([13, 30, 13]),
      site: new Uint16Array([0, 1, 2]),
      siteClasses: [{ name: 'frame', species: 13 }, { name: 'mixed', species: 30, mix: { 30: 0.6, 12: 0.4 } }, { name: 'half', species: 13, occupancy: 0.5 }],
      cell: [[5, 0, 0], [0, 5, 0], [0, 0, 5]],
      provenance: { engine: 'tauforge-engine/0.1.0', params: null },
    };
    const text = writeExtxyz(s, { check: 'severe: 1 pair "too" close' });
    const lines = text.split('\n');
    expect(lines[0]).toBe('4');
    expect(lines[1]).toContain('Properties=species:S:1:pos:R:3:site:I:1:occupancy:R:1 ');
    expect(lines[1]).toContain('check="severe: 1 pair \\"too\\" close"');
    expect(lines.slice(2, 6)).toEqual([
      'Al 0.00000000 0.00000000 0.00000000 0 1.000000',
      'Mg 1.00000000 1.00000000 1.00000000 1 0.400000',
      'Zn 1.00000000 1.00000000 1.00000000 1 0.600000',
      'Al 2.00000000 2.00000000 2.00000000 2 0.500000',
    ]);
    const ref = runPython<{ symbols: string[]; occ: number[]; check: string }>(
      'import sys, io, json\nfrom ase.io import read\na = read(io.StringIO(sys.stdin.read()), format="extxyz")\nprint(json.dumps({"symbols": a.get_chemical_symbols(), "occ": a.arrays["occupancy"].tolist(), "check": a.info["check"]}))',
      text,
    );
    expect(ref.symbols).toEqual(['Al', 'Mg', 'Zn', 'Al']);
    expect(ref.occ).toEqual([1, 0.4, 0.6, 0.5]);
    expect(ref.check).toBe('severe: 1 pair "too" close');
  });
});
