/**
 * Icosahedral stars of 6D reflection indices: the point group m-3-5 (Schoenflies I_h, 60 rotations and
 * their products with the inversion, 120 operations) acting on the indices h of the Fourier module.
 *
 * A rotation R of the icosahedral group maps each five-fold axis u_i (lib/models/icosahedral/hyperlattice.ts)
 * onto ± another, R·u_i = σ_i u_{π(i)}, so it acts on the parallel reciprocal basis e*_i∥ ∝ u_i as a signed
 * permutation, and on the perpendicular one (the Galois conjugate) by the same signed permutation; hence on the
 * indices: h'_{π(i)} = σ_i h_i. The 60 rotations are generated here numerically from a five-fold rotation about u_1
 * and a three-fold rotation about (1, 1, 1) (both symmetries of the icosahedron with vertices the cyclic
 * permutations of (0, ±1, ±τ) — Coxeter, Regular Polytopes, §3.7), closed under products.
 * The star of h is its orbit; the multiplicity is the orbit size (at most 120).
 */
import { TAU } from '../../math/golden';

type M3 = number[];

function mul(a: M3, b: M3): M3 {
  const c = new Array<number>(9).fill(0);
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) for (let k = 0; k < 3; k++) c[3 * i + j] += a[3 * i + k] * b[3 * k + j];
  return c;
}

/** Rotation by angle t about unit axis n (Rodrigues). */
function rotation(n: number[], t: number): M3 {
  const l = Math.hypot(n[0], n[1], n[2]);
  const [x, y, z] = n.map((v) => v / l);
  const c = Math.cos(t);
  const s = Math.sin(t);
  const C = 1 - c;
  return [c + x * x * C, x * y * C - z * s, x * z * C + y * s, y * x * C + z * s, c + y * y * C, y * z * C - x * s, z * x * C - y * s, z * y * C + x * s, c + z * z * C];
}

const AXES = [1, TAU, 0, -1, TAU, 0, 0, 1, TAU, 0, -1, TAU, TAU, 0, 1, TAU, 0, -1];

/** One operation: h'[perm[i]] = sign[i]·h[i]. */
export interface SignedPermutation {
  perm: Int8Array;
  sign: Int8Array;
}

function toSignedPermutation(r: M3): SignedPermutation {
  const perm = new Int8Array(6);
  const sign = new Int8Array(6);
  const used = new Set<number>();
  for (let i = 0; i < 6; i++) {
    const u = [AXES[3 * i], AXES[3 * i + 1], AXES[3 * i + 2]];
    const v = [0, 1, 2].map((a) => r[3 * a] * u[0] + r[3 * a + 1] * u[1] + r[3 * a + 2] * u[2]);
    let found = -1;
    for (let j = 0; j < 6 && found < 0; j++) {
      for (const s of [1, -1]) {
        if (Math.abs(v[0] - s * AXES[3 * j]) + Math.abs(v[1] - s * AXES[3 * j + 1]) + Math.abs(v[2] - s * AXES[3 * j + 2]) < 1e-9) {
          found = j;
          sign[i] = s;
        }
      }
    }
    if (found < 0 || used.has(found)) throw new Error('icosahedral group: a rotation does not permute the five-fold axes (internal error)');
    used.add(found);
    perm[i] = found;
  }
  return { perm, sign };
}

let cached: SignedPermutation[] | undefined;

/** The 120 operations of m-3-5 as signed permutations of the six indices (rotations first, then × inversion). */
export function icosahedralOperations(): SignedPermutation[] {
  if (cached) return cached;
  const gens = [rotation([1, TAU, 0], (2 * Math.PI) / 5), rotation([1, 1, 1], (2 * Math.PI) / 3)];
  const group: M3[] = [[1, 0, 0, 0, 1, 0, 0, 0, 1]];
  const key = (m: M3) => m.map((v) => Math.round(v * 1e6)).join(',');
  const seen = new Set(group.map(key));
  for (let i = 0; i < group.length; i++) {
    for (const g of gens) {
      const p = mul(g, group[i]);
      const k = key(p);
      if (!seen.has(k)) {
        seen.add(k);
        group.push(p);
      }
    }
    if (group.length > 60) break;
  }
  if (group.length !== 60) throw new Error(`icosahedral group: closure has ${group.length} rotations, expected 60 (internal error)`);
  const rot = group.map(toSignedPermutation);
  const inv = rot.map((o) => ({ perm: o.perm, sign: Int8Array.from(o.sign, (s) => -s) }));
  cached = [...rot, ...inv];
  return cached;
}

/** Apply one operation to h. */
export function applyOperation(op: SignedPermutation, h: ArrayLike<number>, out = new Float64Array(6)): Float64Array {
  for (let i = 0; i < 6; i++) out[op.perm[i]] = op.sign[i] * h[i];
  return out;
}

/** The orbit (star) of h, distinct members only. */
export function starOf(h: ArrayLike<number>): number[][] {
  const seen = new Map<string, number[]>();
  const t = new Float64Array(6);
  for (const op of icosahedralOperations()) {
    applyOperation(op, h, t);
    const k = Array.from(t).join(',');
    if (!seen.has(k)) seen.set(k, Array.from(t, (v) => v + 0)); // + 0 turns −0 into 0
  }
  return [...seen.values()];
}

/** Number of distinct reflections in the star of h (the powder multiplicity). */
export function starMultiplicity(h: ArrayLike<number>): number {
  return starOf(h).length;
}

/**
 * A representative of the star of h: the lexicographically largest image (so that all members give the same
 * one), and the star's key as text.
 */
export function starRepresentative(h: ArrayLike<number>): { rep: number[]; key: string } {
  const t = new Float64Array(6);
  let best: number[] | null = null;
  for (const op of icosahedralOperations()) {
    applyOperation(op, h, t);
    if (!best || lexGreater(t, best)) best = Array.from(t, (v) => v + 0);
  }
  return { rep: best!, key: best!.join(',') };
}

function lexGreater(a: ArrayLike<number>, b: ArrayLike<number>): boolean {
  for (let i = 0; i < 6; i++) if (a[i] !== b[i]) return a[i] > b[i];
  return false;
}

/**
 * Star lookup for many reflections: the first member seen of a star expands its whole orbit (120 operations)
 * into a table, so every further member is one hash lookup.
 */
export class StarIndex {
  private readonly byMember = new Map<number, number>();
  readonly reps: number[][] = [];
  readonly sizes: number[] = [];

  /** Integer key of h: 2h_i + 128 as six base-256 digits (|h_i| < 64, integers or half-integers; 48 bits, exact in a double). */
  private static key(h: ArrayLike<number>): number {
    let k = 0;
    for (let i = 0; i < 6; i++) {
      const v = 2 * h[i] + 128;
      if (!(v >= 0 && v < 256 && Number.isInteger(v))) throw new Error(`star: index ${h[i]} out of range (|h| < 64, integer or half-integer)`);
      k = k * 256 + v;
    }
    return k;
  }

  /** Star id of h (new ids count up from 0) and whether h opened a new star. */
  idOf(h: ArrayLike<number>): { id: number; fresh: boolean } {
    const known = this.byMember.get(StarIndex.key(h));
    if (known !== undefined) return { id: known, fresh: false };
    const id = this.reps.length;
    const members = starOf(h);
    for (const m of members) this.byMember.set(StarIndex.key(m), id);
    this.reps.push(starRepresentative(h).rep);
    this.sizes.push(members.length);
    return { id, fresh: true };
  }
}
