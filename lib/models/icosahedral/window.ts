/**
 * Occupation domains (windows) in perpendicular space: zonotopes (the projected hypercube — for the
 * icosahedral star the rhombic triacontahedron), spheres and spherical shells.
 *
 * A zonotope here is centred: W = c + κ·Σ_k [−½, ½]·v_k. Its facet normals are among the cross products
 * v_i × v_j (15 pairs → 30 faces for six vectors in general position; parallel duplicates are merged),
 * and its support value in a unit direction n is h(n) = ½κ·Σ_k |n·v_k| (support function of a segment sum).
 * Volume: κ³·Σ_{i<j<k} |det(v_i, v_j, v_k)| (Shephard's zonotope volume formula, McMullen 1971 —
 * from memory; the test checks it against the triacontahedron handbook value 4√(5+2√5)·a³).
 *
 * Boundary rule (half-open, so that two points whose perpendicular images differ by a lattice vector
 * lying across opposite faces are never both accepted). Each facet normal n is stored with its first
 * nonzero component positive; a point x is inside iff for every stored n, with d = n·(x − c):
 *      −h < d ≤ h.
 * This is exactly the limit of a generic (non-singular) cut whose window is moved by an infinitesimal
 * amount along −(1, ε, ε²): such a direction has negative dot product with every stored n, so points on
 * a "+" face (and on edges and corners where only "+" faces meet) move inside and points on any "−"
 * face move outside. The result is therefore always a valid tiling, even at singular offsets.
 * Ties are decided without floating-point luck: |d ∓ h| within the tolerance band `tol` counts as
 * exactly on the plane, and then the rule above decides.
 *
 * Spheres and shells are closed outside and open inside: r1 < |x − c| ≤ r2 (a sphere is r1 = −∞),
 * again with the tolerance band deciding ties.
 */

export interface ZonotopeWindow {
  kind: 'zonotope';
  /** Generating vectors v_k, k×3 row-major, before scaling. */
  vectors: Float64Array;
  /** Scale κ. */
  scale: number;
  centre: Float64Array;
  /** Unit facet normals (first nonzero component positive), f×3. */
  normals: Float64Array;
  /** Support values h_f (already scaled by κ). */
  support: Float64Array;
  tol: number;
}

export interface SphereWindow {
  kind: 'sphere';
  /** Inner radius (−1 for a full ball) and outer radius. */
  r1: number;
  r2: number;
  centre: Float64Array;
  tol: number;
}

export type Window = ZonotopeWindow | SphereWindow;

function vec3(c?: ArrayLike<number>): Float64Array {
  const o = new Float64Array(3);
  if (c) {
    o[0] = c[0];
    o[1] = c[1];
    o[2] = c[2];
  }
  return o;
}

/** Relative tolerance for plane ties: far above rounding of small sums, far below any real gap. */
const REL_TOL = 1e-9;

/**
 * The zonotope κ·Σ[−½,½]v_k centred at `centre`. `vectors` is k×3 row-major (e.g. basis.perp for the
 * triacontahedron of the icosahedral cut).
 */
export function zonotopeWindow(vectors: ArrayLike<number>, opts: { scale?: number; centre?: ArrayLike<number> } = {}): ZonotopeWindow {
  const scale = opts.scale ?? 1;
  if (!(scale > 0) || !Number.isFinite(scale)) throw new RangeError(`scale: window scale must be a positive number, got ${scale}`);
  const v = Float64Array.from(vectors);
  const k = v.length / 3;
  let maxLen = 0;
  for (let i = 0; i < k; i++) maxLen = Math.max(maxLen, Math.hypot(v[3 * i], v[3 * i + 1], v[3 * i + 2]));
  const normals: number[] = [];
  for (let i = 0; i < k; i++) {
    for (let j = i + 1; j < k; j++) {
      let nx = v[3 * i + 1] * v[3 * j + 2] - v[3 * i + 2] * v[3 * j + 1];
      let ny = v[3 * i + 2] * v[3 * j] - v[3 * i] * v[3 * j + 2];
      let nz = v[3 * i] * v[3 * j + 1] - v[3 * i + 1] * v[3 * j];
      const len = Math.hypot(nx, ny, nz);
      if (len <= 1e-12 * maxLen * maxLen) continue; // parallel generators: no facet
      nx /= len;
      ny /= len;
      nz /= len;
      const eps = 1e-12;
      const flip = nx < -eps || (Math.abs(nx) <= eps && (ny < -eps || (Math.abs(ny) <= eps && nz < 0)));
      if (flip) {
        nx = -nx;
        ny = -ny;
        nz = -nz;
      }
      let dup = false;
      for (let f = 0; f < normals.length; f += 3) {
        if (Math.abs(normals[f] - nx) < 1e-10 && Math.abs(normals[f + 1] - ny) < 1e-10 && Math.abs(normals[f + 2] - nz) < 1e-10) {
          dup = true;
          break;
        }
      }
      if (!dup) normals.push(nx, ny, nz);
    }
  }
  const nf = normals.length / 3;
  const support = new Float64Array(nf);
  for (let f = 0; f < nf; f++) {
    let h = 0;
    for (let i = 0; i < k; i++) h += Math.abs(normals[3 * f] * v[3 * i] + normals[3 * f + 1] * v[3 * i + 1] + normals[3 * f + 2] * v[3 * i + 2]);
    support[f] = 0.5 * scale * h;
  }
  return { kind: 'zonotope', vectors: v, scale, centre: vec3(opts.centre), normals: Float64Array.from(normals), support, tol: REL_TOL * maxLen * Math.max(1, scale) };
}

/** A ball of radius r (closed). */
export function sphereWindow(radius: number, centre?: ArrayLike<number>): SphereWindow {
  if (!(radius > 0) || !Number.isFinite(radius)) throw new RangeError(`radius: sphere radius must be positive, got ${radius}`);
  return { kind: 'sphere', r1: -1, r2: radius, centre: vec3(centre), tol: REL_TOL * radius };
}

/** A spherical shell r1 < |x − c| ≤ r2. */
export function shellWindow(r1: number, r2: number, centre?: ArrayLike<number>): SphereWindow {
  if (!(r1 >= 0) || !Number.isFinite(r1)) throw new RangeError(`r1: inner radius must be ≥ 0, got ${r1}`);
  if (!(r2 > r1) || !Number.isFinite(r2)) throw new RangeError(`r2: outer radius must be greater than r1 (${r1}), got ${r2}`);
  return { kind: 'sphere', r1, r2, centre: vec3(centre), tol: REL_TOL * r2 };
}

/** Half-open membership test (see header). */
export function windowContains(w: Window, x: number, y: number, z: number): boolean {
  const dx = x - w.centre[0];
  const dy = y - w.centre[1];
  const dz = z - w.centre[2];
  if (w.kind === 'sphere') {
    const r = Math.sqrt(dx * dx + dy * dy + dz * dz);
    if (r - w.r2 > w.tol) return false;
    return w.r1 < 0 || r - w.r1 > w.tol;
  }
  const n = w.normals;
  const h = w.support;
  const tol = w.tol;
  for (let f = 0, m = h.length; f < m; f++) {
    const d = n[3 * f] * dx + n[3 * f + 1] * dy + n[3 * f + 2] * dz;
    if (d - h[f] > tol || d + h[f] <= tol) return false;
  }
  return true;
}

/** Volume of the window (perp-space units cubed). */
export function windowVolume(w: Window): number {
  if (w.kind === 'sphere') return (4 / 3) * Math.PI * (w.r2 ** 3 - Math.max(0, w.r1) ** 3);
  const v = w.vectors;
  const k = v.length / 3;
  let vol = 0;
  for (let i = 0; i < k; i++)
    for (let j = i + 1; j < k; j++)
      for (let l = j + 1; l < k; l++) {
        const det =
          v[3 * i] * (v[3 * j + 1] * v[3 * l + 2] - v[3 * j + 2] * v[3 * l + 1]) -
          v[3 * i + 1] * (v[3 * j] * v[3 * l + 2] - v[3 * j + 2] * v[3 * l]) +
          v[3 * i + 2] * (v[3 * j] * v[3 * l + 1] - v[3 * j + 1] * v[3 * l]);
        vol += Math.abs(det);
      }
  return vol * w.scale ** 3;
}

/** The same window scaled by f about its centre. */
export function scaleWindow(w: Window, f: number): Window {
  if (!(f > 0)) throw new RangeError(`scale: must be positive, got ${f}`);
  if (w.kind === 'sphere') return w.r1 < 0 ? sphereWindow(w.r2 * f, w.centre) : shellWindow(w.r1 * f, w.r2 * f, w.centre);
  return zonotopeWindow(w.vectors, { scale: w.scale * f, centre: w.centre });
}

/** The same window moved by t. */
export function translateWindow(w: Window, t: ArrayLike<number>): Window {
  const c = [w.centre[0] + t[0], w.centre[1] + t[1], w.centre[2] + t[2]];
  if (w.kind === 'sphere') return { ...w, centre: vec3(c) };
  return { ...w, centre: vec3(c) };
}

/** Largest ball about the centre inside the window (the zonotope's inradius = min support). */
export function windowInradius(w: Window): number {
  if (w.kind === 'sphere') return w.r1 < 0 ? w.r2 : 0;
  let m = Infinity;
  for (const h of w.support) m = Math.min(m, h);
  return m;
}

/** Smallest ball about the centre containing the window (zonotope: bounded by ½κΣ|v_k|). */
export function windowOuterRadius(w: Window): number {
  if (w.kind === 'sphere') return w.r2;
  // Exact circumradius: max over sign patterns of |½κ Σ ±v_k|; 2^k patterns with k ≤ 6 is cheap.
  const v = w.vectors;
  const k = v.length / 3;
  let best = 0;
  for (let mask = 0; mask < 1 << k; mask++) {
    let x = 0;
    let y = 0;
    let z = 0;
    for (let i = 0; i < k; i++) {
      const s = mask & (1 << i) ? 0.5 : -0.5;
      x += s * v[3 * i];
      y += s * v[3 * i + 1];
      z += s * v[3 * i + 2];
    }
    best = Math.max(best, Math.hypot(x, y, z));
  }
  return best * w.scale;
}

/**
 * Symmetric boundary rule. A point x on the boundary of W is inside W moved by an infinitesimal generic
 * shift −η·d (η → 0⁺) for some directions d and outside for others. Averaging that indicator over the
 * orbit {g·d₀} of one generic direction under a point group G of the window gives a weight in [0, 1]
 * that is (i) 1 inside, 0 outside, (ii) G-invariant (the orbit is), and (iii) sums to the ideal count
 * whenever every generic shift gives it (the mean of |G| ideal counts). The half-open rule above is the
 * single direction d = (1, ε, ε²); this is its G-average (common practice for singular cuts: a symmetric
 * "fractional" choice on the boundary — our own formulation).
 */
export function boundaryWeight(w: Window, x: number, y: number, z: number, dirs: Float64Array): number {
  const dx = x - w.centre[0];
  const dy = y - w.centre[1];
  const dz = z - w.centre[2];
  const nd = dirs.length / 3;
  if (w.kind === 'sphere') {
    const r = Math.sqrt(dx * dx + dy * dy + dz * dz);
    if (r - w.r2 > w.tol) return 0;
    if (w.r1 >= 0 && w.r1 - r > w.tol) return 0;
    const onOuter = Math.abs(r - w.r2) <= w.tol;
    const onInner = w.r1 >= 0 && Math.abs(r - w.r1) <= w.tol;
    if (!onOuter && !onInner) return 1;
    let inside = 0;
    for (let k = 0; k < nd; k++) {
      const s = dx * dirs[3 * k] + dy * dirs[3 * k + 1] + dz * dirs[3 * k + 2];
      if ((onOuter && s < 0) || (onInner && s > 0)) inside++;
    }
    return inside / nd;
  }
  const n = w.normals;
  const h = w.support;
  const tol = w.tol;
  // Facets the point lies on: +1 (d = h), −1 (d = −h).
  const on: number[] = [];
  for (let f = 0, m = h.length; f < m; f++) {
    const d = n[3 * f] * dx + n[3 * f + 1] * dy + n[3 * f + 2] * dz;
    if (d - h[f] > tol || -d - h[f] > tol) return 0;
    if (Math.abs(d - h[f]) <= tol) on.push(f, 1);
    else if (Math.abs(d + h[f]) <= tol) on.push(f, -1);
  }
  if (on.length === 0) return 1;
  let inside = 0;
  for (let k = 0; k < nd; k++) {
    let ok = true;
    for (let j = 0; j < on.length && ok; j += 2) {
      const f = on[j];
      const s = n[3 * f] * dirs[3 * k] + n[3 * f + 1] * dirs[3 * k + 1] + n[3 * f + 2] * dirs[3 * k + 2];
      // Moving x by +η·d must go strictly inward through that facet.
      if (on[j + 1] * s >= 0) ok = false;
    }
    if (ok) inside++;
  }
  return inside / nd;
}

/** Closed membership with the tolerance band (the window slightly enlarged): every node a weight may keep. */
export function windowContainsClosed(w: Window, x: number, y: number, z: number): boolean {
  const dx = x - w.centre[0];
  const dy = y - w.centre[1];
  const dz = z - w.centre[2];
  if (w.kind === 'sphere') {
    const r = Math.sqrt(dx * dx + dy * dy + dz * dz);
    return r - w.r2 <= w.tol && (w.r1 < 0 || w.r1 - r <= w.tol);
  }
  const n = w.normals;
  const h = w.support;
  for (let f = 0, m = h.length; f < m; f++) {
    const d = n[3 * f] * dx + n[3 * f + 1] * dy + n[3 * f + 2] * dz;
    if (Math.abs(d) - h[f] > w.tol) return false;
  }
  return true;
}
