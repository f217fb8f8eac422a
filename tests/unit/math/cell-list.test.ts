import { describe, expect, it } from 'vitest';
import type { Cell } from '@/lib/math/cell';
import { forEachPairWithin } from '@/lib/math/cell-list';
import { runPython } from '../../helpers/python';

/** Deterministic pseudo-random numbers (LCG from Numerical Recipes, common practice). */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (1664525 * s + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

interface Pair {
  i: number;
  j: number;
  d: number;
  v: [number, number, number];
}

function ours(positions: Float64Array, cell: Cell | undefined, cut: number): Pair[] {
  const out: Pair[] = [];
  forEachPairWithin(positions, cell, cut, (i, j, d, dx, dy, dz) => out.push({ i, j, d, v: [dx, dy, dz] }));
  return out;
}

/**
 * Match two pair lists one to one: same (i, j), distance and separation vector within tol. Fails with the
 * first pair of `a` that has no partner in `b`.
 */
function expectSamePairs(a: Pair[], b: Pair[], tol = 1e-9): void {
  // The reference must find pairs: two empty lists would agree on nothing.
  expect(b.length).toBeGreaterThan(0);
  expect(a.length).toBe(b.length);
  const byKey = new Map<string, Pair[]>();
  for (const p of b) {
    const k = `${p.i} ${p.j}`;
    if (!byKey.has(k)) byKey.set(k, []);
    byKey.get(k)!.push(p);
  }
  for (const p of a) {
    const cand = byKey.get(`${p.i} ${p.j}`) ?? [];
    const k = cand.findIndex((q) => Math.abs(q.d - p.d) < tol && q.v.every((x, c) => Math.abs(x - p.v[c]) < tol));
    expect(k, `pair ${p.i}–${p.j} at ${p.d} Å has no partner`).toBeGreaterThanOrEqual(0);
    cand.splice(k, 1);
  }
}

/**
 * ase.neighborlist.neighbor_list on the same atoms, reduced to our convention: each unordered pair of
 * images once (i < j; for i = j the lexicographically positive shift), with D = r_j + S·cell − r_i.
 */
function aseNeighbours(positions: Float64Array, cell: Cell, cut: number): Pair[] {
  const n = positions.length / 3;
  const ref = runPython<{ i: number[]; j: number[]; d: number[]; D: number[][]; S: number[][] }>(
    `import sys, json
from ase import Atoms
from ase.neighborlist import neighbor_list
d = json.loads(sys.stdin.read())
a = Atoms("Fe%d" % len(d["pos"]), positions=d["pos"], cell=d["cell"], pbc=True)
i, j, dist, D, S = neighbor_list("ijdDS", a, d["cut"])
print(json.dumps({"i": i.tolist(), "j": j.tolist(), "d": dist.tolist(), "D": D.tolist(), "S": S.tolist()}))`,
    JSON.stringify({ pos: Array.from({ length: n }, (_, i) => Array.from(positions.slice(3 * i, 3 * i + 3))), cell, cut }),
  );
  const positive = (s: number[]) => s[0] > 0 || (s[0] === 0 && (s[1] > 0 || (s[1] === 0 && s[2] > 0)));
  const out: Pair[] = [];
  ref.i.forEach((i, k) => {
    const j = ref.j[k];
    if (i < j || (i === j && positive(ref.S[k]))) out.push({ i, j, d: ref.d[k], v: ref.D[k] as [number, number, number] });
  });
  return out;
}

/** All pairs i < j by a double loop (no cell). */
function bruteForce(p: Float64Array, cut: number): Pair[] {
  const out: Pair[] = [];
  const n = p.length / 3;
  for (let i = 0; i < n; i++)
    for (let j = i + 1; j < n; j++) {
      const v: [number, number, number] = [p[3 * j] - p[3 * i], p[3 * j + 1] - p[3 * i + 1], p[3 * j + 2] - p[3 * i + 2]];
      const d = Math.hypot(...v);
      if (d < cut) out.push({ i, j, d, v });
    }
  return out;
}

/** n random points with fractional coordinates in [−0.2, 1.2) — some outside the cell on purpose. */
function randomIn(cell: Cell, n: number, seed: number): Float64Array {
  const r = lcg(seed);
  const pos = new Float64Array(3 * n);
  for (let i = 0; i < n; i++) {
    const f = [r() * 1.4 - 0.2, r() * 1.4 - 0.2, r() * 1.4 - 0.2];
    for (let q = 0; q < 3; q++) pos[3 * i + q] = f[0] * cell[0][q] + f[1] * cell[1][q] + f[2] * cell[2][q];
  }
  return pos;
}

const tric: Cell = [
  [7.3, 0, 0],
  [2.9, 6.1, 0],
  [-1.7, 1.3, 5.6],
];

describe('periodic cell list against ase.neighborlist (reference library)', () => {
  it('triclinic cell, 300 atoms, cut-off 2.2 Å: the same pairs, distances and separation vectors', () => {
    const pos = randomIn(tric, 300, 7);
    const found = ours(pos, tric, 2.2);
    expect(found.length).toBeGreaterThan(50);
    expectSamePairs(found, aseNeighbours(pos, tric, 2.2));
  });

  it('small triclinic cell, cut-off beyond the cell (7 Å > face spacings): every image, self-images included', () => {
    const small: Cell = [
      [3.1, 0, 0],
      [0.8, 2.9, 0],
      [-0.6, 0.7, 3.4],
    ];
    const pos = randomIn(small, 5, 3);
    const found = ours(pos, small, 7);
    expect(found.some((p) => p.i === p.j)).toBe(true);
    expectSamePairs(found, aseNeighbours(pos, small, 7));
  });

  it('strongly sheared cell (γ = 30°), cut-off near half the smallest face spacing', () => {
    const shear: Cell = [
      [6, 0, 0],
      [6 * Math.cos(Math.PI / 6), 6 * Math.sin(Math.PI / 6), 0],
      [0.5, -0.4, 4.5],
    ];
    const pos = randomIn(shear, 120, 11);
    expectSamePairs(ours(pos, shear, 1.45), aseNeighbours(pos, shear, 1.45));
  });
});

describe('finite cell list against an all-pairs double loop', () => {
  it('finds exactly the pairs, dense and sparse, with their vectors', () => {
    const r = lcg(11);
    for (const [n, box, cut] of [[800, 20, 2.5], [300, 200, 6], [50, 3, 1], [400, 10, 30]] as const) {
      const p = new Float64Array(3 * n).map(() => r() * box);
      const found = ours(p, undefined, cut);
      expect(found.every((q) => q.i < q.j)).toBe(true);
      expectSamePairs(found, bruteForce(p, cut));
    }
  });

  it('flat and linear sets (tilings at z = 0, chains) and coincident points', () => {
    const r = lcg(2);
    const flat = new Float64Array(3 * 500).map((_, k) => (k % 3 === 2 ? 0 : r() * 30));
    expectSamePairs(ours(flat, undefined, 1.7), bruteForce(flat, 1.7));
    const chain = new Float64Array(3 * 200).map((_, k) => (k % 3 === 0 ? r() * 100 : 0));
    expectSamePairs(ours(chain, undefined, 0.9), bruteForce(chain, 0.9));
    const twins = new Float64Array([1, 1, 1, 1, 1, 1, 2, 1, 1]);
    expectSamePairs(ours(twins, undefined, 1.5), bruteForce(twins, 1.5));
    expect(ours(twins, undefined, 0.5)).toEqual([{ i: 0, j: 1, d: 0, v: [0, 0, 0] }]);
  });

  it('rejects a cut-off that is not a positive number', () => {
    expect(() => ours(new Float64Array(6), undefined, 0)).toThrow(/positive/);
    expect(() => ours(new Float64Array(6), undefined, Infinity)).toThrow(/positive/);
  });
});
