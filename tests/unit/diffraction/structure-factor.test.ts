/**
 * Structure factors of large cells: the grid route (sf-grid.ts), the Friedel-unique list (sf-friedel.ts),
 * the typed enumeration and the blocked direct sum (hkl-sum.ts), each against gemmi's structure-factor
 * calculator (StructureFactorCalculatorX.calculate_sf_from_small_structure, IT92 form factors, exp(+2πi h·x))
 * or a numpy count run through /usr/bin/python3.
 */
import { describe, expect, it } from 'vitest';
import { enumerateHkl, enumerateHklRange, GRID_THRESHOLD, structureFactorsHkl } from '../../../lib/diffraction/structure-factor';
import { friedelUniqueFactors } from '../../../lib/diffraction/sf-friedel';
import { gridPlan } from '../../../lib/diffraction/sf-grid';
import { generate } from '../../../lib/models';
import type { Structure } from '../../../lib/structure/types';
import { cellFromParameters } from '../../../lib/math/cell';
import { toFractional } from '../../../lib/math/frac';
import { runPython } from '../../helpers/python';
import { axisSymmetry } from '../../../lib/diffraction/sf-symmetry';
import { hklOrbits, hklSignGroup } from '../../../lib/diffraction/hkl-orbits';
import { groupAtoms } from '../../../lib/diffraction/scatterers';

function lcg(seed: number): () => number {
  let s = seed;
  return () => (s = (s * 16807) % 2147483647) / 2147483647;
}

/** A triclinic cell with 240 random atoms of Al, Fe, Cu in three site classes with occupancies and B. */
function triclinic(): Structure {
  const cell = cellFromParameters({ a: 11, b: 13, c: 9.5, alpha: 80, beta: 95, gamma: 105 });
  const rnd = lcg(4242);
  const n = 240;
  const positions = new Float64Array(3 * n);
  const species = new Uint16Array(n);
  const site = new Uint16Array(n);
  const zs = [13, 26, 29];
  for (let i = 0; i < n; i++) {
    const f = [rnd(), rnd(), rnd()];
    for (let c = 0; c < 3; c++) positions[3 * i + c] = f[0] * cell[0][c] + f[1] * cell[1][c] + f[2] * cell[2][c];
    site[i] = i % 3;
    species[i] = zs[i % 3];
  }
  return {
    positions,
    species,
    site,
    siteClasses: [
      { name: 'a', species: 13, biso: 0.8 },
      { name: 'b', species: 26, occupancy: 0.7, biso: 0.5 },
      { name: 'c', species: 29, occupancy: 0.4 },
    ],
    cell,
    provenance: { params: { test: true }, engine: 'test' },
  };
}

/** gemmi's F for every listed reflection of a P1 structure (occupancy, U_iso = B/8π²). */
function gemmiF(s: Structure, hkl: Int32Array): [number, number][] {
  const frac = toFractional(s.cell!, s.positions);
  const p = (v: number[]) => Math.hypot(v[0], v[1], v[2]);
  const [a, b, c] = s.cell!;
  const ang = (u: number[], v: number[]) => (Math.acos((u[0] * v[0] + u[1] * v[1] + u[2] * v[2]) / (p(u) * p(v))) * 180) / Math.PI;
  const input = {
    cell: [p(a), p(b), p(c), ang(b, c), ang(a, c), ang(a, b)],
    sites: Array.from(s.species, (z, i) => {
      const sc = s.siteClasses?.[s.site![i]];
      return [z, frac[3 * i], frac[3 * i + 1], frac[3 * i + 2], sc?.occupancy ?? 1, (sc?.biso ?? 0) / (8 * Math.PI ** 2)];
    }),
    hkl: Array.from(hkl),
  };
  return runPython<[number, number][]>(
    `
import gemmi, json, sys
d = json.load(sys.stdin)
ss = gemmi.SmallStructure(); ss.cell = gemmi.UnitCell(*d['cell']); ss.spacegroup_hm = 'P 1'
for i, (z, x, y, w, occ, u) in enumerate(d['sites']):
    st = gemmi.SmallStructure.Site(); st.label = 'S%d' % i; st.element = gemmi.Element(int(z))
    st.fract = gemmi.Fractional(x, y, w); st.occ = occ; st.u_iso = u
    ss.add_site(st)
ss.setup_cell_images()
calc = gemmi.StructureFactorCalculatorX(ss.cell)
h = d['hkl']; out = []
for i in range(0, len(h), 3):
    f = calc.calculate_sf_from_small_structure(ss, [h[i], h[i+1], h[i+2]])
    out.append([f.real, f.imag])
print(json.dumps(out))`,
    JSON.stringify(input),
  );
}

/** Largest |ΔF| over all reflections relative to the largest |F|, and largest relative Δ|F|² over the strong ones (|F|² ≥ 1 % of the largest). */
function errors(re: Float64Array, im: Float64Array, ref: [number, number][]): { dF: number; dF2strong: number; strong: number } {
  let fmax = 0;
  for (const [r, i] of ref) fmax = Math.max(fmax, Math.hypot(r, i));
  let dF = 0;
  let dF2strong = 0;
  let strong = 0;
  ref.forEach(([r, i], m) => {
    dF = Math.max(dF, Math.hypot(re[m] - r, im[m] - i));
    const f2 = r * r + i * i;
    if (f2 >= 0.01 * fmax * fmax) {
      strong++;
      dF2strong = Math.max(dF2strong, Math.abs(re[m] ** 2 + im[m] ** 2 - f2) / f2);
    }
  });
  return { dF: dF / fmax, dF2strong, strong };
}

describe('grid structure factors against gemmi', () => {
  it('triclinic cell, three groups with occupancy and B, full list with ±h: |ΔF| ≤ 1e-5 of max |F| (the default tolerance), strong |F|² (≥ 1 % of the largest, so |F| ≥ 0.1 max) within 2e-4 (gemmi direct sum)', () => {
    const s = triclinic();
    const hkl = enumerateHkl(s, 1.1);
    const ref = gemmiF(s, hkl);
    expect(ref).toHaveLength(hkl.length / 3);
    const grid = structureFactorsHkl(s, hkl, 'xray', { method: 'grid' });
    const direct = structureFactorsHkl(s, hkl, 'xray', { method: 'direct' });
    const eg = errors(grid.re, grid.im, ref);
    const ed = errors(direct.re, direct.im, ref);
    expect(eg.strong).toBeGreaterThan(20);
    expect(eg.dF).toBeLessThan(1e-5);
    expect(eg.dF2strong).toBeLessThan(2e-4);
    // A tighter tolerance tightens the result in proportion.
    const tight = structureFactorsHkl(s, hkl, 'xray', { method: 'grid', tolerance: 1e-8 });
    const et = errors(tight.re, tight.im, ref);
    expect(et.dF).toBeLessThan(1e-8);
    expect(et.dF2strong).toBeLessThan(2e-7);
    // The exact route is the reference mode: rounding only.
    expect(ed.dF).toBeLessThan(1e-10);
  });

  it('the 2/1 icosahedral approximant (Al), Friedel-unique list to d = 0.9 Å: within the default tolerance of gemmi, and a looser tolerance stays within its bound', () => {
    const s = generate({ family: 'icosahedral', mode: 'approximant', order: '2/1', aR: 4.6, species: 'Al' } as never);
    const f = friedelUniqueFactors(s, 0.9, 'xray', { method: 'grid' });
    const ref = gemmiF(s, f.hkl);
    const e = errors(f.re, f.im, ref);
    expect(e.strong).toBeGreaterThan(50);
    expect(e.dF).toBeLessThan(1e-5);
    expect(e.dF2strong).toBeLessThan(2e-4);
    const loose = friedelUniqueFactors(s, 0.9, 'xray', { method: 'grid', tolerance: 1e-3 });
    const el = errors(loose.re, loose.im, ref);
    // |ΔF| ≤ tolerance · Σ f, and Σ f ≈ max |F| at the lowest angles of an approximant (most atoms in phase).
    expect(el.dF).toBeLessThan(1e-3);
    expect(el.dF).toBeGreaterThan(1e-6); // the looser grid really is coarser
    expect(f.multiplicity.every((m) => m === 2)).toBe(true);
  });
});

describe('reflection lists', () => {
  it('enumerateHkl counts the reflections with d ≥ dMin of a triclinic cell like a numpy count, and the half list holds exactly one of each ±h', () => {
    const s = triclinic();
    const full = enumerateHkl(s, 1.3);
    const half = enumerateHklRange(s, 1.3, true);
    const [a, b, c] = s.cell!;
    const count = runPython<number>(
      `
import numpy as np, json
A = np.array(${JSON.stringify([a, b, c])}); B = np.linalg.inv(A).T
r = np.arange(-20, 21); H = np.array(np.meshgrid(r, r, r, indexing='ij')).reshape(3, -1).T
g = np.linalg.norm(H @ B, axis=1)
print(json.dumps(int(((g > 0) & (g <= 1 / 1.3)).sum())))`,
    );
    expect(full.length / 3).toBe(count);
    expect(half.length / 3).toBe(count / 2);
    const key = (h: number, k: number, l: number) => `${h},${k},${l}`;
    const inHalf = new Set<string>();
    for (let i = 0; i < half.length; i += 3) inHalf.add(key(half[i], half[i + 1], half[i + 2]));
    for (let i = 0; i < half.length; i += 3) expect(inHalf.has(key(-half[i], -half[i + 1], -half[i + 2]))).toBe(false);
  });

  it('auto takes the grid route only above the threshold, so small cells keep the exact sum', () => {
    const s = triclinic();
    const hkl = enumerateHkl(s, 2);
    expect(s.species.length * (hkl.length / 3)).toBeLessThan(GRID_THRESHOLD);
    const auto = structureFactorsHkl(s, hkl, 'xray');
    const direct = structureFactorsHkl(s, hkl, 'xray', { method: 'direct' });
    expect(Array.from(auto.re)).toEqual(Array.from(direct.re));
  });

  it('reports progress from both routes, ending at 1', () => {
    const s = triclinic();
    const hkl = enumerateHkl(s, 1.5);
    for (const method of ['grid', 'direct'] as const) {
      const seen: number[] = [];
      structureFactorsHkl(s, hkl, 'xray', { method, onProgress: (x) => seen.push(x) });
      expect(seen.length).toBeGreaterThan(1);
      expect(seen[seen.length - 1]).toBe(1);
      expect(seen.every((x, i) => i === 0 || x >= seen[i - 1])).toBe(true);
    }
  });

  it('rejects a tolerance outside (0, 0.1) and a non-periodic structure, naming the field', () => {
    expect(() => gridPlan(10, 0)).toThrow(/tolerance/);
    expect(() => gridPlan(10, 0.5)).toThrow(/tolerance/);
    const s = triclinic();
    expect(() => structureFactorsHkl(s, enumerateHkl(s, 3), 'xray', { method: 'grid', tolerance: -1 })).toThrow(/tolerance/);
    expect(() => friedelUniqueFactors({ ...s, cell: undefined }, 1, 'xray')).toThrow(/cell/);
  });
});

/**
 * P2₁2₁2₁ (International Tables Vol. A No. 19: x,y,z; −x+½,−y,z+½; −x,y+½,−z+½; x+½,−y+½,−z), 3 × 30 general
 * positions of Al, Fe (occupancy 0.7), Cu (0.4) with B, every atom then moved by c = (0.13, 0.27, 0.41), so
 * the screw axes sit off the origin.
 */
function screwCell(): Structure {
  const cell = cellFromParameters({ a: 9.1, b: 10.3, c: 11.7, alpha: 90, beta: 90, gamma: 90 });
  const rnd = lcg(777);
  const ops = [
    (x: number, y: number, z: number) => [x, y, z],
    (x: number, y: number, z: number) => [-x + 0.5, -y, z + 0.5],
    (x: number, y: number, z: number) => [-x, y + 0.5, -z + 0.5],
    (x: number, y: number, z: number) => [x + 0.5, -y + 0.5, -z],
  ];
  const shift = [0.13, 0.27, 0.41];
  const pos: number[] = [];
  const species: number[] = [];
  const site: number[] = [];
  const zs = [13, 26, 29];
  for (let i = 0; i < 90; i++) {
    const f = [rnd(), rnd(), rnd()];
    for (const op of ops) {
      const g = op(f[0], f[1], f[2]).map((u, c) => u + shift[c]);
      for (let c = 0; c < 3; c++) pos.push(g[0] * cell[0][c] + g[1] * cell[1][c] + g[2] * cell[2][c]);
      species.push(zs[i % 3]);
      site.push(i % 3);
    }
  }
  return {
    positions: Float64Array.from(pos),
    species: Uint16Array.from(species),
    site: Uint16Array.from(site),
    siteClasses: [
      { name: 'a', species: 13, biso: 0.8 },
      { name: 'b', species: 26, occupancy: 0.7, biso: 0.5 },
      { name: 'c', species: 29, occupancy: 0.4 },
    ],
    cell,
    provenance: { params: { test: true }, engine: 'test' },
  };
}

/** spglib's operations (x → R x + t, in the cell's own basis) whose R is diagonal, as "sx sy sz|tx ty tz" with t mod 1 to 4 decimals. */
function spglibDiagonalOps(s: Structure, types: number[]): string[] {
  const frac = toFractional(s.cell!, s.positions);
  return runPython<string[]>(
    `
import spglib, json, sys, numpy as np
d = json.load(sys.stdin)
cell = (d['lattice'], np.array(d['frac']).reshape(-1, 3), d['types'])
sym = spglib.get_symmetry(cell, symprec=1e-5)
out = []
for r, t in zip(sym['rotations'], sym['translations']):
    if np.count_nonzero(r - np.diag(np.diag(r))) == 0:
        t = np.mod(np.round(t, 4), 1.0)
        out.append('%d %d %d|%.4f %.4f %.4f' % (r[0,0], r[1,1], r[2,2], *(x if x < 0.99995 else 0.0 for x in t)))
print(json.dumps(sorted(out)))`,
    JSON.stringify({ lattice: s.cell, frac: Array.from(frac), types }),
  );
}

/** Our operations in the cell's own origin: x → S x + t with t = t′ + c − S c. */
function ourOps(sym: ReturnType<typeof axisSymmetry>): string[] {
  const out: string[] = [];
  for (let o = 0; o < sym.sign.length / 3; o++) {
    const sg = [0, 1, 2].map((a) => sym.sign[3 * o + a]);
    const t = [0, 1, 2].map((a) => {
      const u = sym.half[3 * o + a] / 2 + sym.origin[a] - sg[a] * sym.origin[a];
      const w = Math.round((u - Math.floor(u)) * 1e4) / 1e4;
      return w >= 1 ? 0 : w;
    });
    out.push(`${sg.join(' ')}|${t.map((x) => x.toFixed(4)).join(' ')}`);
  }
  return out.sort();
}

describe('structure factors by symmetry (sf-symmetry.ts): one atom per orbit spread on the grid', () => {
  it('P2₁2₁2₁ off the origin with occupancies and B: the operations are spglib diagonal ones, and F (full ±h list) is within the default tolerance of gemmi', () => {
    const s = screwCell();
    const { groupOf, weight } = groupAtoms(s);
    const sym = axisSymmetry(toFractional(s.cell!, s.positions), groupOf, weight);
    expect(sym.sign.length / 3).toBe(4);
    expect(sym.rep.length).toBe(90);
    expect(ourOps(sym)).toEqual(spglibDiagonalOps(s, Array.from(groupOf)));
    const hkl = enumerateHkl(s, 1.0);
    const ref = gemmiF(s, hkl);
    const f = structureFactorsHkl(s, hkl, 'xray', { method: 'grid' });
    const e = errors(f.re, f.im, ref);
    expect(e.strong).toBeGreaterThan(20);
    expect(e.dF).toBeLessThan(1e-5);
    expect(e.dF2strong).toBeLessThan(2e-4);
    // Systematic absences of the screw axes (h00, 0k0, 00l with odd index), from the expansion: |F| at rounding.
    const at = (h: number, k: number, l: number) => {
      for (let i = 0; i < hkl.length; i += 3) if (hkl[i] === h && hkl[i + 1] === k && hkl[i + 2] === l) return Math.hypot(f.re[i / 3], f.im[i / 3]);
      throw new Error('missing');
    };
    for (const [h, k, l] of [[3, 0, 0], [0, 5, 0], [0, 0, 7]]) expect(at(h, k, l)).toBeLessThan(1e-9 * Math.hypot(...ref[0]) + 1e-9);
  });

  it('icosahedral approximants: the sign flips found are spglib diagonal operations (2/1: mmm about a centre off the origin; 5/3 symmetric cut: mmm with I centring)', () => {
    for (const [order, n] of [['2/1', 8], ['5/3', 16]] as const) {
      const s = generate({ family: 'icosahedral', mode: 'approximant', order, aR: 4.6, species: 'Al' } as never);
      const { groupOf, weight } = groupAtoms(s);
      const sym = axisSymmetry(toFractional(s.cell!, s.positions), groupOf, weight);
      expect(sym.sign.length / 3).toBe(n);
      // spglib sees species only, so the sites are typed by their occupancy.
      const occ = [...new Set(weight)];
      expect(ourOps(sym)).toEqual(spglibDiagonalOps(s, Array.from(weight, (w) => occ.indexOf(w) + 1)));
    }
  });

  it('without symmetry (a random triclinic cell) everything is spread: identity only', () => {
    const s = triclinic();
    const { groupOf, weight } = groupAtoms(s);
    const sym = axisSymmetry(toFractional(s.cell!, s.positions), groupOf, weight);
    expect(sym.sign.length).toBe(3);
    expect(sym.rep.length).toBe(240);
  });
});

describe('reflections by orbit (hkl-orbits.ts)', () => {
  it('P2₁2₁2₁: one reflection per orbit of the sign group with Friedel (mmm, 8 patterns), orbit sizes summing to a numpy count of the sphere (no pure translations here, so nothing is left out; the screw absences are zeros of F)', () => {
    const s = screwCell();
    const { groupOf, weight } = groupAtoms(s);
    const sym = axisSymmetry(toFractional(s.cell!, s.positions), groupOf, weight);
    const signs = hklSignGroup(s, sym, true);
    expect(signs.length / 3).toBe(8);
    const o = hklOrbits(s, 1.31, signs, sym.transHalf); // 1.3 would put 00±9 (d = c/9 = 1.3 Å) on the boundary
    for (let i = 0; i < o.hkl.length; i++) expect(o.hkl[i]).toBeGreaterThanOrEqual(0);
    const total = o.multiplicity.reduce((a, b) => a + b, 0);
    const [a, b, c] = s.cell!;
    const count = runPython<number>(
      `
import numpy as np, json
A = np.array(${JSON.stringify([a, b, c])}); B = np.linalg.inv(A).T
r = np.arange(-20, 21); H = np.array(np.meshgrid(r, r, r, indexing='ij')).reshape(3, -1).T
g = np.linalg.norm(H @ B, axis=1)
print(json.dumps(int(((g > 0) & (g <= 1 / 1.31)).sum())))`,
    );
    expect(total).toBe(count);
  });
});
