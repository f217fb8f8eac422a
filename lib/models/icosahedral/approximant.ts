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
import { classWindows, projectShifted, siteClassesOf, vertexClass } from './cut';
import type { Window } from './window';
import { walkCoset } from './walk';
import { windowContains, windowVolume, zonotopeWindow } from './window';
import { DEFAULT_MAX_POINTS, checkPointCap } from '../point-cap';

export type Centring = 'P' | 'I' | 'F';

export interface ApproximantSpec {
  p: number;
  q: number;
  aR: number;
  lattice?: HyperlatticeType;
  /** Phason offset: shift of the window in (strained) perpendicular space, Å. */
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
  cls: number;
}

function seedCell(f: ApproximantFrame, lattice: HyperlatticeType, s: ArrayLike<number>, explore: Window): Int32Array | null {
  // The window is centred on the offset: look for the node whose strained image is nearest to it.
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
    if (!windowContains(explore, u[0], u[1], u[2])) continue;
    const d = Math.hypot(u[0] - c[0], u[1] - c[1], u[2] - c[2]);
    if (d < bestD) {
      bestD = d;
      best = Int32Array.from(n);
    }
  }
  return best;
}

function cutCell(f: ApproximantFrame, lattice: HyperlatticeType, s: Float64Array, explore: Window, accept: Window, budget: number, cls: number): CellCut {
  const seed = seedCell(f, lattice, s, explore);
  if (!seed) return { shift: s, set: new IntVectorSet(6, 1), u: new Float64Array(0), keep: new Int32Array(0), cls };
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
  });
  const keep: number[] = [];
  for (let e = 0; e < set.size; e++) if (accept === explore || windowContains(accept, u[3 * e], u[3 * e + 1], u[3 * e + 2])) keep.push(e);
  return { shift: s, set, u, keep: Int32Array.from(keep), cls };
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
  const base = zonotopeWindow(f.M, { centre: [off[0] / f.lambda, off[1] / f.lambda, off[2] / f.lambda] });
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
  let centring: Centring = 'P';
  for (const c of CENTRINGS) if (c.t.every((t) => translationMapsOnto(f, lattice, cuts, classes, t))) centring = c.kind;

  const basis = icosahedralBasis(spec.aR);
  const positions = new Float64Array(3 * total);
  const perp = new Float64Array(3 * total);
  const species = new Uint16Array(total);
  const site = new Uint16Array(total);
  const hasOcc = classes.some((c) => c.occupancy !== undefined && c.occupancy !== 1);
  const occupancy = hasOcc ? new Float64Array(total) : undefined;
  let o = 0;
  for (const cut of cuts) {
    const cl = classes[cut.cls];
    for (const e of cut.keep) {
      for (let c = 0; c < 3; c++) {
        let x = 0;
        for (let i = 0; i < 6; i++) x += (cut.set.coords[6 * e + i] + cut.shift[i]) * basis.par[3 * i + c];
        positions[3 * o + c] = x;
        perp[3 * o + c] = cut.u[3 * e + c] * f.lambda;
      }
      species[o] = cl.species;
      site[o] = cut.cls;
      if (occupancy) occupancy[o] = cl.occupancy ?? 1;
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
    centring,
  };
  if (occupancy) s.occupancy = occupancy;
  return s;
}
