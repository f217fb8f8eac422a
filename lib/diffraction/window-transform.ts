/**
 * Normalised Fourier transforms of occupation domains, A(k) = (1/|W|) ∫_W e^{−i k·y} dy, which give the
 * Bragg amplitude of a model set at Q∥ from its partner Q⊥ = k (Baake & Grimm, Aperiodic Order vol. 1,
 * 2013, ch. 9: diffraction of regular model sets; Elser, Acta Cryst. A42 (1986) 36).
 *
 * - Interval of length L centred at c:  A = e^{−ikc} sin(kL/2)/(kL/2).
 * - Ball of radius R:  A = 3 (sin x − x cos x)/x³, x = kR.
 * - Convex polytope: cone from the centre over every face, faces cut into triangles, so a sum over
 *   tetrahedra (3D) or triangles (2D). For a simplex with vertices v_0…v_d,
 *     ∫ e^{z·y} dy = d!·vol·e[a_0,…,a_d],  a_j = z·v_j,  z = −ik,
 *   with e[…] the divided difference of exp (Hermite–Genocchi formula), computed stably also for
 *   coincident a_j (see expDividedDifference).
 */
import { determinant } from '../math/mat3';
import { cross, dot, type Vec3 } from '../math/vec3';

export function intervalTransform(k: number, length: number, centre = 0): [number, number] {
  const x = (k * length) / 2;
  const s = Math.abs(x) < 1e-8 ? 1 - (x * x) / 6 : Math.sin(x) / x;
  return [s * Math.cos(k * centre), -s * Math.sin(k * centre)];
}

export function ballTransform(k: number, radius: number): number {
  const x = k * radius;
  if (Math.abs(x) < 1e-3) return 1 - (x * x) / 10;
  return (3 * (Math.sin(x) - x * Math.cos(x))) / (x * x * x);
}

// Complex helpers on [re, im] pairs kept inline for speed in the simplex routine.

/**
 * Divided difference e[a_0..a_n] of exp for purely imaginary points a_j = i·b_j; returns [re, im].
 * Recursion e[S] = (e[S∖{q}] − e[S∖{p}]) / (a_p − a_q) on the farthest pair (p, q) while that pair is
 * more than 0.5 apart (so each division loses no more than a few bits); a cluster of spread ≤ 0.5 is
 * summed as e^{μ} Σ_m h_m(a − μ)/(m + n)! about its mean μ (h_m: complete homogeneous symmetric
 * polynomials), which converges fast there and has no cancellation.
 */
export function expDividedDifference(b: ArrayLike<number>): [number, number] {
  const n = b.length;
  let minGap = Infinity;
  for (let j = 0; j < n; j++) for (let m = j + 1; m < n; m++) minGap = Math.min(minGap, Math.abs(b[j] - b[m]));
  // Fast path, the closed form Σ_j e^{a_j}/Π_{m≠j}(a_j − a_m): its relative loss ≈ ε/gap^(n−1) < 1e-10 here.
  if (minGap > 0.02 && n <= 4) {
    let re = 0;
    let im = 0;
    for (let j = 0; j < n; j++) {
      let p = 1;
      for (let m = 0; m < n; m++) if (m !== j) p *= b[j] - b[m];
      re += Math.cos(b[j]) / p;
      im += Math.sin(b[j]) / p;
    }
    // divide by Π i = i^{n−1}
    switch ((n - 1) % 4) {
      case 0:
        return [re, im];
      case 1:
        return [im, -re];
      case 2:
        return [-re, -im];
      default:
        return [-im, re];
    }
  }
  return dd(Array.from(b));
}

function dd(b: number[]): [number, number] {
  const n = b.length;
  if (n === 1) return [Math.cos(b[0]), Math.sin(b[0])];
  let lo = 0;
  let hi = 0;
  for (let j = 1; j < n; j++) {
    if (b[j] < b[lo]) lo = j;
    if (b[j] > b[hi]) hi = j;
  }
  const gap = b[hi] - b[lo];
  if (gap > 0.5) {
    const [ar, ai] = dd(b.filter((_, j) => j !== lo));
    const [br, bi] = dd(b.filter((_, j) => j !== hi));
    // divide (A − B) by i·gap
    return [(ai - bi) / gap, -(ar - br) / gap];
  }
  return clusterSeries(b);
}

function clusterSeries(b: number[]): [number, number] {
  const n = b.length - 1;
  let mu = 0;
  for (const x of b) mu += x;
  mu /= b.length;
  const M = 24;
  // h[m] for the growing point set, complex (points are purely imaginary: w_j = i(b_j − μ)).
  const hr = new Float64Array(M + 1);
  const hi = new Float64Array(M + 1);
  hr[0] = 1;
  for (let j = 0; j <= n; j++) {
    const w = b[j] - mu; // point i·w
    for (let m = 1; m <= M; m++) {
      // h_m += (i w) · h_{m−1}
      hr[m] += -w * hi[m - 1];
      hi[m] += w * hr[m - 1];
    }
  }
  let sr = 0;
  let si = 0;
  let f = 1;
  for (let k = 2; k <= n; k++) f *= k; // n!
  for (let m = 0; m <= M; m++) {
    if (m > 0) f *= m + n;
    sr += hr[m] / f;
    si += hi[m] / f;
  }
  const c = Math.cos(mu);
  const s = Math.sin(mu);
  return [sr * c - si * s, sr * s + si * c];
}

/**
 * A convex, centrally symmetric polytope given as simplices with one vertex at its centre (the origin):
 * `simplices` holds, for each simplex, its d non-origin vertices (d·d numbers), listing only one of each
 * ± pair — the transform of the whole body is then real: A(k) = 2·Re Σ ∫ / |W|.
 */
export interface SymmetricConeBody {
  dim: 2 | 3;
  simplices: Float64Array;
  /** Volume (area in 2D) of each listed simplex. */
  volumes: Float64Array;
  /** Total volume of the body (2·Σ volumes). */
  volume: number;
}

export function symmetricBodyTransform(body: SymmetricConeBody, k: ArrayLike<number>): number {
  const d = body.dim;
  const fact = d === 3 ? 6 : 2;
  const nS = body.volumes.length;
  const b = new Float64Array(d + 1);
  let sum = 0;
  for (let t = 0; t < nS; t++) {
    b[0] = 0;
    for (let v = 0; v < d; v++) {
      let kv = 0;
      for (let c = 0; c < d; c++) kv += k[c] * body.simplices[t * d * d + v * d + c];
      b[v + 1] = -kv;
    }
    const [re] = expDividedDifference(b);
    sum += fact * body.volumes[t] * re;
  }
  return (2 * sum) / body.volume;
}

/**
 * The zonotope Σ_k [−½, ½]·v_k (3D, generators in general position) as a symmetric cone body:
 * faces for each pair (i, j) at c = ½ Σ_{l≠i,j} sign(n·v_l) v_l with n = v_i × v_j (standard facet
 * formula of a zonotope), each rhombus cut into two triangles, coned to the centre. Only the +n faces.
 */
export function zonotopeBody(vectors: ArrayLike<number>, scale = 1): SymmetricConeBody {
  const m = vectors.length / 3;
  const v = (i: number, c: number) => vectors[3 * i + c] * scale;
  const gen = (i: number): Vec3 => [v(i, 0), v(i, 1), v(i, 2)];
  const simplices: number[] = [];
  const volumes: number[] = [];
  for (let i = 0; i < m; i++) {
    for (let j = i + 1; j < m; j++) {
      const n = cross(gen(i), gen(j));
      const c = [0, 0, 0];
      for (let l = 0; l < m; l++) {
        if (l === i || l === j) continue;
        const side = dot(n, gen(l));
        if (Math.abs(side) < 1e-12 * (Math.abs(n[0]) + Math.abs(n[1]) + Math.abs(n[2]) + 1e-300)) {
          throw new Error('window: zonotope generators are not in general position');
        }
        const sg = Math.sign(side) / 2;
        for (let q = 0; q < 3; q++) c[q] += sg * v(l, q);
      }
      const corner = (si: number, sj: number) => [0, 1, 2].map((q) => c[q] + (si * v(i, q)) / 2 + (sj * v(j, q)) / 2);
      const tris = [
        [corner(-1, -1), corner(1, -1), corner(1, 1)],
        [corner(-1, -1), corner(1, 1), corner(-1, 1)],
      ];
      for (const tri of tris) {
        // Tetrahedron (0, a, b, c): volume |det[a; b; c]|/6.
        const det = determinant(tri);
        simplices.push(...tri[0], ...tri[1], ...tri[2]);
        volumes.push(Math.abs(det) / 6);
      }
    }
  }
  const vol = volumes.reduce((s, x) => s + x, 0) * 2;
  return { dim: 3, simplices: Float64Array.from(simplices), volumes: Float64Array.from(volumes), volume: vol };
}

/**
 * A convex polygon given by its vertices (counter-clockwise) around a centre: triangles (centre, v_i, v_{i+1}).
 * Returns the complex normalised transform (polygons need not be centrally symmetric).
 */
export function polygonTransform(vertices: ArrayLike<number>, centre: [number, number], k: [number, number]): [number, number] {
  const n = vertices.length / 2;
  let re = 0;
  let im = 0;
  let area = 0;
  const b = new Float64Array(3);
  const kc = k[0] * centre[0] + k[1] * centre[1];
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n;
    const ax = vertices[2 * i] - centre[0];
    const ay = vertices[2 * i + 1] - centre[1];
    const bx = vertices[2 * j] - centre[0];
    const by = vertices[2 * j + 1] - centre[1];
    const a = Math.abs(ax * by - ay * bx) / 2;
    area += a;
    b[0] = 0;
    b[1] = -(k[0] * ax + k[1] * ay);
    b[2] = -(k[0] * bx + k[1] * by);
    const [r, q] = expDividedDifference(b);
    re += 2 * a * r;
    im += 2 * a * q;
  }
  // shift by the centre: e^{−i k·c}
  const c = Math.cos(kc);
  const s = -Math.sin(kc);
  return [(re * c - im * s) / area, (re * s + im * c) / area];
}
