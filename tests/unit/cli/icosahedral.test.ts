import { describe, expect, it } from 'vitest';
import { cli } from '../../helpers/cli';
import { TAU } from '../../../lib/math/golden';
import { runPython } from '../../helpers/python';

describe('CLI: approximant and patch', () => {
  it('approximant 2/1 as JSON: exact key order, 136 vertices as X, Elser–Henley cell (PRL 55 (1985) 2883); space group on stderr', async () => {
    const r = await cli(['approximant', '--family', 'icosahedral', '--order', '2/1', '--aR', '4.6', '--format', 'json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out) as Record<string, unknown>;
    expect(Object.keys(j).slice(0, 6)).toEqual(['cell', 'positions', 'species', 'site', 'perp', 'provenance']);
    expect((j.positions as unknown[]).length).toBe(136);
    expect(new Set(j.species as string[])).toEqual(new Set(['X']));
    expect((j.cell as number[][])[0][0]).toBeCloseTo((2 * (2 * TAU + 1) * 4.6) / Math.sqrt(2 + TAU), 6);
    expect(r.err).toMatch(/^# space group P a -3 \(No\. 205\)$/m);
  });

  it('approximant --format cif writes the space group and the asymmetric unit; --cif-symmetry p1 writes every atom', async () => {
    const found = await cli(['approximant', '--family', 'icosahedral', '--order', '2/1', '--aR', '4.6', '--species', 'Al', '--format', 'cif']);
    expect(found.code).toBe(0);
    expect(found.out).toMatch(/_space_group_IT_number 205/);
    const p1 = await cli(['approximant', '--family', 'icosahedral', '--order', '2/1', '--aR', '4.6', '--species', 'Al', '--format', 'cif', '--cif-symmetry', 'p1']);
    expect(p1.out).toMatch(/_space_group_IT_number 1\n/);
    expect(p1.out.split('\n').filter((l) => /^Al\d+ /.test(l)).length).toBe(136);
  });

  it('bad flags exit with code 2 and name the field', async () => {
    const r = await cli(['patch', '--family', 'icosahedral', '--radius', '5', '--aR', 'abc', '--format', 'xyz']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/--aR/);
    const d = await cli(['approximant', '--family', 'icosahedral', '--order', '2/2', '--aR', '4.6']);
    expect(d.code).toBe(2);
    expect(d.err).toMatch(/order/);
  });

  it('approximant --family decagonal delegates to the decagonal generator (cell present, element applied)', async () => {
    const r = await cli(['approximant', '--family', 'decagonal', '--order', '2/1', '--aR', '2.45', '--species', 'Al', '--format', 'json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out) as { cell: number[][] | null; species: string[] };
    expect(j.cell).not.toBeNull();
    expect(new Set(j.species)).toEqual(new Set(['Al']));
  });

  it('--preset tsai: the 1/1 YbCd6 model as a POSCAR that ASE reads (168 atoms, Yb24Cd144 as published: Gómez & Lidin 2001, from memory); --preset with --decoration is refused', async () => {
    const aR = (15.64 * Math.sqrt(2 + TAU)) / (2 * (TAU + 1));
    const r = await cli(['approximant', '--family', 'icosahedral', '--order', '1/1', '--aR', String(aR), '--preset', 'tsai', '--format', 'poscar']);
    expect(r.code).toBe(0);
    const back = runPython<{ n: number; a: number; counts: Record<string, number> }>(
      "import sys, io, json\nfrom ase.io import read\na = read(io.StringIO(sys.stdin.read()), format='vasp')\ns = a.get_chemical_symbols()\nprint(json.dumps({'n': len(a), 'a': a.cell.cellpar()[0], 'counts': {x: s.count(x) for x in set(s)}}))",
      r.out,
    );
    expect(back).toEqual({ n: 168, a: expect.closeTo(15.64, 6), counts: { Yb: 24, Cd: 144 } });
    expect(r.err).toMatch(/^# space group I 2 3 \(No\. 197\)$/m);
    const both = await cli(['approximant', '--family', 'icosahedral', '--order', '1/1', '--aR', '5.68', '--preset', 'tsai', '--decoration', 'x.json']);
    expect(both.code).not.toBe(0);
    expect(both.err).toMatch(/--preset and --decoration: give one/);
  });
});
