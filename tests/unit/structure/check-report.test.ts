/**
 * The Check step (lib/structure/checks/report.ts, contacts.ts, model-density.ts) against outside numbers:
 * ASE's bulk crystals and distances, scipy's periodic k-d tree for a crowded model, handbook densities, and
 * the tile statistics of the Penrose, Ammann–Beenker and Fibonacci tilings.
 */
import { describe, expect, it } from 'vitest';
import { generate } from '@/lib/models';
import { checkComment, checkStructure, checkText, contacts, idealNumberDensity, modelDensity, composition, type Structure } from '@/lib/structure';
import { runPython } from '../../helpers/python';

const TAU = (1 + Math.sqrt(5)) / 2;

/** ase.build.bulk(...) as a Structure (cubic conventional cell when asked). */
function aseBulk(args: string): Structure {
  const r = runPython<{ cell: number[][]; positions: number[]; numbers: number[] }>(
    `import json\nfrom ase.build import bulk\na = ${args}\nprint(json.dumps({"cell": a.cell.array.tolist(), "positions": a.positions.ravel().tolist(), "numbers": a.numbers.tolist()}))`,
  );
  return { positions: Float64Array.from(r.positions), species: Uint16Array.from(r.numbers), cell: r.cell as Structure['cell'], provenance: { engine: 'test', params: null } };
}

describe('Check step on real metals (ASE bulk crystals, handbook values)', () => {
  it('fcc Al (a = 4.05 Å, ase.build.bulk): nearest neighbour a/√2 = 2.864 Å, CN 12, 2.70 g/cm³, no warnings', () => {
    const s = aseBulk("bulk('Al', 'fcc', a=4.05, cubic=True).repeat(2)");
    const r = checkStructure(s);
    expect(r.pairs).toHaveLength(1);
    expect(r.pairs[0].shortest).toBeCloseTo(4.05 / Math.SQRT2, 9);
    expect(r.tooCloseCount).toBe(0);
    expect(r.coordination).toEqual([{ name: 'Al', atoms: 32, mean: 12, min: 12, max: 12 }]);
    // CRC Handbook density of aluminium 2.70 g/cm³ (from memory).
    expect(r.density!.mass).toBeCloseTo(2.7, 1);
    // Ideal from the CN-12 radius (1.43 Å) is fcc Al itself to within 1 %: 4√2·1.43³ = 16.54 Å³ vs a³/4 = 16.61 Å³.
    expect(Math.abs(r.density!.ratio! - 1)).toBeLessThan(0.01);
    expect(r.warnings).toEqual([]);
    expect(r.severe).toBe(false);
    expect(checkComment(r)).toBeUndefined();
  });

  it('bcc Fe (ase.build.bulk, a = 2.87 Å): 8 + 6 = 14 neighbours within 1.2·(r1+r2), 7.87 g/cm³ (handbook)', () => {
    const r = checkStructure(aseBulk("bulk('Fe', 'bcc', a=2.87, cubic=True).repeat(3)"));
    expect(r.coordination[0].min).toBe(14);
    expect(r.coordination[0].max).toBe(14);
    expect(r.density!.mass).toBeCloseTo(7.87, 1);
    expect(r.severe).toBe(false);
  });

  it('B2 NiAl, a known intermetallic (a = 2.887 Å, from memory; ase.build.bulk cesiumchloride): 5.9 g/cm³, plausible', () => {
    const r = checkStructure(aseBulk("bulk('NiAl', 'cesiumchloride', a=2.887).repeat(2)"));
    // Handbook density of NiAl ≈ 5.9 g/cm³ (from memory).
    expect(r.density!.mass).toBeCloseTo(5.9, 1);
    expect(r.density!.ratio!).toBeGreaterThan(1.1);
    expect(r.density!.ratio!).toBeLessThan(1.2);
    expect(r.warnings.filter((w) => w.severity !== 'info')).toEqual([]);
    const niAl = r.pairs.find((p) => p.a === 'Al' && p.b === 'Ni')!;
    expect(niAl.shortest).toBeCloseTo((2.887 * Math.sqrt(3)) / 2, 9);
  });

  it('ideal density: Zen-law sum of close-packed volumes 4√2 r³ (fcc Al: 0.0605 atoms/Å³ vs handbook 0.0602)', () => {
    const al = composition(aseBulk("bulk('Al', 'fcc', a=4.0495, cubic=True)"));
    expect(idealNumberDensity(al)).toBeCloseTo(1 / (4 * Math.SQRT2 * 1.43 ** 3), 12);
    expect(Math.abs(idealNumberDensity(al) / (4 / 4.0495 ** 3) - 1)).toBeLessThan(0.01);
  });
});

describe('Check step flags what cannot be', () => {
  it('a deliberately overlapping atom: one severe pair, listed with the distance ASE measures', () => {
    const s = aseBulk("bulk('Al', 'fcc', a=4.05, cubic=True).repeat(2)");
    const positions = Float64Array.from([...s.positions, 0.5, 0.3, 0.2]);
    const t: Structure = { ...s, positions, species: Uint16Array.from([...s.species, 25]) };
    const d = Math.hypot(0.5, 0.3, 0.2); // from the atom at the origin
    const r = checkStructure(t);
    expect(r.severe).toBe(true);
    expect(r.warnings[0]).toMatchObject({ severity: 'severe', code: 'too-close' });
    expect(r.warnings[0].message).toMatch(/^1 pair closer than 80 % of the sum of metallic radii \(2 atoms; Al–Mn 1\); shortest Al–Mn 0\.616 Å, limit 2\.178 Å/);
    expect(r.tooCloseCount).toBe(1);
    expect(r.tooClose[0]).toMatchObject({ i: 0, j: 32, a: 'Al', b: 'Mn' });
    expect(r.tooClose[0].distance).toBeCloseTo(d, 12);
    expect(checkComment(r)).toMatch(/^check: SEVERE 1 pair closer than 80 %/);
  });

  it('2/1 approximant with a Mackay cluster on every vertex: counts per species pair as scipy cKDTree (periodic) finds them', () => {
    const s = generate({ family: 'icosahedral', mode: 'approximant', order: '2/1', aR: 4.6, lattice: 'P', decoration: { classes: [{ name: 'node', position: 'node', species: 'Al' }], clusters: [{ at: 'node', preset: 'mackay' }], mergeTolerance: 0 } });
    const r = checkStructure(s);
    const ref = runPython<{ counts: Record<string, number>; shortest: Record<string, number>; outside: number }>(
      `import sys, json
import numpy as np
from scipy.spatial import cKDTree
d = json.loads(sys.stdin.read())
L = d["L"]; z = np.array(d["z"]); x = np.array(d["x"]).reshape(-1, 3)
outside = int(np.sum(np.any((x < -1e-6) | (x >= L + 1e-6), axis=1)))
w = np.mod(x, L); w[w >= L] = 0
t = cKDTree(w, boxsize=L)
pairs = t.query_pairs(3.5, output_type="ndarray")
dv = w[pairs[:, 0]] - w[pairs[:, 1]]; dv -= L * np.round(dv / L); dist = np.sqrt((dv ** 2).sum(1))
r = {13: 1.43, 25: 1.292}
sym = {13: "Al", 25: "Mn"}
counts = {}; shortest = {}
for (i, j), dd in zip(pairs, dist):
    a, b = sorted((int(z[i]), int(z[j]))); k = sym[a] + "-" + sym[b]
    shortest[k] = min(shortest.get(k, 1e9), float(dd))
    if dd < 0.8 * (r[a] + r[b]): counts[k] = counts.get(k, 0) + 1
print(json.dumps({"counts": counts, "shortest": shortest, "outside": outside}))`,
      JSON.stringify({ L: s.cell![0][0], z: Array.from(s.species), x: Array.from(s.positions) }),
    );
    expect(s.cell![0][1]).toBe(0); // cubic, axis-aligned: the scipy box applies
    for (const p of r.pairs) {
      const k = `${p.a}-${p.b}`;
      expect(p.tooClose).toBe(ref.counts[k] ?? 0);
      if (ref.shortest[k] === undefined) expect(p.shortest).toBeNull(); // no pair of this kind within 3.5 Å
      else expect(p.shortest).toBeCloseTo(ref.shortest[k], 9);
    }
    expect(r.outsideCell).toBe(ref.outside);
    expect(r.tooClose.length).toBe(50);
    expect(r.severe).toBe(true);
    expect(r.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(['too-close', 'density-high']));
    // The numbers for this model: 47 g/cm³, shortest 0.105 Å, 1 779 atoms outside — the decoration now
    // wraps cluster atoms into the cell, so none are outside even with merging switched off.
    expect(r.outsideCell).toBe(0);
    expect(r.density!.mass!).toBeGreaterThan(40);
  });

  it('an impossible mass density is severe even when the radii ratio is not (heavier than osmium)', () => {
    // fcc Os squeezed to a = 3.4 Å: 31 g/cm³.
    const r = checkStructure(aseBulk("bulk('Os', 'fcc', a=3.4, cubic=True)"));
    expect(r.warnings.some((w) => w.severity === 'severe' && w.code === 'density-high')).toBe(true);
  });

  it('keeps the listed pairs bounded and counts all of them', () => {
    const s = aseBulk("bulk('Al', 'fcc', a=2.0, cubic=True).repeat(3)");
    const r = checkStructure(s, { maxListed: 7 });
    expect(r.tooClose).toHaveLength(7);
    // a = 2 Å: the 12 neighbours at 1.414 Å and the 6 at 2.0 Å are all below 0.8·2.86 = 2.288 Å (fcc shells).
    expect(r.tooCloseCount).toBe((108 * (12 + 6)) / 2);
  });

  it('an empty structure is severe', () => {
    const r = checkStructure({ positions: new Float64Array(0), species: new Uint16Array(0), provenance: { engine: 'x', params: null } });
    expect(r.severe).toBe(true);
    expect(r.warnings[0].code).toBe('empty');
  });
});

describe('densities over the right region', () => {
  it('icosahedral patch: over its own sphere, → the 3D Penrose vertex density 1.539/aR³ (Vp = 0.7608 aR³, Vo = 0.4702 aR³, τ:1)', () => {
    // One vertex per rhombohedron (Euler), prolate:oblate = τ:1 (Socolar & Steinhardt, Phys. Rev. B 34 (1986) 617,
    // from memory); rhombohedron volume a³√(1 − 3c² + 2c³) with c = ±1/√5.
    const c = 1 / Math.sqrt(5);
    const vp = Math.sqrt(1 - 3 * c * c + 2 * c ** 3);
    const vo = Math.sqrt(1 - 3 * c * c - 2 * c ** 3);
    const aR = 4.6;
    const ideal = (TAU + 1) / ((TAU * vp + vo) * aR ** 3);
    const s = generate({ family: 'icosahedral', mode: 'patch', radius: 30, aR });
    const d = modelDensity(s);
    expect(d.region).toBe('patch sphere, R = 30 Å');
    expect(Math.abs(d.number / ideal - 1)).toBeLessThan(0.03);
    // And the 2/1 approximant's cell agrees (same model, periodic): a sanity bridge between the two regions.
    const cell = modelDensity(generate({ family: 'icosahedral', mode: 'approximant', order: '2/1', aR }));
    expect(Math.abs(cell.number / ideal - 1)).toBeLessThan(0.01);
  });

  it('Penrose rhombus patch: per Å² over the fully tiled disc, → (τ + 1)/(τ sin 72° + sin 36°) per edge² (one vertex per tile, thick:thin = τ)', () => {
    const ideal = (TAU + 1) / (TAU * Math.sin((72 * Math.PI) / 180) + Math.sin((36 * Math.PI) / 180));
    const d = modelDensity(generate({ family: 'penrose', radius: 30, edge: 1 }));
    expect(d.unit).toBe('atoms/Å²');
    expect(Math.abs(d.number / ideal - 1)).toBeLessThan(0.02);
  });

  it('Ammann–Beenker 12/5 approximant: 239 vertices on 99 squares + 140 rhombi, exactly (1 + √2)/2 per edge² over the cell area', () => {
    const s = generate({ family: 'octagonal', approximant: { p: 12, q: 5 }, edge: 1 });
    const d = modelDensity(s);
    expect(d.unit).toBe('atoms/Å²');
    expect(d.number).toBeCloseTo(239 / (99 + 140 * Math.SQRT1_2), 9);
    expect(() => checkStructure(s)).not.toThrow();
  });

  it('Fibonacci chain: per Å, → (τ + 1)/(τ·L + S) with L = 1, S = 1/τ', () => {
    const d = modelDensity(generate({ family: 'fibonacci', order: 12, approximant: true }));
    expect(d.unit).toBe('atoms/Å');
    expect(d.number).toBeCloseTo((TAU + 1) / (TAU + 1 / TAU), 4);
  });
});

describe('space group provider and text', () => {
  it('reports what the provider finds, and says so when it finds P1, nothing or fails', () => {
    const s = aseBulk("bulk('Al', 'fcc', a=4.05, cubic=True)");
    expect(checkStructure(s, { spaceGroup: () => ({ number: 225, symbol: 'Fm-3m' }) }).spaceGroup).toEqual({ number: 225, symbol: 'Fm-3m' });
    expect(checkStructure(s, { spaceGroup: () => ({ number: 1, symbol: 'P1' }) }).warnings[0].code).toBe('p1');
    expect(checkStructure(s, { spaceGroup: () => null }).warnings[0].code).toBe('no-space-group');
    const failed = checkStructure(s, { spaceGroup: () => { throw new Error('boom'); } });
    expect(failed.warnings[0].message).toMatch(/boom/);
    expect(checkStructure(s).spaceGroup).toBeUndefined();
    // Above the finder's atom limit, or without a finder, the report says why there is no space group.
    const big = checkStructure(s, { spaceGroup: () => ({ number: 225, symbol: 'Fm-3m' }), spaceGroupMaxAtoms: 3 });
    expect(big.spaceGroup).toBeUndefined();
    expect(big.spaceGroupNote).toMatch(/^not computed: 4 atoms, above the 3-atom limit/);
    expect(checkText(big)).toContain('space group: not computed: 4 atoms');
    expect(checkStructure(s, { spaceGroupWhyNot: 'the finder is still loading' }).spaceGroupNote).toBe('not computed: the finder is still loading');
    const text = checkText(checkStructure(s, { spaceGroup: () => ({ number: 225, symbol: 'Fm-3m' }) }));
    expect(text).toContain('space group: Fm-3m (225)');
    expect(text).toContain('Al–Al  2.864 Å  limit 2.288 Å');
    expect(text).toContain('warnings: none');
  });

  it('contacts: the search reaches the first shell of every known element pair', () => {
    const c = contacts(aseBulk("bulk('Al', 'fcc', a=4.05, cubic=True)"));
    expect(c.searchRadius).toBeGreaterThanOrEqual(2 * 1.2 * 1.43);
    expect(c.truncated).toBe(false);
  });
});
