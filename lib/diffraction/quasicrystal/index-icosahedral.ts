/**
 * Indexing of an icosahedral powder pattern and refinement of the quasilattice constant aR and the zero shift.
 *
 * 1. Peaks: peak-find.ts (positions with σ, widths, areas).
 * 2. Reference lines: every module point h with |Q⊥|·aR ≤ qperpLimit (strong reflections have small Q⊥) and
 *    |Q∥|·aR up to what the widest aR asks for, of the reciprocal hyperlattice (P for P; Z⁶ ∪ Z⁶ + ½(1,…,1) for F,
 *    so half-integer indices appear; hyperlattice.ts item 4), at aR = 1 — positions scale as 1/aR. Lines are grouped by
 *    the Cahn–Shechtman–Gratias labels N, M (indexing.ts: every reflection with the same N, M has the same |Q∥| and
 *    |Q⊥|), with the vertex-model strength S = m·A(Q⊥)² (A: transform of the ball of the triacontahedron's volume).
 * 3. Trial aR: ratios of a strong reference line to one of the strongest measured peaks; each trial scored by
 *    (share of measured area explained by predicted lines) × (share of the predicted strength, with Lp and a generic
 *    exp(−B s²) fall-off with B = 6 Å², a stand-in for form factor and thermal motion, that is observed). The τ³-related solutions index the same positions; the score prefers
 *    the one whose strong measured peaks have small |Q⊥| and whose strong predicted lines are all seen. The best few
 *    trials and the best one times τ^k (k = −3…3, inside the range) are refined (step 5), and the solution with
 *    the largest score × exp(−½·misfit²) wins, the misfit being the RMS of ln(measured area / vertex-model strength):
 *    τ-related solutions index the same positions but predict a different fall-off of intensity with |Q⊥|.
 * 4. Assignment: each peak gets the line within the tolerance with the largest predicted strength (smallest |Q⊥|).
 * 5. aR and zero shift by weighted least squares on 2θ_obs = 2·asin(λ|Q∥|/4π) + z (least-squares.ts), with σ.
 * 6. Phason-strain diagnostic: linear fits of the shift ΔQ = Q_obs − Q_calc and of the width (FWHM in Q) against
 *    |Q⊥| (linear phason strain shifts and broadens peaks in proportion to |Q⊥| — Lubensky, Socolar, Steinhardt,
 *    Bancel & Heiney, PRL 57 (1986) 1440; cited from memory).
 */
import { csgFromHyper, hyperFromCsg } from '../indexing';
import { lorentzPolarization } from '../lorentz-polarization';
import { ballTransform } from '../window-transform';
import { reciprocalBasis } from '../../models/icosahedral/hyperlattice';
import { TAU } from '../../math/golden';
import { domainTransform } from './domain-transform';
import { starRepresentative } from './star';
import { findPeaks, type FoundPeak, type PeakFindOptions } from './peak-find';
import { leastSquares } from './least-squares';
import { progressRange, type OnProgress } from './progress';

const DEG = Math.PI / 180;

export interface RefLine {
  N: number;
  M: number;
  /** |Q∥|·aR and |Q⊥|·aR. */
  q1: number;
  qPerp1: number;
  strength: number;
  /** Number of reflections with this N, M (one or more icosahedral stars of equal |Q∥| and |Q⊥|). */
  multiplicity: number;
  indices: number[];
}

/**
 * Reference lines at aR = 1 (see header, item 2). Enumerated axis by axis in Cahn–Shechtman–Gratias
 * coordinates (indexing.ts): along each Cartesian axis Q∥ ∝ h + h'τ and Q⊥ ∝ τ(h − h'/τ), so the pairs (h, h')
 * with |h + h'τ| ≤ R and |h − h'/τ| ≤ L are a short list per axis, and the triples of pairs within the two
 * balls are the module points; the hyperlattice parity (P: every hyperFromCsg index an integer; F: all integers
 * or all half-integers) picks the allowed ones.
 */
export function icosahedralReferenceLines(lattice: 'P' | 'F', q1max: number, qperpLimit = 4.5, onProgress?: OnProgress): RefLine[] {
  if (!(q1max > 0) || !Number.isFinite(q1max)) throw new Error(`qmax: must be positive, got ${q1max}`);
  const c1 = Math.PI / Math.sqrt(2 + TAU);
  const R = q1max / c1;
  const L = qperpLimit / (c1 * TAU);
  const pairs: { h: number; hp: number; a2: number; b2: number }[] = [];
  const hpMax = Math.ceil((R + L) / Math.sqrt(5)) + 1;
  for (let hp = -hpMax; hp <= hpMax; hp++) {
    const lo = Math.ceil(Math.max(-R - hp * TAU, -L + hp / TAU) - 1e-9);
    const hi = Math.floor(Math.min(R - hp * TAU, L + hp / TAU) + 1e-9);
    for (let h = lo; h <= hi; h++) pairs.push({ h, hp, a2: (h + hp * TAU) ** 2, b2: (h - hp / TAU) ** 2 });
  }
  const R2 = R * R * (1 + 1e-12);
  const L2 = L * L * (1 + 1e-12);
  // Strength from the ball of the triacontahedron's volume (rotation-invariant, so one value per N, M; the
  // ranking of lines is all it is used for).
  const rEq = Math.cbrt((3 * domainTransform({ kind: 'hypercube', scale: 1 }, 1).volume) / (4 * Math.PI));
  const rb = reciprocalBasis(1);
  const groups = new Map<string, RefLine>();
  const qq = new Float64Array(3);
  for (let ix = 0; ix < pairs.length; ix++) {
    const x = pairs[ix];
    if (ix > 0) onProgress?.(ix / pairs.length);
    for (const y of pairs) {
      const a2 = x.a2 + y.a2;
      const b2 = x.b2 + y.b2;
      if (a2 > R2 || b2 > L2) continue;
      for (const z of pairs) {
        if (a2 + z.a2 > R2 || b2 + z.b2 > L2) continue;
        const csg = [x.h, x.hp, y.h, y.hp, z.h, z.hp];
        // parities of k' + h, l' + k, h' + l (hyperFromCsg)
        const p1 = (y.hp + x.h) & 1;
        const p2 = (z.hp + y.h) & 1;
        const p3 = (x.hp + z.h) & 1;
        const allEven = p1 === 0 && p2 === 0 && p3 === 0;
        const allOdd = p1 === 1 && p2 === 1 && p3 === 1;
        if (!(allEven || (lattice === 'F' && allOdd))) continue;
        const h = hyperFromCsg(csg);
        const q1 = c1 * Math.sqrt(a2 + z.a2);
        if (q1 < 1e-9) continue;
        const { N, M } = csgFromHyper(h);
        const key = `${N},${M}`;
        let g = groups.get(key);
        if (!g) {
          qq.fill(0);
          for (let j = 0; j < 6; j++) for (let c = 0; c < 3; c++) qq[c] += h[j] * rb.perp[3 * j + c];
          g = { N, M, q1, qPerp1: Math.hypot(qq[0], qq[1], qq[2]), strength: 0, multiplicity: 0, indices: h };
          groups.set(key, g);
        }
        g.multiplicity++;
      }
    }
  }
  const lines = [...groups.values()];
  for (const l of lines) {
    l.indices = starRepresentative(l.indices).rep;
    l.strength = l.multiplicity * ballTransform(l.qPerp1, rEq) ** 2;
  }
  onProgress?.(1);
  return lines.sort((a, b) => a.q1 - b.q1);
}

export interface IndexOptions {
  wavelength: number;
  lattice: 'P' | 'F';
  /** Search range for aR in Å (default 3–12). */
  aRMin?: number;
  aRMax?: number;
  /** Start value; when given, the search is limited to ±3 % about it. */
  aRGuess?: number;
  peaks?: PeakFindOptions;
  /** Radiation for Lp in the score (default X-ray). */
  radiation?: 'xray' | 'neutron' | 'electron';
  /**
   * Progress (progress.ts), in shares of the time measured on a synthetic Cu Kα pattern. indexPeaks: up to 0.7
   * while the reference lines are listed, up to 0.8 over the trial aR values, up to 0.98 over the refinements,
   * 1 when done. indexIcosahedralPattern: peak finding takes the first half, indexPeaks the second.
   */
  onProgress?: OnProgress;
}

export interface IndexedPeak {
  twoTheta: number;
  twoThetaSigma: number;
  twoThetaCalc: number | null;
  residual: number | null;
  indices: number[] | null;
  N: number | null;
  M: number | null;
  qPar: number | null;
  qPerp: number | null;
  multiplicity: number | null;
  fwhm: number;
  area: number;
  /** Vertex-model strength of the assigned line relative to the strongest assigned (100). */
  predicted: number | null;
}

export interface LinearTrend {
  slope: number;
  slopeSigma: number;
  intercept: number;
  points: number;
}

export interface IndexResult {
  aR: number;
  aRSigma: number;
  zeroShift: number;
  zeroShiftSigma: number;
  lattice: 'P' | 'F';
  wavelength: number;
  peaks: IndexedPeak[];
  indexed: number;
  rmsResidual: number;
  /** Share of measured peak area indexed × share of the predicted strong lines observed (0–1). */
  score: number;
  /** RMS of ln(area / vertex-model strength) about its mean, over the indexed peaks. */
  intensityMisfit: number;
  phasonStrain: { shift: LinearTrend | null; width: LinearTrend | null; note: string };
  warnings: string[];
}

const q2tt = (q: number, lambda: number) => (2 * Math.asin(Math.min(1, (q * lambda) / (4 * Math.PI)))) / DEG;
const tt2q = (tt: number, lambda: number) => (4 * Math.PI * Math.sin((tt * DEG) / 2)) / lambda;

function lineWeight(l: RefLine, aR: number, lambda: number, radiation: IndexOptions['radiation']): number {
  const q = l.q1 / aR;
  const tt = q2tt(q, lambda);
  const s2 = (q / (4 * Math.PI)) ** 2;
  return l.strength * lorentzPolarization(tt, radiation ?? 'xray') * Math.exp(-6 * s2);
}

function nearest(sorted: number[], v: number): number {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const m = (lo + hi) >> 1;
    if (sorted[m] < v) lo = m + 1;
    else hi = m;
  }
  return lo;
}

/** Index peaks already found. */
export function indexPeaks(found: FoundPeak[], o: IndexOptions): IndexResult {
  const lambda = o.wavelength;
  if (!(lambda > 0)) throw new Error(`wavelength: must be positive, got ${lambda}`);
  if (o.lattice !== 'P' && o.lattice !== 'F') throw new Error(`lattice: must be P or F, got "${String(o.lattice)}"`);
  const warnings: string[] = [];
  const peaks = found.filter((p) => p.twoTheta > 0 && p.twoTheta < 180).sort((a, b) => a.twoTheta - b.twoTheta);
  if (peaks.length < 3) throw new Error(`measured: ${peaks.length} peaks found; indexing needs at least 3 (lower the prominence threshold or check the file)`);
  let aRMin = o.aRMin ?? 3;
  let aRMax = o.aRMax ?? 12;
  if (o.aRGuess !== undefined) {
    if (!(o.aRGuess > 0)) throw new Error(`aR: the guess must be positive, got ${o.aRGuess}`);
    aRMin = o.aRGuess * 0.97;
    aRMax = o.aRGuess * 1.03;
  }
  if (!(aRMin > 0 && aRMax > aRMin)) throw new Error(`aR range: need 0 < min < max, got ${aRMin}–${aRMax}`);
  const qObs = peaks.map((p) => tt2q(p.twoTheta, lambda));
  const qLo = qObs[0];
  const qHi = qObs[qObs.length - 1];
  const report = o.onProgress;
  const ref = icosahedralReferenceLines(o.lattice, qHi * aRMax * 1.02 + 0.5, 4.5, progressRange(report, 0, 0.7));
  const totalArea = peaks.reduce((s, p) => s + p.area, 0);
  const tolOf = (p: FoundPeak, extra: number) => Math.max(0.02, 0.5 * p.fwhm) + extra;

  const score = (aR: number, zero: number, extra: number): number => {
    const lines = ref.filter((l) => l.q1 / aR >= qLo * 0.98 && l.q1 / aR <= qHi * 1.005);
    if (lines.length === 0) return 0;
    const tt = lines.map((l) => q2tt(l.q1 / aR, lambda) + zero);
    const w = lines.map((l) => lineWeight(l, aR, lambda, o.radiation));
    const wMax = Math.max(...w);
    let explained = 0;
    const seen = new Uint8Array(lines.length);
    peaks.forEach((p) => {
      const tol = tolOf(p, extra);
      let best = 0;
      for (let j = nearest(tt, p.twoTheta - tol); j < tt.length && tt[j] <= p.twoTheta + tol; j++) {
        best = Math.max(best, w[j] / wMax);
        seen[j] = 1;
      }
      // a peak explained by a very weak line counts in proportion (favours small |Q⊥|)
      explained += p.area * Math.min(1, best / 0.02);
    });
    let have = 0;
    let want = 0;
    lines.forEach((_, j) => {
      if (w[j] < 0.03 * wMax) return;
      want += w[j];
      if (seen[j]) have += w[j];
    });
    return (explained / totalArea) * (want > 0 ? have / want : 0);
  };

  // Trials: strongest measured peaks × strongest reference lines.
  const strongObs = peaks
    .map((p, k) => ({ p, k }))
    .sort((a, b) => b.p.area - a.p.area)
    .slice(0, 4);
  // Lines whose members are strong on their own (mean A² ≥ 0.25: small |Q⊥|).
  const refStrong = ref.filter((l) => l.strength / l.multiplicity >= 0.25);
  let best = { aR: NaN, s: -1 };
  const trials: { aR: number; s: number }[] = [];
  const trialCount = strongObs.length * refStrong.length;
  let tried = 0;
  for (const { k } of strongObs) {
    for (const l of refStrong) {
      tried++;
      const aR = l.q1 / qObs[k];
      if (aR < aRMin || aR > aRMax) continue;
      const s = score(aR, 0, 0.12);
      trials.push({ aR, s });
      if (s > best.s + 1e-9) best = { aR, s };
      report?.(0.7 + (0.1 * tried) / trialCount);
    }
  }
  report?.(0.8);
  if (!Number.isFinite(best.aR)) throw new Error(`indexing: no quasilattice constant in ${aRMin.toFixed(3)}–${aRMax.toFixed(3)} Å fits the strongest peaks; widen the aR range or check the wavelength`);

  // Assign, refine, repeat with a tighter tolerance.
  const refine = (aRStart: number) => {
    let aR = aRStart;
    let zero = 0;
    let sigmaA = NaN;
    let sigmaZ = NaN;
    let extra = 0.12;
    let assigned: (RefLine | null)[] = [];
    let rms = NaN;
    for (let pass = 0; pass < 4; pass++) {
      const lines = ref.filter((l) => l.q1 / aR >= qLo * 0.97 && l.q1 / aR <= qHi * 1.01);
      const tt = lines.map((l) => q2tt(l.q1 / aR, lambda) + zero);
      const w = lines.map((l) => lineWeight(l, aR, lambda, o.radiation));
      assigned = peaks.map((p) => {
        const tol = tolOf(p, extra);
        let bj = -1;
        for (let j = nearest(tt, p.twoTheta - tol); j < tt.length && tt[j] <= p.twoTheta + tol; j++) if (bj < 0 || w[j] > w[bj]) bj = j;
        return bj >= 0 ? lines[bj] : null;
      });
      const use = peaks.map((_, k) => k).filter((k) => assigned[k] !== null);
      if (use.length < 3) return null;
      const yObs = use.map((k) => peaks[k].twoTheta);
      const wts = use.map((k) => 1 / Math.max(peaks[k].twoThetaSigma, 2e-4) ** 2);
      const model = (par: number[], i: number) => q2tt(assigned[use[i]]!.q1 / par[0], lambda) + par[1];
      const fit = leastSquares(yObs, wts, model, [aR, zero], [aR * 1e-7, 1e-6], { minValues: [aR * 0.9, -2], maxValues: [aR * 1.1, 2] });
      aR = fit.params[0];
      zero = fit.params[1];
      sigmaA = fit.sigma[0];
      sigmaZ = fit.sigma[1];
      rms = Math.sqrt(fit.residuals.reduce((s, r) => s + r * r, 0) / fit.residuals.length);
      extra = Math.max(0, Math.min(0.05, 3 * rms));
    }
    // Intensity check against the vertex model (log areas against log predicted, slope 1): tells the
    // τ-related solutions apart, which index the same positions with |Q⊥| scaled by powers of τ².
    const ys: number[] = [];
    assigned.forEach((l, k) => {
      if (!l) return;
      const pw = lineWeight(l, aR, lambda, o.radiation);
      if (pw > 0 && peaks[k].area > 0) ys.push(Math.log(peaks[k].area) - Math.log(pw));
    });
    const mean = ys.reduce((s, v) => s + v, 0) / ys.length;
    const rmsLog = Math.sqrt(ys.reduce((s, v) => s + (v - mean) ** 2, 0) / ys.length);
    const sc = score(aR, zero, Math.max(0.01, 3 * rms));
    return { aR, zero, sigmaA, sigmaZ, assigned, rms, rmsLog, score: sc, merit: sc * Math.exp(-0.5 * rmsLog * rmsLog) };
  };
  const starts: number[] = [];
  for (const t of trials.sort((a, b) => b.s - a.s)) {
    if (starts.length >= 4) break;
    if (starts.every((x) => Math.abs(x / t.aR - 1) > 2e-3)) starts.push(t.aR);
  }
  for (let k = -3; k <= 3; k++) {
    const a = best.aR * TAU ** k;
    if (k !== 0 && a >= aRMin && a <= aRMax) starts.push(a);
  }
  let sol: NonNullable<ReturnType<typeof refine>> | null = null;
  for (let i = 0; i < starts.length; i++) {
    const r = refine(starts[i]);
    if (r && (!sol || r.merit > sol.merit)) sol = r;
    report?.(0.8 + (0.18 * (i + 1)) / starts.length);
  }
  if (!sol) throw new Error('indexing: fewer than 3 peaks could be indexed at any trial aR');
  const { aR, zero, sigmaA, sigmaZ, assigned, rms } = sol;
  const out: IndexedPeak[] = peaks.map((p, k) => {
    const l = assigned[k];
    if (!l) return { twoTheta: p.twoTheta, twoThetaSigma: p.twoThetaSigma, twoThetaCalc: null, residual: null, indices: null, N: null, M: null, qPar: null, qPerp: null, multiplicity: null, fwhm: p.fwhm, area: p.area, predicted: null };
    const calc = q2tt(l.q1 / aR, lambda) + zero;
    return {
      twoTheta: p.twoTheta,
      twoThetaSigma: p.twoThetaSigma,
      twoThetaCalc: calc,
      residual: p.twoTheta - calc,
      indices: l.indices,
      N: l.N,
      M: l.M,
      qPar: l.q1 / aR,
      qPerp: l.qPerp1 / aR,
      multiplicity: l.multiplicity,
      fwhm: p.fwhm,
      area: p.area,
      predicted: lineWeight(l, aR, lambda, o.radiation),
    };
  });
  const pmax = Math.max(...out.map((p) => p.predicted ?? 0));
  for (const p of out) if (p.predicted !== null) p.predicted = (100 * p.predicted) / pmax;
  const unindexed = out.filter((p) => p.indices === null).length;
  if (unindexed > 0) warnings.push(`${unindexed} of ${out.length} peaks have no icosahedral line within the tolerance: a second phase, an approximant or a wrong lattice type`);
  const idx = out.filter((p) => p.indices !== null);
  const shift = trend(idx.map((p) => p.qPerp!), idx.map((p) => tt2q(p.twoTheta - zero, lambda) - p.qPar!));
  const width = trend(
    idx.map((p) => p.qPerp!),
    idx.map((p) => ((4 * Math.PI) / lambda) * Math.cos((p.twoTheta * DEG) / 2) * ((p.fwhm * DEG) / 2)),
  );
  const notes: string[] = [];
  if (width && width.slope > 3 * width.slopeSigma) notes.push('peak widths grow with |Q⊥| (slope > 3σ): phason strain or phason disorder');
  if (shift && Math.abs(shift.slope) > 3 * shift.slopeSigma) notes.push('peak shifts correlate with |Q⊥| (slope beyond 3σ): linear phason strain');
  if (notes.length === 0) notes.push('no significant trend of shift or width with |Q⊥| (within 3σ)');
  const finalScore = sol.score;
  if (finalScore < 0.5) warnings.push(`weak indexing (score ${finalScore.toFixed(2)} of 1): the pattern may not be icosahedral ${o.lattice}, or the aR range is wrong`);
  report?.(1);
  return {
    aR,
    aRSigma: sigmaA,
    zeroShift: zero,
    zeroShiftSigma: sigmaZ,
    lattice: o.lattice,
    wavelength: lambda,
    peaks: out,
    indexed: idx.length,
    rmsResidual: rms,
    score: finalScore,
    intensityMisfit: sol.rmsLog,
    phasonStrain: { shift, width, note: notes.join('; ') },
    warnings,
  };
}

/** Ordinary least-squares line y = a + b·x with σ(b) from the scatter. */
function trend(x: number[], y: number[]): LinearTrend | null {
  const n = x.length;
  if (n < 3) return null;
  const mx = x.reduce((s, v) => s + v, 0) / n;
  const my = y.reduce((s, v) => s + v, 0) / n;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    sxx += (x[i] - mx) ** 2;
    sxy += (x[i] - mx) * (y[i] - my);
  }
  if (!(sxx > 0)) return null;
  const b = sxy / sxx;
  const a = my - b * mx;
  let ss = 0;
  for (let i = 0; i < n; i++) ss += (y[i] - a - b * x[i]) ** 2;
  return { slope: b, slopeSigma: Math.sqrt(ss / (n - 2) / sxx), intercept: a, points: n };
}

/** Share of the progress range that peak finding takes in indexIcosahedralPattern (about its share of the time). */
const PEAK_SHARE = 0.5;

/** Find the peaks of a measured 2θ pattern and index them. */
export function indexIcosahedralPattern(twoTheta: Float64Array, intensity: Float64Array, o: IndexOptions): IndexResult & { found: number } {
  const found = findPeaks(twoTheta, intensity, { ...o.peaks, onProgress: progressRange(o.onProgress, 0, PEAK_SHARE) });
  const r = indexPeaks(found, { ...o, onProgress: progressRange(o.onProgress, PEAK_SHARE, 1) });
  return { ...r, found: found.length };
}

