import { describe, expect, it } from 'vitest';
import {
  composition,
  density,
  minimumDistance,
  shellHistogram,
  type Cell,
  type Structure,
} from '@/lib/structure';
import { runPython } from '../../helpers/python';

const prov = { engine: 'test', params: null };

/** Conventional fcc cell repeated n×n×n (4 atoms per cell at 0,0,0; ½,½,0; ½,0,½; 0,½,½). */
function fcc(a: number, n: number, z = 13): Structure {
  const pos: number[] = [];
  const basis = [
    [0, 0, 0],
    [0.5, 0.5, 0],
    [0.5, 0, 0.5],
    [0, 0.5, 0.5],
  ];
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) for (let k = 0; k < n; k++) for (const b of basis) pos.push((i + b[0]) * a, (j + b[1]) * a, (k + b[2]) * a);
  return {
    positions: Float64Array.from(pos),
    species: new Uint16Array(pos.length / 3).fill(z),
    cell: [
      [n * a, 0, 0],
      [0, n * a, 0],
      [0, 0, n * a],
    ],
    provenance: prov,
  };
}

/** Deterministic pseudo-random numbers (LCG from Numerical Recipes, common practice). */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (1664525 * s + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

const tric: Cell = [
  [7.3, 0, 0],
  [2.9, 6.1, 0],
  [-1.7, 1.3, 5.6],
];

function randomTriclinic(n: number, seed: number): Structure {
  const r = lcg(seed);
  const pos = new Float64Array(3 * n);
  for (let i = 0; i < n; i++) {
    // Some atoms outside the cell on purpose: the search must wrap them.
    const f = [r() * 1.4 - 0.2, r() * 1.4 - 0.2, r() * 1.4 - 0.2];
    for (let q = 0; q < 3; q++) pos[3 * i + q] = f[0] * tric[0][q] + f[1] * tric[1][q] + f[2] * tric[2][q];
  }
  return { positions: pos, species: new Uint16Array(n).fill(26), cell: tric, provenance: prov };
}

describe('minimum distance', () => {
  it('fcc Al: nearest neighbour a/√2 (geometry of the fcc lattice)', () => {
    const a = 4.0495; // Al lattice parameter at room temperature, handbook value (from memory)
    const m = minimumDistance(fcc(a, 3));
    expect(m.distance).toBeCloseTo(a / Math.SQRT2, 10);
    expect(m.below).toEqual([]);
  });

  it('handles 10^5 atoms (fcc 30×30×30 cells): still a/√2, no pair below 2.5 Å (correctness at scale; speed is in tests/bench)', () => {
    const a = 4.0495;
    const m = minimumDistance(fcc(a, 30), { threshold: 2.5 });
    expect(m.distance).toBeCloseTo(a / Math.SQRT2, 10);
    expect(m.belowCount).toBe(0);
  });

  it('a single atom in a cubic cell sees its own image at the cell edge', () => {
    const s: Structure = { positions: new Float64Array([0.3, 0.2, 0.1]), species: new Uint16Array([13]), cell: [[3, 0, 0], [0, 4, 0], [0, 0, 5]], provenance: prov };
    expect(minimumDistance(s).distance).toBeCloseTo(3, 12);
  });

  it('lists the offending pairs below a threshold, shortest first, across the periodic boundary', () => {
    const s = fcc(4, 2);
    const n = s.species.length;
    const pos = new Float64Array(s.positions.length + 3);
    pos.set(s.positions);
    pos.set([7.9, 0.05, 0], 3 * n); // 0.1 Å from (0,0,0)'s image at (8,0,0)... and 0.05 in y
    const t: Structure = { ...s, positions: pos, species: new Uint16Array(n + 1).fill(13) };
    const m = minimumDistance(t, { threshold: 0.5 });
    expect(m.belowCount).toBe(1);
    expect(m.below[0].i).toBe(0);
    expect(m.below[0].j).toBe(n);
    expect(m.below[0].distance).toBeCloseTo(Math.hypot(0.1, 0.05), 12);
    expect(m.distance).toBeCloseTo(Math.hypot(0.1, 0.05), 12);
  });

  it('random triclinic cell: the shortest distance ase.neighborlist finds (reference library; the pair search itself is checked in tests/unit/math/cell-list.test.ts)', () => {
    const s = randomTriclinic(300, 7);
    const min = runPython<number>(
      `import sys, json
from ase import Atoms
from ase.neighborlist import neighbor_list
d = json.loads(sys.stdin.read())
a = Atoms("Fe%d" % len(d["pos"]), positions=d["pos"], cell=d["cell"], pbc=True)
print(json.dumps(float(neighbor_list("d", a, 3.0).min())))`,
      JSON.stringify({ pos: Array.from({ length: 300 }, (_, i) => Array.from(s.positions.slice(3 * i, 3 * i + 3))), cell: s.cell }),
    );
    expect(minimumDistance(s).distance).toBeCloseTo(min, 9);
  });

  it('finite patch without a cell', () => {
    const s: Structure = { positions: new Float64Array([0, 0, 0, 3, 0, 0, 3, 1.2, 0, 10, 10, 10]), species: new Uint16Array(4), provenance: prov };
    const m = minimumDistance(s);
    expect(m.distance).toBeCloseTo(1.2, 12);
    expect(m.pair).toEqual({ i: 1, j: 2, distance: expect.closeTo(1.2, 12) });
  });
});

describe('composition', () => {
  it('counts by element, occupancy weighted, with mixed sites', () => {
    const s: Structure = {
      positions: new Float64Array(12),
      species: new Uint16Array([13, 13, 25, 48]),
      site: new Uint16Array([0, 0, 1, 2]),
      siteClasses: [
        { name: 'a', species: 13 },
        { name: 'b', species: 25, occupancy: 0.5 },
        { name: 'm', species: 48, mix: { 48: 0.6, 70: 0.4 } },
      ],
      provenance: prov,
    };
    const c = composition(s);
    expect(c.total).toBeCloseTo(3.5, 12);
    expect(c.entries.map((e) => [e.symbol, e.count])).toEqual([
      ['Al', 2],
      ['Mn', 0.5],
      ['Cd', expect.closeTo(0.6, 12)],
      ['Yb', expect.closeTo(0.4, 12)],
    ]);
    expect(c.entries[0].fraction).toBeCloseTo(2 / 3.5, 12);
  });
});

describe('density', () => {
  it('fcc Al: 4 atoms / a³ and 2.70 g/cm³ (handbook density of aluminium, CRC Handbook: 2.70 g/cm³)', () => {
    const d = density(fcc(4.0495, 2));
    expect(d.numberDensity).toBeCloseTo(4 / 4.0495 ** 3, 12);
    expect(d.massDensity).toBeCloseTo(2.70, 2);
  });

  it('rock salt NaCl (a = 5.640 Å, from memory): 2.16 g/cm³ (handbook value)', () => {
    const s = fcc(5.64, 1, 11);
    const cl = fcc(5.64, 1, 17);
    for (let i = 0; i < cl.positions.length; i++) cl.positions[i] += i % 3 === 0 ? 2.82 : 0;
    const both: Structure = { ...s, positions: Float64Array.from([...s.positions, ...cl.positions]), species: Uint16Array.from([...s.species, ...cl.species]) };
    expect(density(both).massDensity).toBeCloseTo(2.165, 2);
  });

  it('finite patch: inner-ball estimate approaches the bulk value for a large patch', () => {
    const a = 4.0495;
    const s = fcc(a, 12);
    delete s.cell;
    const d = density(s);
    expect(d.region.method).toBe('inner-ball');
    // Default ball (radius ≈ 11 Å, ~330 atoms): lattice-point counting error of several % (common practice estimate).
    expect(Math.abs(d.numberDensity / (4 / a ** 3) - 1)).toBeLessThan(0.1);
    // A 20 Å ball (~2000 atoms) is within 3 %.
    const big = density(s, { innerRadius: 20 });
    expect(big.region.radius).toBe(20);
    expect(Math.abs(big.numberDensity / (4 / a ** 3) - 1)).toBeLessThan(0.03);
    expect(() => density({ ...s, dim: 2 })).toThrow(/3D/);
  });

  it('mass density matches ase (masses · 1.66053906660 / volume)', () => {
    const s = randomTriclinic(50, 3);
    s.species[0] = 70;
    s.species[1] = 48;
    const ref = runPython<number>(
      `import sys, json
from ase import Atoms
from ase.data import atomic_masses_iupac2016 as m
d = json.loads(sys.stdin.read())
a = Atoms(numbers=d["z"], positions=d["pos"], cell=d["cell"], pbc=True)
print(json.dumps(float(sum(m[z] for z in d["z"]) / a.get_volume() * 1.66053906660)))`,
      JSON.stringify({ z: Array.from(s.species), pos: Array.from({ length: 50 }, (_, i) => Array.from(s.positions.slice(3 * i, 3 * i + 3))), cell: s.cell }),
    );
    expect(density(s).massDensity).toBeCloseTo(ref, 10);
  });
});

describe('neighbour shells', () => {
  it('fcc: 12, 6, 24, 12 neighbours at a/√2, a, a√(3/2), a√2 (fcc coordination shells)', () => {
    const a = 4;
    const s = fcc(a, 3);
    const h = shellHistogram(s, 6, 600);
    const at = (r: number) => {
      const b = Math.floor((r / 6) * 600);
      return h.perAtom[b];
    };
    expect(at(a / Math.SQRT2)).toBe(12);
    expect(at(a)).toBe(6);
    expect(at(a * Math.sqrt(1.5))).toBe(24);
    expect(at(a * Math.SQRT2)).toBe(12);
    const total = h.perAtom.reduce((x, y) => x + y, 0);
    expect(total).toBe(12 + 6 + 24 + 12);
  });

  it('triclinic histogram equals numpy.histogram of ase neighbour distances', () => {
    const s = randomTriclinic(200, 11);
    const h = shellHistogram(s, 5, 25);
    const ref = runPython<number[]>(
      `import sys, json, numpy as np
from ase import Atoms
from ase.neighborlist import neighbor_list
d = json.loads(sys.stdin.read())
a = Atoms("Fe%d" % len(d["pos"]), positions=d["pos"], cell=d["cell"], pbc=True)
dist = neighbor_list("d", a, 5.0)
c, _ = np.histogram(dist, bins=25, range=(0, 5))
print(json.dumps((c / 2).tolist()))`,
      JSON.stringify({ pos: Array.from({ length: 200 }, (_, i) => Array.from(s.positions.slice(3 * i, 3 * i + 3))), cell: s.cell }),
    );
    expect(Array.from(h.pairs)).toEqual(ref);
  });
});
