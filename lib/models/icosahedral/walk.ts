/**
 * The breadth-first walk of one hyperlattice coset Λ + s through the window, shared by patches (a ball
 * around a centre) and approximant cells (nodes reduced into the cell). Starting from a seed inside the
 * explore window, every lattice step whose perpendicular image stays inside it is taken (cut.ts explains
 * why this reaches every node); the integer-keyed set doubles as the queue, so the work is linear in the
 * nodes found.
 *
 * Images per node, two rules:
 * - patch: parallel and perpendicular images are recomputed from the integers at every node, so they
 *   never drift along long walks; a node is taken only within `ball.lim` of the centre;
 * - cell: each node is reduced into the cell by the periods, which leave perpendicular images unchanged
 *   (M·N_k = 0), so the image is carried from the head plus the step's image.
 */
import type { Vec3 } from '../../structure/types';
import { IntVectorSet } from '../../math/int-vector-set';
import { projectShifted } from './cut';
import { windowContains, windowContainsClosed, type Window } from './window';

export interface CosetWalk {
  seed: Int32Array;
  shift: ArrayLike<number>;
  steps: ArrayLike<number>[];
  /** Six 3D perpendicular images (the window-test frame). */
  perp: Float64Array;
  explore: Window;
  /** Stop with a RangeError naming the cap past this many nodes. */
  budget: number;
  budgetMessage: string;
  /** Patch: the six 3D parallel images and the ball the walk stays in. */
  ball?: { par: Float64Array; centre: Vec3; lim2: number };
  /** Cell: reduce a node into the cell in place. */
  reduce?: (n: Int32Array) => void;
  /** Explore the closed window (boundary nodes included, for the symmetric boundary weights). */
  closed?: boolean;
}

export interface WalkResult {
  set: IntVectorSet;
  /** Perpendicular image per node (3 per node; capacity may exceed 3·size). */
  perp: Float64Array;
  /** Parallel image per node, for ball walks. */
  par: Float64Array | null;
}

/** Images of the steps under a 6 × 3 image matrix (3 numbers per step). */
export function stepImages(steps: ArrayLike<number>[], m: Float64Array): Float64Array {
  const out = new Float64Array(3 * steps.length);
  steps.forEach((st, k) => {
    for (let i = 0; i < 6; i++) for (let c = 0; c < 3; c++) out[3 * k + c] += st[i] * m[3 * i + c];
  });
  return out;
}

function grow(a: Float64Array): Float64Array<ArrayBuffer> {
  const g = new Float64Array(a.length * 2);
  g.set(a);
  return g;
}

export function walkCoset(w: CosetWalk): WalkResult {
  const { seed, shift, steps, explore, ball, reduce } = w;
  const set = new IntVectorSet(6, 1024);
  let perp = new Float64Array(3 * 1024);
  let par = ball ? new Float64Array(3 * 1024) : null;
  set.add(seed);
  projectShifted(seed, shift, w.perp, perp, 0);
  if (ball) projectShifted(seed, shift, ball.par, par!, 0);
  const sq = stepImages(steps, w.perp);
  const sp = ball ? stepImages(steps, ball.par) : sq;
  const [cx, cy, cz] = ball ? ball.centre : [0, 0, 0];
  const lim2 = ball ? ball.lim2 : Infinity;
  const m = new Int32Array(6);
  const inside = w.closed ? windowContainsClosed : windowContains;
  for (let head = 0; head < set.size; head++) {
    const b = 6 * head;
    const qx = perp[3 * head];
    const qy = perp[3 * head + 1];
    const qz = perp[3 * head + 2];
    for (let k = 0; k < steps.length; k++) {
      if (par) {
        const dx = par[3 * head] + sp[3 * k] - cx;
        const dy = par[3 * head + 1] + sp[3 * k + 1] - cy;
        const dz = par[3 * head + 2] + sp[3 * k + 2] - cz;
        if (dx * dx + dy * dy + dz * dz > lim2) continue;
      }
      const ux = qx + sq[3 * k];
      const uy = qy + sq[3 * k + 1];
      const uz = qz + sq[3 * k + 2];
      if (!inside(explore, ux, uy, uz)) continue;
      const st = steps[k];
      const c = set.coords;
      for (let i = 0; i < 6; i++) m[i] = c[b + i] + st[i];
      if (reduce) reduce(m);
      const idx = set.add(m);
      if (idx < 0) continue;
      if (idx >= w.budget) throw new RangeError(w.budgetMessage);
      if (3 * (idx + 1) > perp.length) {
        perp = grow(perp);
        if (par) par = grow(par);
      }
      if (par) {
        projectShifted(m, shift, ball!.par, par, 3 * idx);
        projectShifted(m, shift, w.perp, perp, 3 * idx);
      } else {
        perp[3 * idx] = ux;
        perp[3 * idx + 1] = uy;
        perp[3 * idx + 2] = uz;
      }
    }
  }
  return { set, perp, par };
}
