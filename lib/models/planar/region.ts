/**
 * Where the vertex search may go, and how many vertices that should give (checked against the point cap
 * before anything large is allocated).
 *
 * Patch: the disc of radius R + 2 about the origin. A tile is kept when its centre is within R, and the
 * corners of a unit rhombus are within half its long diagonal (< 1 edge) of its centre, so the disc leaves
 * a margin around every kept tile; a corner the search still did not reach is looked up by the tile pass
 * (tiles-patch.ts).
 *
 * Approximant: the cell spanned by a, b widened by 2.5 edges on every side. The tile pass starts a tile at
 * each cell representative K, whose corners are within |e_a + e_b| ≤ 2 < 2.5 edges of it, so they are all
 * in the region. Every period t ∈ T maps the vertex set onto itself (cut.ts), so K and K − t are the same
 * vertex of the cell; `reduce` picks one representative per class.
 */
import { checkPointCap } from '../point-cap';
import type { ParallelMap } from './projection';
import type { PlanarCell } from './spec';

/** The search region of a quasiperiodic patch of radius R (edge 1). */
export class DiscRegion {
  readonly radius: number;
  /** Vertices expected in the kept tiles (the disc of radius R + 1). */
  readonly estimate: number;
  private readonly R2: number;

  constructor(density: number, radius: number, maxPoints: number) {
    this.radius = radius;
    this.estimate = density * Math.PI * (radius + 1) ** 2;
    checkPointCap(this.estimate, maxPoints, `a patch of radius ${radius}`);
    this.R2 = (radius + 2) ** 2;
  }

  contains(x: number, y: number): boolean {
    return x * x + y * y <= this.R2;
  }
}

/** The search region of an approximant cell, with the reduction of K to its cell representative. */
export class CellRegion {
  /** Rows a, b of the cell (edge 1). */
  readonly cell: PlanarCell;
  /** Integer periods t1, t2 with parallel images a, b. */
  readonly periods: [number[], number[]];
  /** Vertices expected in one cell. */
  readonly estimate: number;
  private readonly ax: number;
  private readonly ay: number;
  private readonly bx: number;
  private readonly by: number;
  private readonly det: number;
  /** The 2.5-edge margin in fractional units along a and along b. */
  private readonly mA: number;
  private readonly mB: number;
  private readonly t1: Int32Array;
  private readonly t2: Int32Array;
  private readonly n: number;
  private readonly proj: ParallelMap;

  constructor(
    density: number,
    lattice: { t: [number[], number[]]; a: PlanarCell },
    proj: ParallelMap,
    maxPoints: number,
  ) {
    this.periods = lattice.t;
    this.cell = lattice.a;
    const [[ax, ay], [bx, by]] = this.cell;
    const det = ax * by - ay * bx;
    this.estimate = density * Math.abs(det);
    checkPointCap(this.estimate, maxPoints, 'the approximant cell');
    // Fractional coordinates f = x·B⁻¹ with B rows a, b; a distance d from the line through b is
    // d / (|a| |sin ∠(a, b)|) in f, and likewise for g.
    this.mA = 2.5 / Math.hypot(ax, ay) / Math.abs(Math.sin(Math.atan2(by, bx) - Math.atan2(ay, ax)));
    this.mB = 2.5 / Math.hypot(bx, by) / Math.abs(Math.sin(Math.atan2(by, bx) - Math.atan2(ay, ax)));
    this.ax = ax;
    this.ay = ay;
    this.bx = bx;
    this.by = by;
    this.det = det;
    this.t1 = Int32Array.from(this.periods[0]);
    this.t2 = Int32Array.from(this.periods[1]);
    this.n = this.t1.length;
    this.proj = proj;
  }

  contains(x: number, y: number): boolean {
    const { ax, ay, bx, by, det, mA, mB } = this;
    const f = (x * by - y * bx) / det, g = (ay * x - ax * y) / -det;
    return f >= -mA && f <= 1 + mA && g >= -mB && g <= 1 + mB;
  }

  /**
   * K ← its representative modulo T, in place: fractional coordinates in [−1e-9, 1 − 1e-9). Exact
   * algebraic positions never sit within 1e-9 of that shifted edge, so translates of one vertex always
   * pick the same one.
   */
  reduce(K: Int32Array): void {
    const { ax, ay, bx, by, det, t1, t2, n, proj } = this;
    proj.project(K);
    const f = (proj.x * by - proj.y * bx) / det, g = (ay * proj.x - ax * proj.y) / -det;
    const i = Math.floor(f + 1e-9), k = Math.floor(g + 1e-9);
    if (i === 0 && k === 0) return;
    for (let j = 0; j < n; j++) K[j] -= i * t1[j] + k * t2[j];
  }
}

/** The region of either kind of cut. */
export type SearchRegion = DiscRegion | CellRegion;
