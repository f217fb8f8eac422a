/**
 * Axis-sign symmetry of a periodic structure, for structure-factor sums that spread only one atom per orbit.
 *
 * Operations g: x → S x + t with S = diag(±1, ±1, ±1) in fractional coordinates that map every atom onto an
 * atom of the same scattering group and weight, found by hashing the fractional coordinates: for each S the
 * translations that take one atom onto an atom of its kind are tried. Measured from the centre c of the sign
 * flips (x' = x − c) the translations of such a group are 0 or ½ (glides, screws, centrings that keep the
 * axes); anything else falls back. The operations form a group V (closure is checked). Then, with real weights
 * and x measured from c,
 *
 *   G(h) = Σ_j w_j e^{2πi h·x_j} = Σ_{g∈V} e^{2πi h·t_g} G_rep(S_g h),   e^{2πi h·t} = ±1,
 *
 * where G_rep sums one representative per orbit with weight w·|orbit|/|V| (Σ_{g∈V} g(x_rep) visits each
 * member of the orbit |V|/|orbit| times). This is the usual symmetry expansion of a structure factor over
 * the operations of a space group (International Tables Vol. B §1.4); restricting it to diagonal S keeps the
 * planes of constant h of sf-grid.ts intact, so only |orbits| atoms are spread per plane. For the cubic
 * icosahedral approximants (point group m-3 ⊃ mmm) V has 8 elements, 16 with the I centring of the 5/3 cut;
 * the structure factor about the file's origin is e^{2πi h·c} times the one about c.
 *
 * Anything uncertain (two atoms of one group at one position, a group that fails to close) falls back to the
 * identity alone, which is always correct.
 */

export interface AxisSymmetry {
  /** Fractional origin c the operations refer to: they act on x − c (the centre of the structure's sign flips). */
  origin: number[];
  /** Operations of V: sign[3g..3g+2] = diagonal of S (±1), half[3g..3g+2] = 2t (0 or 1). The identity is first. */
  sign: Int8Array;
  half: Int8Array;
  /** Pure translations of V (2t per translation, t = 0 first) and one operation of each coset of them. */
  transHalf: Int8Array;
  cosetSign: Int8Array;
  cosetHalf: Int8Array;
  /** Representative atom of each orbit and its weight w·|orbit|/|V|. */
  rep: Int32Array;
  repWeight: Float64Array;
}

/** Coordinates closer than this (fractional) are the same position. */
const POS_TOL = 1e-6;
/** Relative agreement of the weights of symmetry-related atoms. */
const WEIGHT_TOL = 1e-9;
const Q = 1 << 16;

function wrap(u: number): number {
  return u - Math.floor(u);
}

function identityOnly(weight: Float64Array): AxisSymmetry {
  const rep: number[] = [];
  for (let j = 0; j < weight.length; j++) if (weight[j] !== 0) rep.push(j);
  return {
    origin: [0, 0, 0],
    sign: Int8Array.of(1, 1, 1),
    half: Int8Array.of(0, 0, 0),
    transHalf: Int8Array.of(0, 0, 0),
    cosetSign: Int8Array.of(1, 1, 1),
    cosetHalf: Int8Array.of(0, 0, 0),
    rep: Int32Array.from(rep),
    repWeight: Float64Array.from(rep, (j) => weight[j]),
  };
}

/**
 * The axis-sign symmetry group of the atoms with nonzero weight (frac: packed fractional x y z; groupOf: scattering
 * group per atom; weight: occupancy) and one representative per orbit.
 */
export function axisSymmetry(frac: Float64Array, groupOf: Uint16Array, weight: Float64Array): AxisSymmetry {
  const n = groupOf.length;
  // Hash: quantised (x, y, z) → atoms there.
  const table = new Map<number, number[]>();
  const code = (x: number, y: number, z: number) => {
    const ix = Math.round(wrap(x) * Q) % Q;
    const iy = Math.round(wrap(y) * Q) % Q;
    const iz = Math.round(wrap(z) * Q) % Q;
    return (ix * Q + iy) * Q + iz;
  };
  for (let j = 0; j < n; j++) {
    if (weight[j] === 0) continue;
    const key = code(frac[3 * j], frac[3 * j + 1], frac[3 * j + 2]);
    const list = table.get(key);
    if (list) list.push(j);
    else table.set(key, [j]);
  }
  const near = (a: number, b: number) => {
    const d = Math.abs(wrap(a) - wrap(b));
    return Math.min(d, 1 - d) <= POS_TOL;
  };
  const lo = (u: number) => Math.round(wrap(u - POS_TOL) * Q) % Q;
  const hi = (u: number) => Math.round(wrap(u + POS_TOL) * Q) % Q;
  /** The atom at (x, y, z) with j's group and weight, or −1. */
  const find = (j: number, x: number, y: number, z: number): number => {
    const x0 = lo(x);
    const x1 = hi(x);
    const y0 = lo(y);
    const y1 = hi(y);
    const z0 = lo(z);
    const z1 = hi(z);
    for (let ix = x0, a = 0; a < (x0 === x1 ? 1 : 2); a++, ix = x1)
      for (let iy = y0, b = 0; b < (y0 === y1 ? 1 : 2); b++, iy = y1)
        for (let iz = z0, c = 0; c < (z0 === z1 ? 1 : 2); c++, iz = z1) {
          const list = table.get((ix * Q + iy) * Q + iz);
          if (!list) continue;
          for (const i of list) {
            if (groupOf[i] !== groupOf[j]) continue;
            if (Math.abs(weight[i] - weight[j]) > WEIGHT_TOL * Math.max(Math.abs(weight[i]), Math.abs(weight[j]))) continue;
            if (near(frac[3 * i], x) && near(frac[3 * i + 1], y) && near(frac[3 * i + 2], z)) return i;
          }
        }
    return -1;
  };
  const live: number[] = [];
  for (let j = 0; j < n; j++) if (weight[j] !== 0) live.push(j);
  // Two atoms of one group at one position would make the map below ambiguous.
  for (const j of live) {
    if (find(j, frac[3 * j], frac[3 * j + 1], frac[3 * j + 2]) !== j) return identityOnly(weight);
  }
  if (live.length === 0) return identityOnly(weight);
  /** Images of every live atom under x → S x + t, or null when some atom has no image. */
  const scratch = new Int32Array(n).fill(-1);
  const mapsAll = (sg: number[], t: number[]): Int32Array | null => {
    for (const j of live) {
      const i = find(j, sg[0] * frac[3 * j] + t[0], sg[1] * frac[3 * j + 1] + t[1], sg[2] * frac[3 * j + 2] + t[2]);
      if (i < 0) return null;
      scratch[j] = i;
    }
    return scratch.slice();
  };
  // Candidate translations: those that take the first atom onto an atom of its kind.
  const j0 = live[0];
  const same = live.filter((i) => groupOf[i] === groupOf[j0] && Math.abs(weight[i] - weight[j0]) <= WEIGHT_TOL * Math.abs(weight[j0]));
  const transOps: { t: number[]; img: Int32Array }[] = [];
  const cosetOps: { s: number[]; t: number[]; img: Int32Array }[] = [];
  for (let c = 0; c < 8; c++) {
    const sg = [c & 1 ? -1 : 1, c & 2 ? -1 : 1, c & 4 ? -1 : 1];
    for (const i of same) {
      const t = [0, 1, 2].map((a) => wrap(frac[3 * i + a] - sg[a] * frac[3 * j0 + a]));
      const img = mapsAll(sg, t);
      if (!img) continue;
      if (c === 0) transOps.push({ t, img });
      else {
        cosetOps.push({ s: sg, t, img });
        break;
      }
    }
  }
  const isHalf = (u: number) => near(2 * u, 0);
  if (transOps.some((o) => !o.t.every(isHalf))) return identityOnly(weight);
  // Origin: the centre of the sign flips, so that every operation's translation becomes 0 or ½.
  const origin = [0, 0, 0];
  for (let a = 0; a < 3; a++) {
    const o = cosetOps.find((p) => p.s[a] === -1);
    if (o) origin[a] = o.t[a] / 2;
  }
  const ops: number[][] = [];
  const images: Int32Array[] = [];
  const identity = transOps.find((o) => o.t.every((u) => near(u, 0)));
  if (!identity) return identityOnly(weight);
  const reps = [{ s: [1, 1, 1], t: [0, 0, 0], img: identity.img }, ...cosetOps];
  for (const r of reps) {
    // x' = x − c: (S, t) becomes (S, t + S c − c).
    const t1 = [0, 1, 2].map((a) => wrap(r.t[a] + r.s[a] * origin[a] - origin[a]));
    if (!t1.every(isHalf)) return identityOnly(weight);
    for (const tr of transOps) {
      const half = [0, 1, 2].map((a) => Math.round(2 * wrap(t1[a] + tr.t[a])) & 1);
      ops.push([...r.s, ...half]);
      images.push(Int32Array.from(r.img, (i) => (i < 0 ? -1 : tr.img[i])));
    }
  }
  if (ops.length === 1) return identityOnly(weight);
  // Closure (mod lattice translations): (S1, t1)(S2, t2) = (S1 S2, S1 t2 + t1).
  const has = (o: number[]) => ops.some((p) => p.every((v, i) => (i < 3 ? v === o[i] : ((v - o[i]) & 1) === 0)));
  for (const a of ops)
    for (const b of ops) {
      const o = [a[0] * b[0], a[1] * b[1], a[2] * b[2], a[0] * b[3] + a[3], a[1] * b[4] + a[4], a[2] * b[5] + a[5]];
      if (!has(o)) return identityOnly(weight);
    }
  // Orbits.
  const seen = new Uint8Array(n);
  const rep: number[] = [];
  const repWeight: number[] = [];
  for (const j of live) {
    if (seen[j]) continue;
    let size = 0;
    for (const img of images) {
      const i = img[j];
      if (!seen[i]) {
        seen[i] = 1;
        size++;
      }
    }
    rep.push(j);
    repWeight.push((weight[j] * size) / ops.length);
  }
  // ops runs over the coset representatives (outer) times the translations (inner, identity first).
  const nt = transOps.length;
  const trans = ops.slice(0, nt);
  const cosets = ops.filter((_, i) => i % nt === 0);
  return {
    origin,
    sign: Int8Array.from(ops.flatMap((o) => o.slice(0, 3))),
    half: Int8Array.from(ops.flatMap((o) => o.slice(3))),
    transHalf: Int8Array.from(trans.flatMap((o) => o.slice(3))),
    cosetSign: Int8Array.from(cosets.flatMap((o) => o.slice(0, 3))),
    cosetHalf: Int8Array.from(cosets.flatMap((o) => o.slice(3))),
    rep: Int32Array.from(rep),
    repWeight: Float64Array.from(repWeight),
  };
}
