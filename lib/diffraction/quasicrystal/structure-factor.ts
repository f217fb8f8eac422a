/**
 * Bragg amplitudes of a decorated icosahedral occupation-domain model, per cut point:
 *
 *   F(H)/N = Σ_k Σ_c (V_k/V) · g_k(Q∥) · e^{2πi h·(s_k + c)} · e^{−iQ⊥·o} · A_k(Q⊥) · T(Q∥, Q⊥),
 *   T = exp(−B∥ |Q∥|²/16π² − B⊥ |Q⊥|²/16π²)   (s = |Q|/4π = sinθ/λ for the parallel part),
 *
 * over the site classes k (6D position s_k in the hyperlattice cell, occupation domain W_k of volume V_k,
 * V = Σ over classes and cosets), the cosets c of the hyperlattice (I: 0 and ½(1,…,1); P, F: 0), with
 * H = Σ h_i E*_i (hyperlattice.ts item 4: Q∥ = Σ h_i e*_i∥, Q⊥ = Σ h_i e*_i⊥), o the phason offset (the
 * shift of every window in perpendicular space, as the generators apply it) and A_k the normalised window
 * transform (domain-transform.ts). g_k is the class's scatterer: occupancy × Σ_z x_z f_z(|Q∥|) (mixed sites
 * scatter with the composition-averaged factor, the Bragg part of a random mixture), plus, for a class that
 * carries a cluster, Σ_j occ_j f_j e^{iQ∥·r_j} over the cluster's atoms at r_j about the site.
 *
 * Where it comes from: the cut-and-project structure factor with atomic surfaces — Yamamoto, Acta Cryst. A52
 * (1996) 509, §3–4 (the structure factor of a quasicrystal as a sum over occupation domains with their
 * Fourier transforms, and the perpendicular-space (phason) Debye–Waller factor exp(−B⊥ s⊥²) as the
 * analogue of the thermal one); Janot, Quasicrystals: A Primer (2nd ed., 1994), ch. 5; both cited from memory.
 * Derivation in one line: a point x = π∥(n + s) has Q∥·x = 2π h·(n + s) − Q⊥·π⊥(n + s); h·n is an integer and
 * π⊥(n + s) runs uniformly over W + o (Weyl), so the average of e^{iQ∥·x} over the class is
 * e^{2πi h·s} e^{−iQ⊥·o} A(Q⊥) (Baake & Grimm, Aperiodic Order vol. 1, 2013, ch. 9, for the uniform distribution).
 * Clusters are modelled as placed; atoms that the decoration's merge tolerance would merge are not merged here
 * (a warning says so).
 */
import type { DecorationParams } from '../../models/icosahedral/decoration-schema';
import { sitePosition, resolveClasses } from '../../models/icosahedral/decorate';
import { CLUSTER_PRESETS, clusterAtoms, type ClusterTemplate } from '../../models/icosahedral/clusters';
import { atomicNumber } from '../../structure/elements';
import { hyperlatticeCosets, reciprocalBasis, type HyperlatticeType } from '../../models/icosahedral/hyperlattice';
import { scatteringFactor, type Radiation } from '../form-factors';
import { csgFromHyper } from '../indexing';
import { domainTransform, type DomainTransform } from './domain-transform';
import { StarIndex } from './star';
import type { OnProgress } from './progress';

export interface QcModel {
  aR: number;
  lattice?: HyperlatticeType;
  /** Phason offset (Å, perpendicular space), as in the icosahedral Params. */
  offset?: ArrayLike<number>;
  decoration?: DecorationParams;
  /** Element on the plain vertices when there is no decoration (default X, f = 1). */
  species?: string;
}

export interface QcOptions {
  radiation?: Radiation;
  /** Thermal B∥ in Å² (isotropic). */
  bPar?: number;
  /** Phason B⊥ in Å² (perpendicular space). */
  bPerp?: number;
}

interface PreparedClass {
  name: string;
  weight: number;
  shifts: Float64Array[];
  domain: DomainTransform;
  parts: [number, number][];
  occupancy: number;
  cluster?: { positions: Float64Array; parts: [number, number][][]; occ: Float64Array };
}

export interface PreparedQc {
  aR: number;
  lattice: HyperlatticeType;
  offset: Float64Array;
  classes: PreparedClass[];
  radiation: Radiation;
  bPar: number;
  bPerp: number;
  rb: ReturnType<typeof reciprocalBasis>;
  warnings: string[];
}

function templateOf(c: NonNullable<DecorationParams['clusters']>[number]): ClusterTemplate {
  if (c.preset) return CLUSTER_PRESETS[c.preset];
  return {
    name: 'cluster',
    reference: 'user-defined shells',
    shells: c.shells!.map((sh, k) => ({ name: sh.name ?? `shell ${k + 1}`, polyhedron: sh.polyhedron, radius: sh.radius, species: atomicNumber(sh.species) })),
  };
}

/** Resolve the model into classes with weights, shifts, domains and scatterers (validated numbers). */
export function prepareQc(model: QcModel, o: QcOptions = {}): PreparedQc {
  const aR = model.aR;
  if (!(aR > 0) || !Number.isFinite(aR)) throw new Error(`aR: must be a positive length in Å, got ${aR}`);
  const lattice = model.lattice ?? 'P';
  if (lattice !== 'P' && lattice !== 'F' && lattice !== 'I') throw new Error(`lattice: must be P, F or I, got "${String(lattice)}"`);
  const bPar = o.bPar ?? 0;
  const bPerp = o.bPerp ?? 0;
  if (!(bPar >= 0) || !Number.isFinite(bPar)) throw new Error(`bPar: thermal B must be a finite number ≥ 0 Å², got ${bPar}`);
  if (!(bPerp >= 0) || !Number.isFinite(bPerp)) throw new Error(`bPerp: phason B must be a finite number ≥ 0 Å², got ${bPerp}`);
  const offset = Float64Array.from(model.offset ?? [0, 0, 0]);
  const warnings: string[] = [];
  const cut = resolveClasses(model.decoration, model.species);
  const cosets = hyperlatticeCosets(lattice);
  const classes: PreparedClass[] = cut.map((cl, k) => {
    const domain = domainTransform(cl.window, aR);
    const pos = model.decoration ? sitePosition(model.decoration.classes[k].position) : new Float64Array(6);
    const shifts = cosets.map((c) => Float64Array.from(pos, (v, i) => v + c[i]));
    const parts: [number, number][] = cl.mix ? Object.entries(cl.mix).map(([z, x]) => [Number(z), x]) : [[cl.species, 1]];
    return { name: cl.name, weight: domain.volume * cosets.length, shifts, domain, parts, occupancy: cl.occupancy ?? 1 };
  });
  for (const c of model.decoration?.clusters ?? []) {
    const k = classes.findIndex((cl) => cl.name === c.at);
    if (k < 0) throw new Error(`clusters: no site class is named "${c.at}"`);
    const t = templateOf(c);
    const atoms = clusterAtoms(t);
    const n = atoms.species.length;
    const partsOf: [number, number][][] = [];
    const occ = new Float64Array(n);
    for (let j = 0; j < n; j++) {
      const src = atoms.shell[j] < 0 ? t.centre! : t.shells[atoms.shell[j]];
      partsOf.push(src.mix ? Object.entries(src.mix).map(([z, x]) => [Number(z), x]) : [[atoms.species[j], 1]]);
      occ[j] = src.occupancy ?? 1;
    }
    const prev = classes[k].cluster;
    classes[k].cluster = prev
      ? { positions: Float64Array.from([...prev.positions, ...atoms.positions]), parts: [...prev.parts, ...partsOf], occ: Float64Array.from([...prev.occ, ...occ]) }
      : { positions: atoms.positions, parts: partsOf, occ };
  }
  if (model.decoration?.clusters?.length && model.decoration.mergeTolerance > 0) {
    warnings.push(`clusters: atoms closer than the merge tolerance (${model.decoration.mergeTolerance} Å) are not merged in the occupation-domain amplitudes; overlapping cluster atoms are counted twice`);
  }
  const total = classes.reduce((s, c) => s + c.weight, 0);
  for (const c of classes) c.weight /= total;
  return { aR, lattice, offset, classes, radiation: o.radiation ?? 'xray', bPar, bPerp, rb: reciprocalBasis(aR), warnings };
}

function mixFactor(parts: [number, number][], radiation: Radiation, s2: number): number {
  let f = 0;
  for (const [z, x] of parts) f += x * scatteringFactor(radiation, z, s2);
  return f;
}

/** Q∥ and Q⊥ (Å⁻¹, Cartesian) of the module point h. */
export function moduleVectors(p: Pick<PreparedQc, 'rb'>, h: ArrayLike<number>): { qPar: Float64Array; qPerp: Float64Array } {
  const qPar = new Float64Array(3);
  const qPerp = new Float64Array(3);
  for (let j = 0; j < 6; j++) {
    for (let c = 0; c < 3; c++) {
      qPar[c] += h[j] * p.rb.par[3 * j + c];
      qPerp[c] += h[j] * p.rb.perp[3 * j + c];
    }
  }
  return { qPar, qPerp };
}

/**
 * F(H)/N as [re, im] for one module point h (with its Q vectors, when already known). `domains`, when given,
 * holds A_k(Q⊥) per class already computed (the windows are icosahedrally symmetric about their centres, so
 * A_k is the same over a star).
 */
export function qcAmplitude(p: PreparedQc, h: ArrayLike<number>, vec = moduleVectors(p, h), domains?: ArrayLike<number>): [number, number] {
  const { qPar, qPerp } = vec;
  const qp2 = qPar[0] ** 2 + qPar[1] ** 2 + qPar[2] ** 2;
  const qq2 = qPerp[0] ** 2 + qPerp[1] ** 2 + qPerp[2] ** 2;
  const s2 = qp2 / (16 * Math.PI * Math.PI);
  const t = Math.exp(-p.bPar * s2 - (p.bPerp * qq2) / (16 * Math.PI * Math.PI));
  const po = -(qPerp[0] * p.offset[0] + qPerp[1] * p.offset[1] + qPerp[2] * p.offset[2]);
  let re = 0;
  let im = 0;
  for (let k = 0; k < p.classes.length; k++) {
    const c = p.classes[k];
    const a = domains ? domains[k] : c.domain.at(qPerp);
    if (a === 0) continue;
    let gr = c.occupancy * mixFactor(c.parts, p.radiation, s2);
    let gi = 0;
    if (c.cluster) {
      const { positions, parts, occ } = c.cluster;
      for (let j = 0; j < occ.length; j++) {
        const ph = qPar[0] * positions[3 * j] + qPar[1] * positions[3 * j + 1] + qPar[2] * positions[3 * j + 2];
        const f = occ[j] * mixFactor(parts[j], p.radiation, s2);
        gr += f * Math.cos(ph);
        gi += f * Math.sin(ph);
      }
    }
    let sr = 0;
    let si = 0;
    for (const s of c.shifts) {
      let hs = 0;
      for (let i = 0; i < 6; i++) hs += h[i] * s[i];
      const ph = 2 * Math.PI * hs + po;
      sr += Math.cos(ph);
      si += Math.sin(ph);
    }
    sr /= c.shifts.length;
    si /= c.shifts.length;
    const w = c.weight * a;
    re += w * (gr * sr - gi * si);
    im += w * (gr * si + gi * sr);
  }
  return [re * t, im * t];
}

export interface QcReflection {
  /** Star id within this run, its size (orbit under m-3-5) and representative. */
  star: number;
  starSize: number;
  starIndices: number[];
  indices: number[];
  qPar: number[];
  qParNorm: number;
  qPerp: number[];
  qPerpNorm: number;
  re: number;
  im: number;
  /** |F/N|². */
  intensity: number;
  N: number;
  M: number;
  label: string;
}

export interface ModuleWalk {
  qmax: number;
  /** Largest |Q⊥| kept (Å⁻¹); default 12/aR. */
  qperpMax?: number;
  /**
   * Progress of the walk (progress.ts): the share of the 6-ball's volume walked, counted in slabs of the first
   * two indices (a slab with |h_{3…6}|² ≤ L holds about L² points, the volume of a 4-ball ∝ radius⁴).
   */
  onProgress?: OnProgress;
}

const MAX_VISITS = 4e7;

/**
 * Every allowed h of the reciprocal hyperlattice (P: Z⁶; F: Z⁶ ∪ Z⁶ + ½(1,…,1); I: Σh even) with
 * |Q∥| ≤ qmax and |Q⊥| ≤ qperpMax, walked coset by coset over the 6-ball |h|² ≤ (qmax² + qperpMax²)/(2(π/aR)²)
 * (|E*_i|² = 2(π/aR)², orthogonal basis — hyperlattice.ts item 2).
 */
export function forEachModulePoint(aR: number, lattice: HyperlatticeType, w: ModuleWalk, visit: (h: Float64Array, qPar: Float64Array, qPerp: Float64Array) => void): void {
  if (!(w.qmax > 0) || !Number.isFinite(w.qmax)) throw new Error(`qmax: must be positive (Å⁻¹), got ${w.qmax}`);
  const qperpMax = w.qperpMax ?? 12 / aR;
  if (!(qperpMax > 0) || !Number.isFinite(qperpMax)) throw new Error(`qperpMax: must be positive (Å⁻¹), got ${qperpMax}`);
  const unit = Math.PI / aR;
  const r2 = (w.qmax ** 2 + qperpMax ** 2) / (2 * unit * unit);
  const cosets = lattice === 'F' ? [0, 0.5] : [0];
  const visits = ((Math.PI ** 3) / 6) * r2 ** 3 * cosets.length;
  if (visits > MAX_VISITS) {
    throw new Error(`qmax: about ${visits.toExponential(1)} module points to visit; lower qmax (a shorter 2θ range or a longer wavelength) or qperpMax`);
  }
  const rb = reciprocalBasis(aR);
  const h = new Float64Array(6);
  const qPar = new Float64Array(3);
  const qPerp = new Float64Array(3);
  const qm2 = w.qmax * w.qmax * (1 + 1e-12);
  const qq2max = qperpMax * qperpMax;
  // The walk's bounds for one index, given what is left of r² (as in rec below).
  const range = (left: number, c: number): [number, number] => {
    const m = Math.sqrt(Math.max(left, 0)) + 1e-9;
    return [Math.ceil(-m - c), Math.floor(m - c)];
  };
  // Progress: the same first two loops as the walk, weighted by the points each slab holds.
  const report = w.onProgress;
  let total = 0;
  let done = 0;
  if (report) {
    for (const c of cosets) {
      const [lo0, hi0] = range(r2, c);
      for (let v0 = lo0; v0 <= hi0; v0++) {
        const left1 = r2 - (v0 + c) ** 2;
        const [lo1, hi1] = range(left1, c);
        for (let v1 = lo1; v1 <= hi1; v1++) total += Math.max(left1 - (v1 + c) ** 2, 0) ** 2;
      }
    }
  }
  for (const c of cosets) {
    const rec = (i: number, left: number) => {
      if (i === 6) {
        if (lattice === 'I') {
          let s = 0;
          for (let j = 0; j < 6; j++) s += h[j];
          if (s % 2 !== 0) return;
        }
        qPar.fill(0);
        qPerp.fill(0);
        for (let j = 0; j < 6; j++) {
          const v = h[j];
          if (v === 0) continue;
          qPar[0] += v * rb.par[3 * j];
          qPar[1] += v * rb.par[3 * j + 1];
          qPar[2] += v * rb.par[3 * j + 2];
          qPerp[0] += v * rb.perp[3 * j];
          qPerp[1] += v * rb.perp[3 * j + 1];
          qPerp[2] += v * rb.perp[3 * j + 2];
        }
        if (qPar[0] ** 2 + qPar[1] ** 2 + qPar[2] ** 2 > qm2) return;
        if (qPerp[0] ** 2 + qPerp[1] ** 2 + qPerp[2] ** 2 > qq2max) return;
        visit(h, qPar, qPerp);
        return;
      }
      const m = Math.sqrt(Math.max(left, 0)) + 1e-9;
      const lo = Math.ceil(-m - c);
      const hi = Math.floor(m - c);
      for (let v = lo; v <= hi; v++) {
        const x = v + c;
        h[i] = x;
        rec(i + 1, left - x * x);
        if (i === 1 && report && total > 0) {
          done += Math.max(left - x * x, 0) ** 2;
          report(Math.min(1, done / total));
        }
      }
      h[i] = 0;
    };
    rec(0, r2);
  }
  report?.(1);
}

/** All reflections of the decorated model with |Q∥| ≤ qmax, |Q⊥| ≤ qperpMax and |F/N|² ≥ threshold·|F(0)/N|². */
export function qcReflections(model: QcModel, o: QcOptions & ModuleWalk & { threshold?: number }): { reflections: QcReflection[]; warnings: string[]; f0: number } {
  const p = prepareQc(model, o);
  const [f0r, f0i] = qcAmplitude(p, [0, 0, 0, 0, 0, 0]);
  const f0 = Math.hypot(f0r, f0i);
  const thr = (o.threshold ?? 1e-5) * f0 * f0;
  const out: QcReflection[] = [];
  const stars = new StarIndex();
  const domains: Float64Array[] = [];
  forEachModulePoint(p.aR, p.lattice, o, (h, qPar, qPerp) => {
    const { id, fresh } = stars.idOf(h);
    if (fresh) domains[id] = Float64Array.from(p.classes, (c) => c.domain.at(qPerp));
    const [re, im] = qcAmplitude(p, h, { qPar, qPerp }, domains[id]);
    const intensity = re * re + im * im;
    if (intensity < thr) return;
    const csg = csgFromHyper(h);
    out.push({
      star: id,
      starSize: stars.sizes[id],
      starIndices: stars.reps[id],
      indices: Array.from(h, (v) => v + 0),
      qPar: Array.from(qPar),
      qParNorm: Math.hypot(qPar[0], qPar[1], qPar[2]),
      qPerp: Array.from(qPerp),
      qPerpNorm: Math.hypot(qPerp[0], qPerp[1], qPerp[2]),
      re,
      im,
      intensity,
      N: csg.N,
      M: csg.M,
      label: csg.label,
    });
  });
  out.sort((a, b) => a.qParNorm - b.qParNorm || b.intensity - a.intensity);
  if (f0 === 0) p.warnings.push('F(0) = 0: the model has no scattering weight (every class empty or vacant)');
  return { reflections: out, warnings: p.warnings, f0 };
}
