/**
 * Cubic approximants p/q = F(n+1)/F(n) of the icosahedral cut, by linear phason strain.
 *
 * Strain: accept n when π⊥(n) − s·π∥(n) − offset ∈ W', with s = (qτ − p)/(pτ + q) (s → 0 as p/q → τ).
 * Positions stay π∥(n) with the true τ, so tiling edges keep length aR exactly. Then
 *     N_x = (q, −q, 0, 0, p, p),  N_y = (p, p, q, −q, 0, 0),  N_z = (0, 0, p, p, q, −q)
 * have π⊥(N) = s·π∥(N) and the cut is periodic with the cubic cell π∥(N_k) = a·x̂_k,
 *     a(p/q) = 2(pτ + q)·aR / √(2 + τ)      (Elser & Henley, PRL 55 (1985) 2883).
 * The strained perpendicular vectors are w_i = e_i⊥ − s·e_i∥ = λ·M_i with integer rows M_i = q·(e_i⊥ shape
 * with τ → p/q), λ = √(2+τ)·aR/(pτ + q) (algebra: (τ − s)/(1 + sτ) = p/q). The window W' is the zonotope of
 * the w_i (the hypercube projected along the rational cut space), so every test runs on small integers
 * (exact for dyadic site positions) and the half-open rule of window.ts decides ties.
 * Vertices per cell = vol(W')·a³/(8aR⁶) = Σ_{i<j<k}|det(M_i, M_j, M_k)| — an integer (model-set density,
 * Baake & Grimm 2013, with the strain of determinant 1).
 *
 * Cell reduction is exact: the fractional coordinate along x is (A + Bτ)/(2(pτ + q)) with A = n1 − n2,
 * B = n5 + n6 (y: A = n3 − n4, B = n1 + n2; z: A = n5 − n6, B = n3 + n4), and the sign of u + vτ for small
 * integers (or dyadics) u, v is decided reliably in floating point because |u + vτ| ≥ 1/(3|v|) unless
 * u = v = 0 (τ is badly approximable). Each node is stored reduced into [0, 1)³ (half-open: 0 kept, 1 not).
 *
 * Window position and symmetry: the window centre is the symmetric reference δ₀ (symmetricCentre below,
 * an m-3-fixed point modulo the perpendicular periods Λ⊥) plus the phason offset, reduced modulo 2Z³ ⊂ Λ⊥
 * (which moves the cut by a lattice translation only). Nodes on the window boundary get the m-3-averaged
 * weight of window.ts; they occur at δ₀ only when no m-3-fixed centre avoids the boundary (1/1 and 5/3 P,
 * every F cell — found by enumeration, see the tests) and then carry fractional occupancy.
 *
 * Centring: a translation t of the cubic cell (I: ½(1,1,1); F: ½(1,1,0) and permutations) corresponds to
 * T = Σ t_k N_k in 6D; it maps the cut onto itself exactly when, for each site class, T carries the class's
 * nodes onto nodes of a class with the same species and window — checked node by node on the hash sets.
 */
import type { Cell, Structure, Vec3 } from '../../structure/types';
import { ENGINE_VERSION } from '../../version';
import type { HyperlatticeType } from './hyperlattice';
import { hyperlatticeCosets, hyperlatticeSteps, icosahedralBasis, icosahedralDirections, inHyperlattice } from './hyperlattice';
import { TAU } from '../../math/golden';
import { IntVectorSet } from '../../math/int-vector-set';
import type { CutClass } from './cut';
import { classWindows, directionOrbit, projectShifted, pyritohedralGroup, siteClassesOf, vertexClass } from './cut';
import type { Window } from './window';
import { walkCoset } from './walk';
import { boundaryWeight, windowContainsClosed, windowVolume, zonotopeWindow } from './window';
import { DEFAULT_MAX_POINTS, checkPointCap } from '../point-cap';

export type Centring = 'P' | 'I' | 'F';

export interface ApproximantSpec {
  p: number;
  q: number;
  aR: number;
  lattice?: HyperlatticeType;
  /** Phason offset: shift of the window from the symmetric reference, (strained) perpendicular space, Å. */
  offset?: Vec3;
  maxPoints?: number;
  classes?: CutClass[];
  params?: unknown;
}

export interface ApproximantFrame {
  p: number;
  q: number;
  aR: number;
  /** Cubic lattice constant a(p/q), Å. */
  a: number;
  /** Phason strain s. */
  strain: number;
  /** Å per integer perpendicular unit. */
  lambda: number;
  /** Integer strained perpendicular rows M_i (6×3). */
  M: Float64Array;
  /** Periods N_x, N_y, N_z (3×6). */
  periods: Int32Array;
}

/** Elser–Henley lattice constant a(p/q) = 2(pτ + q)·aR/√(2 + τ). */
export function approximantLatticeConstant(p: number, q: number, aR: number): number {
  return (2 * (p * TAU + q) * aR) / Math.sqrt(2 + TAU);
}

function isFibonacciPair(p: number, q: number): boolean {
  let a = 1;
  let b = 1; // F(1), F(2)
  while (a <= q) {
    if (a === q && b === p) return true;
    [a, b] = [b, a + b];
  }
  return false;
}

export function approximantFrame(p: number, q: number, aR: number): ApproximantFrame {
  if (!Number.isInteger(p) || !Number.isInteger(q) || !isFibonacciPair(p, q))
    throw new RangeError(`order: must be a ratio of consecutive Fibonacci numbers F(n+1)/F(n) such as 1/1, 2/1, 3/2, 5/3; got ${p}/${q}`);
  icosahedralBasis(aR); // validates aR
  const M = icosahedralDirections(p / q, 'perp');
  for (let k = 0; k < 18; k++) M[k] = Math.round(M[k] * q);
  const periods = Int32Array.from([q, -q, 0, 0, p, p, p, p, q, -q, 0, 0, 0, 0, p, p, q, -q]);
  return {
    p,
    q,
    aR,
    a: approximantLatticeConstant(p, q, aR),
    strain: (q * TAU - p) / (p * TAU + q),
    lambda: (Math.sqrt(2 + TAU) * aR) / (p * TAU + q),
    M,
    periods,
  };
}

/** Exact vertex count of one cell of the plain tiling (P hyperlattice): Σ|det(M_i, M_j, M_k)|. */
export function approximantVertexCount(p: number, q: number): number {
  return Math.round(windowVolume(zonotopeWindow(approximantFrame(p, q, 1).M)));
}

/** floor((A + Bτ)/D) with D = 2(pτ + q), exact (header). */
function floorFrac(A: number, B: number, p: number, q: number): number {
  const v = (A + B * TAU) / (2 * (p * TAU + q));
  let k = Math.floor(v);
  // Far from an integer the float floor is already exact; only near-ties need the exact sign test.
  if (v - k > 1e-9 && v - k < 1 - 1e-9) return k;
  if (A - 2 * q * k + (B - 2 * p * k) * TAU < 0) k--;
  else if (A - 2 * q * (k + 1) + (B - 2 * p * (k + 1)) * TAU >= 0) k++;
  return k;
}

/** Reduce node n (with site shift s) into the cell [0,1)³ in place: n −= Σ floor(frac_k)·N_k. */
function reduce(n: Int32Array, s: ArrayLike<number>, p: number, q: number): void {
  const kx = floorFrac(n[0] + s[0] - n[1] - s[1], n[4] + s[4] + n[5] + s[5], p, q);
  const ky = floorFrac(n[2] + s[2] - n[3] - s[3], n[0] + s[0] + n[1] + s[1], p, q);
  const kz = floorFrac(n[4] + s[4] - n[5] - s[5], n[2] + s[2] + n[3] + s[3], p, q);
  // n −= kx·N_x + ky·N_y + kz·N_z
  n[0] -= kx * q + ky * p;
  n[1] -= -kx * q + ky * p;
  n[2] -= ky * q + kz * p;
  n[3] -= -ky * q + kz * p;
  n[4] -= kx * p + kz * q;
  n[5] -= kx * p - kz * q;
}

interface CellCut {
  shift: Float64Array;
  set: IntVectorSet;
  /** Integer-unit strained perp image per node. */
  u: Float64Array;
  keep: Int32Array;
  /** Symmetric boundary weight per kept node (1 inside; window.ts boundaryWeight). */
  weight: Float64Array;
  cls: number;
}

function seedCell(f: ApproximantFrame, lattice: HyperlatticeType, s: ArrayLike<number>, explore: Window): Int32Array | null {
  // The window centre is reduced into [−1, 1)³ (perpendicular periods, below), so the search box
  // n ∈ [−2, 2]⁶ no longer depends on the offset; it found a seed for every order, lattice and offset
  // tried (tests: up to 60 Å on P, F and I). A miss throws instead of giving an empty cell.
  const n = new Int32Array(6);
  const u = new Float64Array(3);
  let best: Int32Array | null = null;
  let bestD = Infinity;
  const R = 2;
  const side = 2 * R + 1;
  const total = side ** 6;
  const c = explore.centre;
  for (let k = 0; k < total; k++) {
    let r = k;
    for (let i = 0; i < 6; i++) {
      n[i] = (r % side) - R;
      r = Math.floor(r / side);
    }
    if (lattice === 'F' && !inHyperlattice(n, 'F')) continue;
    projectShifted(n, s, f.M, u, 0);
    if (!windowContainsClosed(explore, u[0], u[1], u[2])) continue;
    const d = Math.hypot(u[0] - c[0], u[1] - c[1], u[2] - c[2]);
    if (d < bestD) {
      bestD = d;
      best = Int32Array.from(n);
    }
  }
  return best;
}

const TH_DIRS = directionOrbit(pyritohedralGroup());

function cutCell(f: ApproximantFrame, lattice: HyperlatticeType, s: Float64Array, explore: Window, accept: Window, budget: number, cls: number): CellCut {
  const seed = seedCell(f, lattice, s, explore);
  if (!seed) throw new Error(`approximant: no seed node found for the ${f.p}/${f.q} cell (window centre ${Array.from(explore.centre).join(', ')}); this is a bug`);
  reduce(seed, s, f.p, f.q);
  const { set, perp: u } = walkCoset({
    seed,
    shift: s,
    steps: hyperlatticeSteps(lattice === 'F' ? 'F' : 'P'),
    perp: f.M,
    explore,
    budget,
    budgetMessage: `maxPoints: the cell walk passed ${budget.toLocaleString('en-US')} nodes; raise maxPoints`,
    reduce: (m) => reduce(m, s, f.p, f.q),
    closed: true,
  });
  const keep: number[] = [];
  const weight: number[] = [];
  for (let e = 0; e < set.size; e++) {
    const wt = boundaryWeight(accept, u[3 * e], u[3 * e + 1], u[3 * e + 2], TH_DIRS);
    if (wt > 0) {
      keep.push(e);
      weight.push(wt);
    }
  }
  return { shift: s, set, u, keep: Int32Array.from(keep), weight: Float64Array.from(weight), cls };
}

/**
 * The perpendicular period lattice Λ⊥ = M·L (L the hyperlattice) in quarter units, modulo 8 (i.e. modulo
 * 2Z³, which Λ⊥ always contains: M₁ − M₂ = 2p·x̂ and −M₅ − M₆ = 2q·x̂ with gcd(p, q) = 1, and cyclically).
 * Returned as a membership table over (Z/8)³.
 */
function perpPeriodTable(f: ApproximantFrame, lattice: HyperlatticeType): Uint8Array {
  const gens: number[][] = [];
  const row = (i: number) => [f.M[3 * i], f.M[3 * i + 1], f.M[3 * i + 2]];
  if (lattice === 'F') {
    for (let i = 0; i < 6; i++) for (let j = i + 1; j < 6; j++) for (const sg of [1, -1]) gens.push(row(i).map((x, c) => x + sg * row(j)[c]));
  } else for (let i = 0; i < 6; i++) gens.push(row(i));
  if (lattice === 'I') gens.push([0, 1, 2].map((c) => 0.5 * [0, 1, 2, 3, 4, 5].reduce((a, i) => a + f.M[3 * i + c], 0)));
  gens.push([2, 0, 0], [0, 2, 0], [0, 0, 2]);
  const idx = (q: number[]) => ((((q[0] % 8) + 8) % 8) * 8 + (((q[1] % 8) + 8) % 8)) * 8 + (((q[2] % 8) + 8) % 8);
  const table = new Uint8Array(512);
  table[0] = 1;
  const queue = [[0, 0, 0]];
  while (queue.length) {
    const v = queue.pop()!;
    for (const g of gens) {
      const w = [0, 1, 2].map((c) => (((v[c] + Math.round(4 * g[c])) % 8) + 8) % 8);
      const k = idx(w);
      if (!table[k]) {
        table[k] = 1;
        queue.push(w);
      }
    }
  }
  return table;
}

function quarterIndex(q: ArrayLike<number>): number {
  const m = (x: number) => (((Math.round(x) % 8) + 8) % 8);
  return (m(q[0]) * 8 + m(q[1])) * 8 + m(q[2]);
}

/** Is δ (perpendicular integer units) fixed by every element of m-3 modulo Λ⊥? Needs δ on the quarter grid. */
function isSymmetricCentre(delta: ArrayLike<number>, table: Uint8Array): boolean {
  const q = [0, 1, 2].map((c) => 4 * delta[c]);
  if (q.some((x) => Math.abs(x - Math.round(x)) > 1e-9)) return false;
  const r = q.map(Math.round);
  return pyritohedralGroup().every((g) => {
    const d = [0, 1, 2].map((i) => g[3 * i] * r[0] + g[3 * i + 1] * r[1] + g[3 * i + 2] * r[2] - r[i]);
    return table[quarterIndex(d)] === 1;
  });
}

/** Reduce a window centre modulo 2Z³ ⊂ Λ⊥ into [−1, 1)³ (the cut moves by a lattice translation only). */
function reduceCentre(delta: ArrayLike<number>): Vec3 {
  const r = (x: number) => {
    let y = x - 2 * Math.round(x / 2);
    if (y >= 1 - 1e-12) y -= 2;
    if (Math.abs(y) < 1e-12) y = 0;
    return y;
  };
  return [r(delta[0]), r(delta[1]), r(delta[2])];
}

export interface SymmetricCentre {
  /** Window centre in perpendicular integer units, in [−1, 1)³. */
  centre: Vec3;
  /** Vertex-class nodes per cell on the window boundary there (0: whole atoms, m-3 kept). */
  boundaryNodes: number;
}

const symmetricCentreCache = new Map<string, SymmetricCentre>();

/**
 * The reference window position of the p/q cell: among the window centres fixed by m-3 modulo the
 * perpendicular periods Λ⊥ (the only positions where the cut keeps the full cubic point group: a symmetry g
 * of the cut needs gδ − δ ∈ Λ⊥), the one with fewest hyperlattice nodes on the window boundary
 * (ties: shortest, then lexicographic). With no node on the boundary every atom is whole and the count is
 * the ideal Σ|det M|; otherwise the boundary nodes carry m-3-symmetric fractional weights (window.ts).
 * Argument after Elser & Henley (PRL 55 (1985) 2883) and the model-set picture of Baake & Grimm (2013):
 * the symmetry of a cut is the stabiliser of its window position modulo the perpendicular lattice.
 */
export function symmetricCentre(p: number, q: number, lattice: HyperlatticeType = 'P'): SymmetricCentre {
  const key = `${p}/${q}/${lattice}`;
  const hit = symmetricCentreCache.get(key);
  if (hit) return hit;
  const f = approximantFrame(p, q, 1);
  const table = perpPeriodTable(f, lattice);
  const seen = new Uint8Array(512);
  const cands: Vec3[] = [];
  for (let k = 0; k < 512; k++) {
    if (seen[k]) continue;
    const q3 = [Math.floor(k / 64), Math.floor(k / 8) % 8, k % 8];
    const delta: Vec3 = [q3[0] / 4, q3[1] / 4, q3[2] / 4];
    if (!isSymmetricCentre(delta, table)) continue;
    // The class δ + Λ⊥: mark it, keep its shortest representative in [−1, 1)³.
    let best: Vec3 | null = null;
    for (let j = 0; j < 512; j++) {
      if (!table[j]) continue;
      const r = [Math.floor(j / 64), Math.floor(j / 8) % 8, j % 8];
      const m = quarterIndex([q3[0] + r[0], q3[1] + r[1], q3[2] + r[2]]);
      seen[m] = 1;
      const d = reduceCentre([(q3[0] + r[0]) / 4, (q3[1] + r[1]) / 4, (q3[2] + r[2]) / 4]);
      const n2 = d[0] ** 2 + d[1] ** 2 + d[2] ** 2;
      const b2 = best ? best[0] ** 2 + best[1] ** 2 + best[2] ** 2 : Infinity;
      if (n2 < b2 - 1e-12 || (Math.abs(n2 - b2) <= 1e-12 && best && (d[0] < best[0] || (d[0] === best[0] && (d[1] < best[1] || (d[1] === best[1] && d[2] < best[2])))))) best = d;
    }
    cands.push(best!);
  }
  const norm2 = (c: Vec3) => c[0] ** 2 + c[1] ** 2 + c[2] ** 2;
  cands.sort((a, b) => norm2(a) - norm2(b) || a[0] - b[0] || a[1] - b[1] || a[2] - b[2]);
  let choice: SymmetricCentre | null = null;
  for (const c of cands) {
    const base = zonotopeWindow(f.M, { centre: c });
    let boundary = 0;
    for (const coset of hyperlatticeCosets(lattice)) {
      const cut = cutCell(f, lattice, Float64Array.from(coset), base, base, Infinity, 0);
      for (const w of cut.weight) if (w < 1) boundary++;
    }
    if (!choice || boundary < choice.boundaryNodes) choice = { centre: c, boundaryNodes: boundary };
    if (boundary === 0) break;
  }
  symmetricCentreCache.set(key, choice!);
  return choice!;
}

/** Expected points per cell (density × cell volume) for the cap. */
export function estimateApproximantCount(spec: ApproximantSpec): number {
  const f = approximantFrame(spec.p, spec.q, spec.aR);
  const base = zonotopeWindow(f.M, { centre: [0, 0, 0] });
  const perNode = spec.lattice === 'F' ? 0.5 : spec.lattice === 'I' ? 2 : 1;
  let n = 0;
  for (const cl of spec.classes ?? [vertexClass()]) n += windowVolume(classWindows(cl.window, base, f.lambda).accept) * perNode;
  return n;
}

const CENTRINGS: { kind: Centring; t: Vec3[] }[] = [
  { kind: 'I', t: [[0.5, 0.5, 0.5]] },
  { kind: 'F', t: [[0.5, 0.5, 0], [0, 0.5, 0.5], [0.5, 0, 0.5]] },
];

function sameKind(a: CutClass, b: CutClass): boolean {
  return a.species === b.species && JSON.stringify(a.window) === JSON.stringify(b.window) && JSON.stringify(a.mix ?? null) === JSON.stringify(b.mix ?? null) && (a.occupancy ?? 1) === (b.occupancy ?? 1);
}

function translationMapsOnto(f: ApproximantFrame, lattice: HyperlatticeType, cuts: CellCut[], classes: CutClass[], t: Vec3): boolean {
  const T = new Float64Array(6);
  for (let k = 0; k < 3; k++) for (let i = 0; i < 6; i++) T[i] += t[k] * f.periods[6 * k + i];
  const d = new Float64Array(6);
  const m = new Int32Array(6);
  for (const a of cuts) {
    if (a.keep.length === 0) continue;
    // Find the cut b (same kind of site) with a.shift + T − b.shift in the walked lattice.
    const target = cuts.find((b) => {
      if (!sameKind(classes[a.cls], classes[b.cls]) || b.keep.length !== a.keep.length) return false;
      for (let i = 0; i < 6; i++) d[i] = a.shift[i] + T[i] - b.shift[i];
      return inHyperlattice(d, lattice === 'F' ? 'F' : 'P');
    });
    if (!target) return false;
    for (let i = 0; i < 6; i++) d[i] = a.shift[i] + T[i] - target.shift[i];
    const kept = new Uint8Array(target.set.size);
    for (const e of target.keep) kept[e] = 1;
    for (const e of a.keep) {
      for (let i = 0; i < 6; i++) m[i] = a.set.coords[6 * e + i] + d[i];
      reduce(m, target.shift, f.p, f.q);
      const j = target.set.indexOf(m);
      if (j < 0 || !kept[j]) return false;
    }
  }
  return true;
}

/** One cubic cell of the p/q approximant, reduced into [0,1)³, with its detected centring. */
export function icosahedralApproximant(spec: ApproximantSpec): Structure & { centring: Centring } {
  const lattice = spec.lattice ?? 'P';
  const f = approximantFrame(spec.p, spec.q, spec.aR);
  const maxPoints = spec.maxPoints ?? DEFAULT_MAX_POINTS;
  const classes = spec.classes ?? [vertexClass()];
  checkPointCap(estimateApproximantCount(spec), maxPoints, `the ${spec.p}/${spec.q} cell`);
  const off = spec.offset ?? [0, 0, 0];
  const ref = symmetricCentre(spec.p, spec.q, lattice);
  const rawCentre = [0, 1, 2].map((c) => ref.centre[c] + off[c] / f.lambda);
  if (rawCentre.some((x) => !Number.isFinite(x))) throw new RangeError(`offset: must be finite numbers in Å, got ${off.join(', ')}`);
  const centre = reduceCentre(rawCentre);
  const base = zonotopeWindow(f.M, { centre });
  const cuts: CellCut[] = [];
  const budget = 4 * maxPoints + 100_000;
  let total = 0;
  classes.forEach((cl, ci) => {
    const { accept, explore } = classWindows(cl.window, base, f.lambda);
    for (const coset of hyperlatticeCosets(lattice)) {
      const s = new Float64Array(6);
      for (let i = 0; i < 6; i++) s[i] = cl.position[i] + coset[i];
      const cut = cutCell(f, lattice, s, explore, accept, budget, ci);
      total += cut.keep.length;
      if (total > maxPoints) checkPointCap(total, maxPoints, `the ${spec.p}/${spec.q} cell`);
      cuts.push(cut);
    }
  });
  const notes = symmetryNotes(spec, f, lattice, ref, off, centre, cuts);
  let centring: Centring = 'P';
  for (const c of CENTRINGS) if (c.t.every((t) => translationMapsOnto(f, lattice, cuts, classes, t))) centring = c.kind;

  const basis = icosahedralBasis(spec.aR);
  const positions = new Float64Array(3 * total);
  const perp = new Float64Array(3 * total);
  const species = new Uint16Array(total);
  const site = new Uint16Array(total);
  const hasOcc = classes.some((c) => c.occupancy !== undefined && c.occupancy !== 1) || cuts.some((c) => c.weight.some((w) => w < 1));
  const occupancy = hasOcc ? new Float64Array(total) : undefined;
  let o = 0;
  for (const cut of cuts) {
    const cl = classes[cut.cls];
    for (let j = 0; j < cut.keep.length; j++) {
      const e = cut.keep[j];
      for (let c = 0; c < 3; c++) {
        let x = 0;
        for (let i = 0; i < 6; i++) x += (cut.set.coords[6 * e + i] + cut.shift[i]) * basis.par[3 * i + c];
        positions[3 * o + c] = x;
        perp[3 * o + c] = cut.u[3 * e + c] * f.lambda;
      }
      species[o] = cl.species;
      site[o] = cut.cls;
      if (occupancy) occupancy[o] = (cl.occupancy ?? 1) * cut.weight[j];
      o++;
    }
  }
  const cell: Cell = [
    [f.a, 0, 0],
    [0, f.a, 0],
    [0, 0, f.a],
  ];
  const s: Structure & { centring: Centring } = {
    positions,
    species,
    site,
    siteClasses: siteClassesOf(classes),
    perp,
    perpDim: 3,
    dim: 3,
    cell,
    provenance: { params: spec.params ?? spec, engine: ENGINE_VERSION },
    notes,
    centring,
  };
  if (occupancy) s.occupancy = occupancy;
  return s;
}

function fmt(x: number): string {
  return Number(x.toFixed(4)).toString();
}

/** What the window position does to the symmetry, in words for Structure.notes. */
function symmetryNotes(spec: ApproximantSpec, f: ApproximantFrame, lattice: HyperlatticeType, ref: SymmetricCentre, off: ArrayLike<number>, centre: Vec3, cuts: CellCut[]): string[] {
  const notes: string[] = [];
  const order = `${spec.p}/${spec.q} ${lattice}`;
  const refA = ref.centre.map((x) => fmt(x * f.lambda)).join(', ');
  const moved = off[0] !== 0 || off[1] !== 0 || off[2] !== 0;
  const rawOff = [0, 1, 2].map((c) => ref.centre[c] + off[c] / f.lambda);
  if (moved && rawOff.some((x, c) => Math.abs(x - centre[c]) > 1e-9))
    notes.push(`phason offset reduced modulo the perpendicular periods (2 units = ${fmt(2 * f.lambda)} Å per axis): window centre (${centre.map((x) => fmt(x * f.lambda)).join(', ')}) Å — the same cell up to a translation`);
  let fractional = 0;
  let sum = 0;
  for (const c of cuts) for (const w of c.weight) {
    if (w < 1) fractional++;
    sum += w;
  }
  const symmetric = isSymmetricCentre(centre, perpPeriodTable(f, lattice));
  if (!symmetric)
    notes.push(`the phason offset moves the window off every m-3-symmetric position: this ${order} cell keeps only the symmetry that offset allows (often none beyond translations); offset (0, 0, 0) gives the symmetric cut`);
  else if (!moved) notes.push(`window at the m-3-symmetric position (${refA}) Å of perpendicular space: cubic point group m-3 kept`);
  if (fractional > 0)
    notes.push(
      `${fractional} sites lie on the window boundary${symmetric ? ': no whole-atom choice keeps m-3 here' : ''}; they carry fractional occupancy (the m-3 average of a generic infinitesimal shift), summing with the rest to ${fmt(sum)} points per cell — use a generic phason offset for whole atoms`,
    );
  return notes;
}
