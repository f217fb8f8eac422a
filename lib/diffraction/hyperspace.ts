/**
 * Ideal (infinite, perfectly quasiperiodic) diffraction via hyperspace: Bragg peaks on the Fourier module,
 * one per reciprocal hyperlattice vector H, at Q∥ = π∥(H), with amplitude (per point)
 *
 *   F(Q∥)/N = Σ_k c_k · e^{−iφ_k(H)} · A_k(Q⊥) · g(|Q∥|),   A_k = (1/|W_k|) ∫_{W_k} e^{−iQ⊥·y} dy,
 *
 * (Baake & Grimm, Aperiodic Order vol. 1, 2013, ch. 9; Elser, Acta Cryst. A42 (1986) 36), with c_k the
 * share of points in window W_k and g the scattering factor times Debye–Waller. Intensities are |F/N|²
 * (so a perfect crystal-like peak is g², and I(0) = g(0)²), plus a relative scale (strongest Q ≠ 0 = 100).
 *
 * Families and conventions (the same as the generators in lib/models):
 *  - fibonacci: Z², points (n_L, n_S), x = n_L ℓ + n_S s with ℓ = aR, s = aR/τ; y = (n_S − n_L/τ)·s;
 *    window [−s, s/τ) (lib/models/chain/generate.ts). Indices (h, k) with Q·(n_L, n_S) phase 2π(h n_L + k n_S).
 *  - penrose: Z⁵, e_j = a(cos 2πj/5, sin 2πj/5), e⊥_j = a(cos 4πj/5, sin 4πj/5) (lib/models/penrose/generate.ts,
 *    edge a = aR), index level k = Σn_j ∈ {1,2,3,4}; windows: pentagons conv{e⊥_j} (k = 1), conv{e⊥_j + e⊥_{j+2}}
 *    (k = 2) and their negatives (k = 4, 3) — the slices of the projected 5-cube (de Bruijn 1981). The 5D
 *    basis is orthogonal with |B_j|² = 5a²/2, so Q∥ = (4π/5a) Σ h_j e_j/a and the level phase is 2π k Σh_j/5.
 *    h and h + (1,1,1,1,1) are the same peak: indices are reported with h_5 = 0 (four integers).
 *  - octagonal: Z⁴, e_j = a(cos jπ/4, sin jπ/4), e⊥_j = a(cos 3jπ/4, sin 3jπ/4), j = 0…3 (lib/models/octagonal/generate.ts,
 *    edge a = aR), one window for every node: the regular octagon W = Σ_j [0,1]·e⊥_j of edge a (the projected
 *    4-cube, Beenker 1982), centred at ½Σe⊥_j rather than at 0. The 4D basis B_j = (e_j, e⊥_j) is orthogonal
 *    (cos kπ/4 + cos 3kπ/4 = 0 for k = 1, 2, 3) with |B_j|² = 2a², so B*_j = (π/a²)·B_j: Q∥ = (π/a²) Σ h_j e_j,
 *    Q⊥ = (π/a²) Σ h_j e⊥_j, four integers with no redundancy. A grid offset γ moves W by P⊥γ: phases only.
 *  - icosahedral: the 6D lattice of lib/models/icosahedral/hyperlattice.ts (P, F or I), window the triacontahedron
 *    Σ[−½,½]e_i⊥ on every node, Q = Σ h_i E*_i with h in the dual lattice (P: Z⁶; F: Z⁶ ∪ Z⁶ + ½(1,…,1);
 *    I: Σh even — hyperlattice.ts item 4), with Cahn–Shechtman–Gratias indices and N, M (indexing.ts).
 *    One window per node means the amplitude is the window transform for every allowed h.
 */
import { icosahedralBasis, inReciprocalLattice, reciprocalBasis, type HyperlatticeType } from '../models/icosahedral/hyperlattice';
import { TAU } from '../math/golden';
import { norm } from '../math/vec3';
import type { Radiation } from './form-factors';
import { scatteringFactor } from './form-factors';
import { intervalTransform, polygonTransform, symmetricBodyTransform, zonotopeBody } from './window-transform';
import { csgFromHyper } from './indexing';
import { octagonalSpec } from '../models/octagonal/generate';
import { convexPolygon } from '../models/planar/window';

export type HyperFamily = 'fibonacci' | 'penrose' | 'octagonal' | 'icosahedral';

export interface HyperOptions {
  family: HyperFamily;
  aR: number;
  qmax: number;
  qperpMax?: number;
  radiation?: Radiation;
  species?: number;
  biso?: number;
  /** Keep peaks with |F/N|² ≥ threshold · g(0)² (default 1e-4). */
  threshold?: number;
  /** Icosahedral hyperlattice type (default P); the window is the triacontahedron for each. */
  lattice?: HyperlatticeType;
}

export interface HyperPeak {
  indices: number[];
  qPar: number[];
  qParNorm: number;
  qPerp: number[];
  qPerpNorm: number;
  /** Complex amplitude F/N. */
  re: number;
  im: number;
  /** |F/N|². */
  intensity: number;
  /** Intensity relative to the strongest Q ≠ 0 peak (= 100). */
  relative: number;
  /** Cahn–Shechtman–Gratias indices (icosahedral only). */
  csg?: { label: string; N: number; M: number };
}

function factor(o: HyperOptions, q: number): number {
  const s2 = (q / (4 * Math.PI)) ** 2;
  const f = scatteringFactor(o.radiation ?? 'xray', o.species ?? 0, s2);
  return o.biso ? f * Math.exp(-o.biso * s2) : f;
}

function check(o: HyperOptions): void {
  if (!(o.aR > 0) || !Number.isFinite(o.aR)) throw new Error(`aR: must be a positive length in Å, got ${o.aR}`);
  if (!(o.qmax > 0) || !Number.isFinite(o.qmax)) throw new Error(`qmax: must be positive (Å⁻¹), got ${o.qmax}`);
  if (o.qperpMax !== undefined && !(o.qperpMax > 0)) throw new Error(`qperpMax: must be positive (Å⁻¹), got ${o.qperpMax}`);
}

/** Refuse enumerations that would take minutes; names the fields to change. */
const MAX_CANDIDATES = 2e7;
function guard(count: number): void {
  if (count > MAX_CANDIDATES) {
    throw new Error(`qmax: about ${count.toExponential(1)} module points to visit; lower qmax or qperpMax (limit ${MAX_CANDIDATES.toExponential(0)})`);
  }
}

function finish(peaks: HyperPeak[], o: HyperOptions, g0: number): HyperPeak[] {
  const thr = (o.threshold ?? 1e-4) * g0 * g0;
  const kept = peaks.filter((p) => p.intensity >= thr);
  let top = 0;
  for (const p of kept) if (p.qParNorm > 1e-9) top = Math.max(top, p.intensity);
  for (const p of kept) p.relative = top > 0 ? (100 * p.intensity) / top : 0;
  kept.sort((a, b) => a.qParNorm - b.qParNorm || b.intensity - a.intensity || cmp(a.indices, b.indices));
  return kept;
}

function cmp(a: number[], b: number[]): number {
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return b[i] - a[i];
  return 0;
}

export function fibonacciPeaks(o: HyperOptions): HyperPeak[] {
  check(o);
  const ell = o.aR;
  const s = ell / TAU;
  const det = ell * s + (s * s) / TAU;
  const L = TAU * s;
  const c = -s / (2 * TAU * TAU);
  const qperpMax = o.qperpMax ?? 60 / L;
  // Q∥ = 2π(s h + (s/τ) k)/det, Q⊥ = 2π(−s h + ℓ k)/det; invert the box |Q∥| ≤ qmax, |Q⊥| ≤ qperpMax.
  const hMax = Math.ceil(((o.qmax + qperpMax) * det) / (2 * Math.PI * s)) + 1;
  const peaks: HyperPeak[] = [];
  const g0 = factor(o, 0);
  for (let h = -hMax; h <= hMax; h++) {
    // k range from both constraints
    const kLo = Math.ceil(((-o.qmax * det) / (2 * Math.PI) - s * h) / (s / TAU) - 1e-9);
    const kHi = Math.floor(((o.qmax * det) / (2 * Math.PI) - s * h) / (s / TAU) + 1e-9);
    for (let k = kLo; k <= kHi; k++) {
      const qp = (2 * Math.PI * (s * h + (s / TAU) * k)) / det;
      const qq = (2 * Math.PI * (-s * h + ell * k)) / det;
      if (Math.abs(qp) > o.qmax + 1e-12 || Math.abs(qq) > qperpMax) continue;
      const [ar, ai] = intervalTransform(qq, L, c);
      const g = factor(o, Math.abs(qp));
      const re = ar * g;
      const im = ai * g;
      peaks.push({ indices: [h, k], qPar: [qp], qParNorm: Math.abs(qp), qPerp: [qq], qPerpNorm: Math.abs(qq), re, im, intensity: re * re + im * im, relative: 0 });
    }
  }
  return finish(peaks, o, g0);
}

/** Penrose windows (vertex lists, counter-clockwise) for levels k = 1..4, in Å, for edge a. */
export function penroseWindows(a: number): { level: number; vertices: number[]; area: number }[] {
  const ep = (j: number) => [a * Math.cos((4 * Math.PI * j) / 5), a * Math.sin((4 * Math.PI * j) / 5)];
  const ccw = (pts: number[][]) => {
    const sorted = pts.slice().sort((p, q) => Math.atan2(p[1], p[0]) - Math.atan2(q[1], q[0]));
    return sorted.flat();
  };
  const small = ccw([0, 1, 2, 3, 4].map(ep));
  const large = ccw([0, 1, 2, 3, 4].map((j) => [ep(j)[0] + ep(j + 2)[0], ep(j)[1] + ep(j + 2)[1]]));
  const neg = (v: number[]) => ccw(Array.from({ length: v.length / 2 }, (_, i) => [-v[2 * i], -v[2 * i + 1]]));
  const area = (v: number[]) => {
    let s = 0;
    for (let i = 0; i < v.length / 2; i++) {
      const j = (i + 1) % (v.length / 2);
      s += v[2 * i] * v[2 * j + 1] - v[2 * j] * v[2 * i + 1];
    }
    return Math.abs(s) / 2;
  };
  return [
    { level: 1, vertices: small, area: area(small) },
    { level: 2, vertices: large, area: area(large) },
    { level: 3, vertices: neg(large), area: area(large) },
    { level: 4, vertices: neg(small), area: area(small) },
  ];
}

/**
 * Walk the rank-4 Fourier module of a planar tiling: every h ∈ Z⁴ with |h|² ≤ r2 (the caller's bound
 * from |Q∥|² + |Q⊥|²), Q∥ = f·Σ h_j (ex_j, ey_j) and Q⊥ = f·Σ h_j (px_j, py_j), keeping those with
 * |Q∥| ≤ qmax and |Q⊥| ≤ qperpMax. The small slack on the square roots keeps points lying exactly on
 * the bound.
 */
function forEachPlanarModulePoint(
  r2: number,
  f: number,
  ex: readonly number[],
  ey: readonly number[],
  px: readonly number[],
  py: readonly number[],
  qmax: number,
  qperpMax: number,
  visit: (h: number[], qx: number, qy: number, rx: number, ry: number, qp: number, qq: number) => void,
): void {
  const h = [0, 0, 0, 0];
  const m0 = Math.floor(Math.sqrt(r2) + 1e-9);
  for (h[0] = -m0; h[0] <= m0; h[0]++) {
    const l1 = r2 - h[0] * h[0];
    const m1 = Math.floor(Math.sqrt(Math.max(l1, 0)) + 1e-9);
    for (h[1] = -m1; h[1] <= m1; h[1]++) {
      const l2 = l1 - h[1] * h[1];
      const m2 = Math.floor(Math.sqrt(Math.max(l2, 0)) + 1e-9);
      for (h[2] = -m2; h[2] <= m2; h[2]++) {
        const l3 = l2 - h[2] * h[2];
        const m3 = Math.floor(Math.sqrt(Math.max(l3, 0)) + 1e-9);
        for (h[3] = -m3; h[3] <= m3; h[3]++) {
          let qx = 0;
          let qy = 0;
          let rx = 0;
          let ry = 0;
          for (let j = 0; j < 4; j++) {
            qx += h[j] * ex[j];
            qy += h[j] * ey[j];
            rx += h[j] * px[j];
            ry += h[j] * py[j];
          }
          qx *= f;
          qy *= f;
          rx *= f;
          ry *= f;
          const qp = Math.hypot(qx, qy);
          const qq = Math.hypot(rx, ry);
          if (qp > qmax + 1e-12 || qq > qperpMax) continue;
          visit(h, qx, qy, rx, ry, qp, qq);
        }
      }
    }
  }
}

export function penrosePeaks(o: HyperOptions): HyperPeak[] {
  check(o);
  const a = o.aR;
  const wins = penroseWindows(a);
  const total = wins.reduce((s, w) => s + w.area, 0);
  const qperpMax = o.qperpMax ?? 12 / a;
  const f = (4 * Math.PI) / (5 * a);
  const ex = [0, 1, 2, 3, 4].map((j) => Math.cos((2 * Math.PI * j) / 5));
  const ey = [0, 1, 2, 3, 4].map((j) => Math.sin((2 * Math.PI * j) / 5));
  const px = [0, 1, 2, 3, 4].map((j) => Math.cos((4 * Math.PI * j) / 5));
  const py = [0, 1, 2, 3, 4].map((j) => Math.sin((4 * Math.PI * j) / 5));
  // |Q∥|² + |Q⊥|² = f²·(5/2)·(|h|² − (Σh)²/5) ≥ f²|h|²/2 with h_5 = 0 (Cauchy–Schwarz on four entries).
  const r2 = (2 * (o.qmax ** 2 + qperpMax ** 2)) / (f * f);
  guard(((Math.PI * Math.PI) / 2) * r2 * r2); // volume of the 4-ball of radius √r2
  const peaks: HyperPeak[] = [];
  const g0 = factor(o, 0);
  forEachPlanarModulePoint(r2, f, ex, ey, px, py, o.qmax, qperpMax, (h, qx, qy, rx, ry, qp, qq) => {
    const sh = h[0] + h[1] + h[2] + h[3];
    let re = 0;
    let im = 0;
    for (const w of wins) {
      const [ar, ai] = polygonTransform(w.vertices, [0, 0], [rx, ry]);
      const ph = (-2 * Math.PI * w.level * sh) / 5;
      const c = Math.cos(ph);
      const s = Math.sin(ph);
      re += (w.area / total) * (ar * c - ai * s);
      im += (w.area / total) * (ar * s + ai * c);
    }
    const g = factor(o, qp);
    re *= g;
    im *= g;
    peaks.push({ indices: h.slice(), qPar: [qx, qy], qParNorm: qp, qPerp: [rx, ry], qPerpNorm: qq, re, im, intensity: re * re + im * im, relative: 0 });
  });
  return finish(peaks, o, g0);
}

/**
 * The Ammann–Beenker window for edge a (Å): the octagon P⊥([0,1]⁴) with the perpendicular map the generator
 * writes to Structure.perp (octagonalSpec(…).perpOut, γ = 0), as counter-clockwise vertices, its centre
 * ½Σe⊥_j and its area. Also the unit parallel and perpendicular directions used for the module.
 */
export function octagonalWindow(a: number): { vertices: number[]; centre: [number, number]; area: number; par: number[][]; perp: number[][] } {
  const spec = octagonalSpec([0, 0, 0, 0]);
  const perp = spec.perpOut;
  const pts: number[] = [];
  for (let mask = 0; mask < 16; mask++) {
    let x = 0;
    let y = 0;
    for (let j = 0; j < 4; j++) {
      if ((mask >> j) & 1) {
        x += a * perp[0][j];
        y += a * perp[1][j];
      }
    }
    pts.push(x, y);
  }
  const w = convexPolygon(pts);
  if (!w || w.corners.length !== 16) throw new Error('octagonal: window is not an octagon (internal error)');
  let cx = 0;
  let cy = 0;
  for (let j = 0; j < 4; j++) {
    cx += (a * perp[0][j]) / 2;
    cy += (a * perp[1][j]) / 2;
  }
  return { vertices: Array.from(w.corners), centre: [cx, cy], area: w.area, par: spec.par, perp };
}

export function octagonalPeaks(o: HyperOptions): HyperPeak[] {
  check(o);
  const a = o.aR;
  const win = octagonalWindow(a);
  const qperpMax = o.qperpMax ?? 12 / a;
  const f = Math.PI / a; // |B*_j| per component direction: Q = (π/a)·Σ h_j (ê_j, ê⊥_j)
  const ex = win.par[0];
  const ey = win.par[1];
  const px = win.perp[0];
  const py = win.perp[1];
  // |Q∥|² + |Q⊥|² = 2f²|h|² (orthogonal basis, |ê_j|² + |ê⊥_j|² = 2).
  const r2 = (o.qmax ** 2 + qperpMax ** 2) / (2 * f * f);
  guard(((Math.PI * Math.PI) / 2) * r2 * r2); // volume of the 4-ball of radius √r2
  const peaks: HyperPeak[] = [];
  const g0 = factor(o, 0);
  forEachPlanarModulePoint(r2, f, ex, ey, px, py, o.qmax, qperpMax, (h, qx, qy, rx, ry, qp, qq) => {
    // Σ_K e^{iQ∥·x_K} = Σ_K e^{−iQ⊥·y_K} (Q·X = 2π h·K), so F/N = (1/|W|)∫_W e^{−iQ⊥·y} dy.
    const [ar, ai] = polygonTransform(win.vertices, win.centre, [rx, ry]);
    const g = factor(o, qp);
    const re = ar * g;
    const im = ai * g;
    peaks.push({ indices: h.slice(), qPar: [qx, qy], qParNorm: qp, qPerp: [rx, ry], qPerpNorm: qq, re, im, intensity: re * re + im * im, relative: 0 });
  });
  return finish(peaks, o, g0);
}

export function icosahedralPeaks(o: HyperOptions): HyperPeak[] {
  check(o);
  const lattice = o.lattice ?? 'P';
  if (lattice !== 'P' && lattice !== 'F' && lattice !== 'I') throw new Error(`lattice: must be P, F or I, got "${String(lattice)}"`);
  const rb = reciprocalBasis(o.aR);
  const body = zonotopeBody(icosahedralBasis(o.aR).perp);
  const unit = Math.PI / o.aR; // |e*_i∥| = |e*_i⊥|
  const qperpMax = o.qperpMax ?? 12 / o.aR;
  // F has half-integer h: walk g = 2h ∈ Z⁶ and keep the allowed ones.
  const twice = lattice === 'F';
  const r2 = ((o.qmax ** 2 + qperpMax ** 2) / (2 * unit * unit)) * (twice ? 4 : 1);
  guard(((Math.PI ** 3) / 6) * r2 ** 3); // volume of the 6-ball of radius √r2
  const peaks: HyperPeak[] = [];
  const g0 = factor(o, 0);
  const g = new Int32Array(6);
  const h = new Float64Array(6);
  const qp = new Float64Array(3);
  const qq = new Float64Array(3);
  const rec = (i: number, left: number) => {
    if (i === 6) {
      for (let j = 0; j < 6; j++) h[j] = twice ? g[j] / 2 : g[j];
      if (lattice !== 'P' && !inReciprocalLattice(h, lattice)) return;
      qp.fill(0);
      qq.fill(0);
      for (let j = 0; j < 6; j++) {
        for (let c = 0; c < 3; c++) {
          qp[c] += h[j] * rb.par[3 * j + c];
          qq[c] += h[j] * rb.perp[3 * j + c];
        }
      }
      const a = norm(qp);
      const b = norm(qq);
      if (a > o.qmax + 1e-12 || b > qperpMax) return;
      const amp = symmetricBodyTransform(body, qq) * factor(o, a);
      const csg = csgFromHyper(h);
      peaks.push({
        indices: Array.from(h),
        qPar: Array.from(qp),
        qParNorm: a,
        qPerp: Array.from(qq),
        qPerpNorm: b,
        re: amp,
        im: 0,
        intensity: amp * amp,
        relative: 0,
        csg: { label: csg.label, N: csg.N, M: csg.M },
      });
      return;
    }
    const m = Math.floor(Math.sqrt(left) + 1e-9);
    for (let v = -m; v <= m; v++) {
      g[i] = v;
      rec(i + 1, left - v * v);
    }
    g[i] = 0;
  };
  rec(0, r2);
  return finish(peaks, o, g0);
}

export function hyperspacePeaks(o: HyperOptions): HyperPeak[] {
  switch (o.family) {
    case 'fibonacci':
      return fibonacciPeaks(o);
    case 'penrose':
      return penrosePeaks(o);
    case 'octagonal':
      return octagonalPeaks(o);
    case 'icosahedral':
      return icosahedralPeaks(o);
    default:
      throw new Error(`family: must be fibonacci, penrose, octagonal or icosahedral, got "${String(o.family)}"`);
  }
}
