import { determinant, matVec, type Mat3 } from '../../math/mat3';
import { cross, distance, dot, norm, normalize, scale, type Vec3 } from '../../math/vec3';

export interface PointGroupResult {
  /** Schoenflies symbol, e.g. "Ih", "D5d", "C2v", "C1"; "Kh" for a single point, "D∞h"/"C∞v" for collinear sets. */
  name: string;
  /** Number of operations found (Infinity for Kh, D∞h, C∞v). */
  order: number;
  /** The operations (Cartesian 3×3 rows acting on column vectors, about the centroid), identity first; empty for the infinite groups. */
  operations: Mat3[];
  /** Centroid used as the fixed point. */
  centre: Vec3;
}

const EPS = 1e-6;

/** Orthonormal frame (u1 ∥ a, u2 in the a,b plane, u3 = u1×u2): Gram–Schmidt on a, b. */
function frame(a: Vec3, b: Vec3): Vec3[] {
  const u1 = normalize(a);
  const p = dot(b, u1);
  const u2 = normalize([b[0] - p * u1[0], b[1] - p * u1[1], b[2] - p * u1[2]]);
  return [u1, u2, cross(u1, u2)];
}

/**
 * Point group of a finite set of points with species, about its centroid. Every candidate operation
 * is the orthogonal map taking two reference points a, b (non-collinear with the centre) to another
 * pair a', b' of the same species, distances from the centre and mutual distance — proper (det +1)
 * and improper (det −1) — and it is kept if it maps every point onto a point of the same species
 * within `tol` Å. The symbol follows the usual flow chart (e.g. Cotton, Chemical Applications of
 * Group Theory, 3rd ed., §3.14): cubic/icosahedral groups by their several high-order axes, then
 * the principal axis Cn, perpendicular C2 axes (D groups), and mirrors σh / σv / σd.
 */
export function pointGroup(positions: Float64Array, species: Uint16Array | number[], tol = 0.01): PointGroupResult {
  const n = positions.length / 3;
  if (n === 0 || species.length !== n) throw new Error(`pointGroup: need one species per point (${n} points, ${species.length} species)`);
  const c: Vec3 = [0, 0, 0];
  for (let i = 0; i < n; i++) for (let k = 0; k < 3; k++) c[k] += positions[3 * i + k] / n;
  const p: Vec3[] = [];
  for (let i = 0; i < n; i++) p.push([positions[3 * i] - c[0], positions[3 * i + 1] - c[1], positions[3 * i + 2] - c[2]]);
  const r = p.map(norm);
  const far = p.map((_, i) => i).filter((i) => r[i] > tol);
  if (far.length === 0) return { name: 'Kh', order: Infinity, operations: [], centre: c };
  // Reference a: the farthest-from-centre point of the smallest (species, radius) class.
  const cls = (i: number) => far.filter((j) => species[j] === species[i] && Math.abs(r[j] - r[i]) < tol);
  const sizes = new Map<number, number>();
  for (const i of far) sizes.set(i, cls(i).length);
  const byClass = [...far].sort((x, y) => sizes.get(x)! - sizes.get(y)! || r[y] - r[x] || x - y);
  const a = byClass[0];
  const notCollinear = (j: number) => norm(cross(p[a], p[j])) > tol * Math.max(r[a], r[j]);
  const bCand = byClass.filter(notCollinear);
  if (bCand.length === 0) {
    // Collinear: C∞v, or D∞h when inversion maps the set onto itself.
    const inv: Mat3 = [
      [-1, 0, 0],
      [0, -1, 0],
      [0, 0, -1],
    ];
    const name = mapsOnto(inv, p, species, tol) ? 'D∞h' : 'C∞v';
    return { name, order: Infinity, operations: [], centre: c };
  }
  const b = bCand[0];
  const A = cls(a);
  const B = cls(b);
  const dab = distance(p[a], p[b]);
  const U = frame(p[a], p[b]);
  const ops: Mat3[] = [];
  for (const a2 of A) {
    for (const b2 of B) {
      if (a2 === b2) continue;
      const d2 = distance(p[a2], p[b2]);
      if (Math.abs(d2 - dab) > 2 * tol) continue;
      if (!(norm(cross(p[a2], p[b2])) > tol * Math.max(r[a2], r[b2]))) continue;
      const V = frame(p[a2], p[b2]);
      for (const s of [1, -1]) {
        // R = Σ v_k u_kᵀ, with v3 → s·v3 for the improper candidate.
        const m: Mat3 = [
          [0, 0, 0],
          [0, 0, 0],
          [0, 0, 0],
        ];
        for (let k = 0; k < 3; k++) {
          const sk = k === 2 ? s : 1;
          for (let x = 0; x < 3; x++) for (let y = 0; y < 3; y++) m[x][y] += sk * V[k][x] * U[k][y];
        }
        if (ops.some((o) => o.every((row, x) => row.every((v, y) => Math.abs(v - m[x][y]) < 1e-4)))) continue;
        if (mapsOnto(m, p, species, tol)) ops.push(m);
      }
    }
  }
  // Snap to the identity ordering: identity first, the rest as found (deterministic for a given input).
  ops.sort((x, y) => (isIdentity(y) ? 1 : 0) - (isIdentity(x) ? 1 : 0));
  return { name: schoenflies(ops), order: ops.length, operations: ops, centre: c };
}

function isIdentity(m: Mat3): boolean {
  return Math.abs(m[0][0] - 1) < EPS && Math.abs(m[1][1] - 1) < EPS && Math.abs(m[2][2] - 1) < EPS;
}

function mapsOnto(m: Mat3, p: Vec3[], species: ArrayLike<number>, tol: number): boolean {
  const n = p.length;
  const used = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const q = matVec(m, p[i]);
    let hit = -1;
    for (let j = 0; j < n; j++) {
      if (used[j] || species[j] !== species[i]) continue;
      if (Math.abs(q[0] - p[j][0]) < tol && Math.abs(q[1] - p[j][1]) < tol && Math.abs(q[2] - p[j][2]) < tol) {
        if (distance(q, p[j]) < tol) {
          hit = j;
          break;
        }
      }
    }
    if (hit < 0) return false;
    used[hit] = 1;
  }
  return true;
}

interface OpInfo {
  proper: boolean;
  /** Order n of the rotation part (for improper ops: of the rotation in the S_n = σh·C_n reading). */
  n: number;
  /** Axis (rotation axis, or mirror normal / S_n axis), unit, sign arbitrary. */
  axis: Vec3;
  kind: 'E' | 'C' | 'i' | 'σ' | 'S';
}

function rotationAxis(m: Mat3, angle: number): Vec3 {
  // R − Rᵀ = 2 sin θ [u]ₓ, so its off-diagonal differences give the axis u.
  if (Math.abs(angle - Math.PI) > 1e-3) return normalize([m[2][1] - m[1][2], m[0][2] - m[2][0], m[1][0] - m[0][1]]);
  // θ = π: R + I = 2 u uᵀ; take its largest column.
  const cols = [0, 1, 2].map((k): Vec3 => [m[0][k] + (k === 0 ? 1 : 0), m[1][k] + (k === 1 ? 1 : 0), m[2][k] + (k === 2 ? 1 : 0)]);
  const best = cols.reduce((x, y) => (norm(y) > norm(x) ? y : x));
  return normalize(best);
}

function describe(m: Mat3): OpInfo {
  const proper = determinant(m) > 0;
  const R: Mat3 = proper ? m : [scale(m[0], -1), scale(m[1], -1), scale(m[2], -1)];
  const cos = Math.max(-1, Math.min(1, (R[0][0] + R[1][1] + R[2][2] - 1) / 2));
  const theta = Math.acos(cos);
  if (proper) {
    if (theta < 1e-4) return { proper, n: 1, axis: [0, 0, 1], kind: 'E' };
    return { proper, n: Math.round((2 * Math.PI) / theta), axis: rotationAxis(R, theta), kind: 'C' };
  }
  if (theta < 1e-4) return { proper, n: 2, axis: [0, 0, 1], kind: 'i' };
  const axis = rotationAxis(R, theta);
  // m = −R(θ) = σh·R(θ+π): an S_k with rotation angle θ+π (mod 2π).
  let phi = theta + Math.PI;
  if (phi > Math.PI) phi = 2 * Math.PI - phi;
  if (phi < 1e-4) return { proper, n: 1, axis, kind: 'σ' };
  return { proper, n: Math.round((2 * Math.PI) / phi), axis, kind: 'S' };
}

function parallel(u: Vec3, v: Vec3): boolean {
  return Math.abs(Math.abs(dot(u, v)) - 1) < 1e-3;
}
function perpendicular(u: Vec3, v: Vec3): boolean {
  return Math.abs(dot(u, v)) < 1e-3;
}

/** Distinct axes (up to sign) among the ops of a given kind and order. */
function axes(info: OpInfo[], pred: (o: OpInfo) => boolean): Vec3[] {
  const out: Vec3[] = [];
  for (const o of info) if (pred(o) && !out.some((a) => parallel(a, o.axis))) out.push(o.axis);
  return out;
}

/** Schoenflies symbol from a complete set of operations. */
export function schoenflies(ops: Mat3[]): string {
  const info = ops.map(describe);
  const hasInv = info.some((o) => o.kind === 'i');
  const mirrors = info.filter((o) => o.kind === 'σ');
  const c5 = axes(info, (o) => o.kind === 'C' && o.n === 5);
  const c4 = axes(info, (o) => o.kind === 'C' && o.n === 4);
  const c3 = axes(info, (o) => o.kind === 'C' && o.n === 3);
  if (c5.length > 1) return hasInv ? 'Ih' : 'I';
  if (c4.length > 1) return hasInv ? 'Oh' : 'O';
  if (c3.length > 1) return hasInv ? 'Th' : mirrors.length > 0 ? 'Td' : 'T';
  const rot = info.filter((o) => o.kind === 'C');
  if (rot.length === 0) {
    if (mirrors.length > 0) return 'Cs';
    if (hasInv) return 'Ci';
    return 'C1';
  }
  const nMax = Math.max(...rot.map((o) => o.n));
  // Principal axis: a highest-order rotation axis; among C2 axes prefer one that is also an S4 axis.
  const s4 = axes(info, (o) => o.kind === 'S' && o.n === 4);
  const cand = axes(info, (o) => o.kind === 'C' && o.n === nMax);
  const principal = (nMax === 2 && s4.length > 0 ? cand.find((a) => parallel(a, s4[0])) : undefined) ?? cand[0];
  const perpC2 = axes(info, (o) => o.kind === 'C' && o.n === 2 && perpendicular(o.axis, principal));
  const sigmaH = mirrors.some((o) => parallel(o.axis, principal));
  const sigmaV = mirrors.some((o) => perpendicular(o.axis, principal));
  const n = nMax;
  if (perpC2.length >= n) {
    if (sigmaH) return `D${n}h`;
    if (sigmaV) return `D${n}d`;
    return `D${n}`;
  }
  if (sigmaH) return `C${n}h`;
  if (sigmaV) return `C${n}v`;
  if (info.some((o) => o.kind === 'S' || o.kind === 'i')) return `S${2 * n}`;
  return `C${n}`;
}
