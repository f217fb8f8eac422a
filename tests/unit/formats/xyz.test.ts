import { describe, expect, it } from 'vitest';
import { readJson, readXyz, writeJson, writeXyz } from '@/lib/formats';
import type { Structure } from '@/lib/structure';
import { runPython } from '../../helpers/python';

function sample(): Structure {
  return {
    positions: new Float64Array([0, 0, 0, 1.23456789012, -2.5, 3.000000001, -0.0000000001, 7.5, -8.25]),
    species: new Uint16Array([13, 25, 0]),
    site: new Uint16Array([0, 1, 2]),
    siteClasses: [
      { name: 'node', species: 13 },
      { name: 'body', species: 25 },
      { name: 'vertex', species: 0 },
    ],
    perp: new Float64Array([0.1, 0.2, 0.3, -0.1, 0, 0.5, 1, 2, 3]),
    perpDim: 3,
    provenance: { engine: 'tauforge-engine/0.1.0', params: { model: 'test', order: 3, a: [1, 2] } },
  };
}

describe('XYZ writer and reader', () => {
  it('writes count line, comment with engine + params, El x y z with 8 decimals, X for unassigned', () => {
    const t = writeXyz(sample());
    const lines = t.split('\n');
    expect(lines[0]).toBe('3');
    expect(lines[1]).toBe('Tauforge tauforge-engine/0.1.0 params={"a":[1,2],"model":"test","order":3}');
    expect(lines[2]).toBe('Al 0.00000000 0.00000000 0.00000000');
    expect(lines[3]).toBe('Mn 1.23456789 -2.50000000 3.00000000');
    expect(lines[4]).toBe('X  0.00000000 7.50000000 -8.25000000');
    expect(t.endsWith('\n')).toBe(true);
  });

  it('round-trips positions to 1e-6 Å and recovers params', () => {
    const s = sample();
    const r = readXyz(writeXyz(s));
    expect(Array.from(r.species)).toEqual([13, 25, 0]);
    for (let i = 0; i < 9; i++) expect(Math.abs(r.positions[i] - s.positions[i])).toBeLessThan(1e-6);
    expect(r.provenance.params).toEqual(s.provenance.params);
  });

  it('names the line on malformed input', () => {
    expect(() => readXyz('')).toThrow(/empty/);
    expect(() => readXyz('two\nc\n')).toThrow(/XYZ line 1: expected the number of atoms/);
    expect(() => readXyz('3\nc\nAl 0 0 0\nAl 1 1 1\n')).toThrow(/says 3 atoms but only 2/);
    expect(() => readXyz('2\nc\nAl 0 0 0\nAl 1 q 1\n')).toThrow(/XYZ line 4: coordinate y "q" is not a number/);
    expect(() => readXyz('1\nc\nZz 0 0 0\n')).toThrow(/XYZ line 3: unknown element "Zz"/);
    expect(() => readXyz('1\nc\nAl 0 0\n')).toThrow(/XYZ line 3: expected "element x y z"/);
  });

  it('accepts atomic numbers and extra columns (common practice in XYZ files)', () => {
    const r = readXyz('2\n\n13 0 0 0 extra\nfe 1e-1 2.0 3\n');
    expect(Array.from(r.species)).toEqual([13, 26]);
    expect(r.positions[3]).toBeCloseTo(0.1, 12);
  });

  it('loads in ase.io.read (format xyz) with the same species and positions to 1e-5', () => {
    const s = sample();
    const ref = runPython<{ sym: string[]; pos: number[][] }>(
      `import sys, io, json
from ase.io import read
a = read(io.StringIO(sys.stdin.read()), format="xyz")
print(json.dumps({"sym": a.get_chemical_symbols(), "pos": a.positions.tolist()}))`,
      writeXyz(s),
    );
    expect(ref.sym).toEqual(['Al', 'Mn', 'X']);
    for (let i = 0; i < 3; i++) for (let k = 0; k < 3; k++) expect(Math.abs(ref.pos[i][k] - s.positions[3 * i + k])).toBeLessThan(1e-5);
  });
});

describe('JSON writer and reader', () => {
  it('writes exactly the documented keys, in order', () => {
    const t = writeJson(sample());
    const o = JSON.parse(t);
    expect(Object.keys(o)).toEqual(['cell', 'positions', 'species', 'site', 'perp', 'provenance', 'siteClasses']);
    expect(o.cell).toBeNull();
    expect(o.species).toEqual(['Al', 'Mn', 'X']);
    expect(o.perp[1]).toEqual([-0.1, 0, 0.5]);
    expect(t).toContain('[1.23456789,-2.50000000,3.00000000]');
  });

  it('round-trips everything, including the cell, exactly to 1e-8', () => {
    const s = { ...sample(), cell: [[10, 0, 0], [0, 11, 0], [0.5, 0, 12]] as Structure['cell'] };
    const r = readJson(writeJson(s));
    expect(r.cell).toEqual(s.cell);
    for (let i = 0; i < 9; i++) expect(Math.abs(r.positions[i] - s.positions[i])).toBeLessThan(1e-8);
    expect(Array.from(r.site!)).toEqual([0, 1, 2]);
    expect(r.perpDim).toBe(3);
    expect(r.siteClasses).toEqual(s.siteClasses);
    expect(r.provenance).toEqual(s.provenance);
    expect(writeJson(r)).toBe(writeJson(s));
  });

  it('gives clear errors', () => {
    expect(() => readJson('{')).toThrow(/not valid JSON/);
    expect(() => readJson('{"positions":[[0,0,0]],"species":[]}')).toThrow(/"species" has 0 entries but "positions" has 1/);
    expect(() => readJson('{"positions":[[0,0]],"species":["Al"]}')).toThrow(/positions\[0\] must be three/);
    expect(() => readJson('{"positions":[[0,0,0]],"species":["Qx"]}')).toThrow(/species\[0\] = "Qx"/);
    expect(() => readJson('{"positions":[],"species":[],"cell":[[1,0,0]]}')).toThrow(/"cell" must be null or three vectors/);
  });

  it('carries the check warnings in the comment line and still reads its params back (ase.io.read keeps the comment)', () => {
    const text = writeXyz(sample(), { check: 'SEVERE: 3 pairs closer than 0.8(r1+r2), "shortest" 0.1 A' });
    const line = text.split('\n')[1];
    expect(line).toMatch(/^Tauforge \S+ check="SEVERE: 3 pairs closer than 0\.8\(r1\+r2\), \\"shortest\\" 0\.1 A" params=/);
    expect(readXyz(text).provenance.params).toEqual(sample().provenance.params);
    const n = runPython<number>('import sys, io, json\nfrom ase.io import read\nprint(json.dumps(len(read(io.StringIO(sys.stdin.read()), format="xyz"))))', text);
    expect(n).toBe(sample().species.length);
  });
});

