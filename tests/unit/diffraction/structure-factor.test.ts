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
