/**
 * Icosahedral cut-and-project: a finite ball of the 3D Penrose tiling (or of a decorated cut) around a
 * chosen point, with a phason offset (a shift of the window in perpendicular space).
 *
 * Accepted nodes: n in a hyperlattice coset Λ + s with π⊥(n) − offset ∈ W (window.ts, half-open rule);
 * positions π∥(n). Point density = vol(W) / (6D volume per node) (model-set density, Baake & Grimm,
 * Aperiodic Order vol. 1, 2013). Work is linear in the points produced: a breadth-first walk through
 * lattice steps (icosa-cut.ts explains why it reaches every node) with an integer-keyed hash set; no 6D box
 * is ever enumerated.
 *
 * Ball: a node is kept when |π∥(n) − centre| ≤ R (closed, within a relative band of 1e-12). The walk goes out
 * to R + 2.4·aR: every vertex in the ball belongs to a tile meeting the ball, and the tiles meeting the ball
 * form a connected set whose vertices lie within R + (largest tile diameter). The longest tile diagonal is
 * the prolate rhombohedron's body diagonal √(3 + 6/√5)·aR ≈ 2.384·aR (rhombohedron with face angle
 * arccos(1/√5); edge-vector algebra).
 */
import type { Structure, Vec3 } from '../../structure/types';
import { ENGINE_VERSION } from '../../version';
import type { HyperlatticeType, IcosahedralBasis } from './hyperlattice';
import { hyperlatticeCellVolume, hyperlatticeCosets, hyperlatticeSteps, icosahedralBasis, inHyperlattice, toHyper } from './hyperlattice';
import type { CutClass } from './cut';
import { classWindows, directionOrbit, icosahedralGroup, projectShifted, siteClassesOf, vertexClass } from './cut';
import type { Window } from './window';
import { boundaryWeight, windowContainsClosed, windowVolume, zonotopeWindow } from './window';
import { walkCoset } from './walk';
import { DEFAULT_MAX_POINTS, checkPointCap } from '../point-cap';

const WALK_MARGIN = 2.4;

export interface PatchSpec {
  aR: number;
  radius: number;
  centre?: Vec3;
  lattice?: HyperlatticeType;
  offset?: Vec3;
  maxPoints?: number;
  /** Site classes; default one "vertex" class (species 0). */
  classes?: CutClass[];
  /** Recorded as provenance.params (default: this spec). */
  params?: unknown;
}

/** Nodes of one coset cut inside a ball, in walk order. */
export interface BallCut {
  count: number;
  /** 6 integers per node (n, without the shift). */
  nodes: Int32Array;
  par: Float64Array;
  perp: Float64Array;
  /** Symmetric boundary weight per node (1 inside the window; window.ts boundaryWeight, m-3-5 average). */
  weight: Float64Array;
}

let ihDirs: Float64Array | null = null;
/** The m-3-5 orbit of the generic direction, in the perpendicular frame (five-fold axis e1⊥ ∝ (τ, −1, 0)). */
function icosahedralDirs(): Float64Array {
  ihDirs ??= directionOrbit(icosahedralGroup([(1 + Math.sqrt(5)) / 2, -1, 0]));
  return ihDirs;
}

/**
 * Seed: the hyperlattice node nearest to the 6D point (centre, offset) lies within the projected unit
 * cube of it, hence its perpendicular image is in W0 + offset; we scan its 3⁶ neighbourhood, nearest first,
 * for a node in the explore window (this also handles parity for F and ties on the window boundary).
 */
function findSeed(basis: IcosahedralBasis, lattice: HyperlatticeType, shift: ArrayLike<number>, explore: Window, centre: Vec3, offset: ArrayLike<number>): Int32Array | null {
  const X = toHyper(centre, offset, basis);
  const base = new Int32Array(6);
  for (let i = 0; i < 6; i++) base[i] = Math.round(X[i] - shift[i]);
  const cand: { d: number; k: number; n: Int32Array }[] = [];
  const n = new Int32Array(6);
  const p = new Float64Array(3);
  const q = new Float64Array(3);
  for (let k = 0; k < 729; k++) {
    let r = k;
    for (let i = 0; i < 6; i++) {
      n[i] = base[i] + (r % 3) - 1;
      r = Math.floor(r / 3);
    }
    if (lattice === 'F' && !inHyperlattice(n, 'F')) continue;
    projectShifted(n, shift, basis.perp, q, 0);
    if (!windowContainsClosed(explore, q[0], q[1], q[2])) continue;
    projectShifted(n, shift, basis.par, p, 0);
    cand.push({ d: Math.hypot(p[0] - centre[0], p[1] - centre[1], p[2] - centre[2]), k, n: Int32Array.from(n) });
  }
  if (cand.length === 0) return null;
  cand.sort((a, b) => a.d - b.d || a.k - b.k);
  return cand[0].n;
}

/** Walk one coset Λ + shift inside the ball; keep nodes in `accept` within radius. */
export function cutBall(
  basis: IcosahedralBasis,
  lattice: HyperlatticeType,
  shift: ArrayLike<number>,
  explore: Window,
  accept: Window,
  centre: Vec3,
  radius: number,
  walkBudget: number,
): BallCut {
  const empty: BallCut = { count: 0, nodes: new Int32Array(0), par: new Float64Array(0), perp: new Float64Array(0), weight: new Float64Array(0) };
  const seed = findSeed(basis, lattice, shift, explore, centre, explore.centre);
  if (!seed) return empty;
  const [cx, cy, cz] = centre;
  const p0 = new Float64Array(3);
  projectShifted(seed, shift, basis.par, p0, 0);
  const d0 = Math.hypot(p0[0] - cx, p0[1] - cy, p0[2] - cz);
  const lim = Math.max(radius, d0) + WALK_MARGIN * basis.aR;
  const walk = walkCoset({
    seed,
    shift,
    steps: hyperlatticeSteps(lattice === 'F' ? 'F' : 'P'),
    perp: basis.perp,
    explore,
    budget: walkBudget,
    budgetMessage: `maxPoints: the walk passed ${walkBudget.toLocaleString('en-US')} nodes; lower the radius or raise maxPoints`,
    ball: { par: basis.par, centre, lim2: lim * lim },
    closed: true,
  });
  const { set, perp } = walk;
  const par = walk.par!;
  const r2 = radius * radius * (1 + 2e-12);
  const keep: number[] = [];
  const weight: number[] = [];
  const dirs = icosahedralDirs();
  for (let e = 0; e < set.size; e++) {
    const dx = par[3 * e] - cx;
    const dy = par[3 * e + 1] - cy;
    const dz = par[3 * e + 2] - cz;
    if (dx * dx + dy * dy + dz * dz > r2) continue;
    const wt = boundaryWeight(accept, perp[3 * e], perp[3 * e + 1], perp[3 * e + 2], dirs);
    if (wt <= 0) continue;
    keep.push(e);
    weight.push(wt);
  }
  const out: BallCut = {
    count: keep.length,
    nodes: new Int32Array(6 * keep.length),
    par: new Float64Array(3 * keep.length),
    perp: new Float64Array(3 * keep.length),
    weight: Float64Array.from(weight),
  };
  keep.forEach((e, j) => {
    for (let i = 0; i < 6; i++) out.nodes[6 * j + i] = set.coords[6 * e + i];
    for (let c = 0; c < 3; c++) {
      out.par[3 * j + c] = par[3 * e + c];
      out.perp[3 * j + c] = perp[3 * e + c];
    }
  });
  return out;
}

/** Expected number of points of a patch (density × ball volume), used by the cap before any allocation. */
export function estimatePatchCount(spec: PatchSpec): number {
  const basis = icosahedralBasis(spec.aR);
  const lattice = spec.lattice ?? 'P';
  const base = zonotopeWindow(basis.perp, { centre: spec.offset ?? [0, 0, 0] });
  const classes = spec.classes ?? [vertexClass()];
  const ball = (4 / 3) * Math.PI * spec.radius ** 3;
  let n = 0;
  for (const cl of classes) n += (windowVolume(classWindows(cl.window, base, 1).accept) / hyperlatticeCellVolume(lattice, spec.aR)) * ball;
  return n;
}

/** A ball of the icosahedral cut (3D Penrose tiling vertices unless classes say otherwise). */
export function icosahedralPatch(spec: PatchSpec): Structure {
  const basis = icosahedralBasis(spec.aR);
  if (!(spec.radius > 0) || !Number.isFinite(spec.radius)) throw new RangeError(`radius: must be a positive length in Å, got ${spec.radius}`);
  const lattice = spec.lattice ?? 'P';
  const centre: Vec3 = spec.centre ?? [0, 0, 0];
  const offset = spec.offset ?? [0, 0, 0];
  const maxPoints = spec.maxPoints ?? DEFAULT_MAX_POINTS;
  const classes = spec.classes ?? [vertexClass()];
  checkPointCap(estimatePatchCount(spec), maxPoints, `a patch of radius ${spec.radius} Å`);
  const base = zonotopeWindow(basis.perp, { centre: offset });
  const parts: { cut: BallCut; cls: number }[] = [];
  let total = 0;
  const budget = 4 * maxPoints + 100_000;
  classes.forEach((cl, ci) => {
    const { accept, explore } = classWindows(cl.window, base, 1);
    for (const coset of hyperlatticeCosets(lattice)) {
      const shift = new Float64Array(6);
      for (let i = 0; i < 6; i++) shift[i] = cl.position[i] + coset[i];
      const cut = cutBall(basis, lattice, shift, explore, accept, centre, spec.radius, budget);
      total += cut.count;
      if (total > maxPoints) checkPointCap(total, maxPoints, 'this patch');
      parts.push({ cut, cls: ci });
    }
  });
  const s = assemble(parts, classes, total, spec.params ?? spec);
  if (offset.some((x) => x !== 0) || centre.some((x) => x !== 0))
    s.notes = [
      ...(s.notes ?? []),
      'the phason offset or an off-origin centre lowers the point group of the patch below m-3-5 (offset 0 with the centre at the origin keeps it)',
    ];
  return s;
}

function assemble(parts: { cut: BallCut; cls: number }[], classes: CutClass[], total: number, params: unknown): Structure {
  const positions = new Float64Array(3 * total);
  const perp = new Float64Array(3 * total);
  const species = new Uint16Array(total);
  const site = new Uint16Array(total);
  let fractional = 0;
  for (const { cut } of parts) for (const w of cut.weight) if (w < 1) fractional++;
  const hasOcc = fractional > 0 || classes.some((c) => c.occupancy !== undefined && c.occupancy !== 1);
  const occupancy = hasOcc ? new Float64Array(total) : undefined;
  let o = 0;
  for (const { cut, cls } of parts) {
    positions.set(cut.par, 3 * o);
    perp.set(cut.perp, 3 * o);
    species.fill(classes[cls].species, o, o + cut.count);
    site.fill(cls, o, o + cut.count);
    if (occupancy) for (let j = 0; j < cut.count; j++) occupancy[o + j] = (classes[cls].occupancy ?? 1) * cut.weight[j];
    o += cut.count;
  }
  const s: Structure = { positions, species, site, siteClasses: siteClassesOf(classes), perp, perpDim: 3, dim: 3, provenance: { params, engine: ENGINE_VERSION } };
  if (fractional > 0)
    s.notes = [
      `${fractional} points lie on the window boundary (a singular window position such as offset 0): they carry fractional occupancy, the m-3-5 average of a generic infinitesimal shift, so the patch keeps the icosahedral symmetry of its centre — use a generic phason offset for whole atoms`,
    ];
  if (occupancy) s.occupancy = occupancy;
  return s;
}
