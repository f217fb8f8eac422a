/**
 * Powder (orientation-averaged) intensity of a finite cluster by the Debye scattering equation
 * (P. Debye, Ann. Phys. 351 (1915) 809; Warren, X-ray Diffraction, 1969, ch. 6):
 *
 *   I(Q) = Σ_i Σ_j f_i f_j sin(Q r_ij)/(Q r_ij)   averaged over the random occupation of the sites:
 *        = Σ_a ⟨f²⟩_a Σ_{i∈a} w_i  +  2 Σ_{a≤b} g_a g_b Σ_bins h_ab(r) sin(Q r)/(Q r)
 *
 * A site i occupied with probability w_i (occupancy) by species z with fractions x_z scatters on its own
 * w_i Σ_z x_z f_z² = w_i ⟨f²⟩ — not (w_i ⟨f⟩)²; pairs of different sites are independent, so they carry
 * w_i w_j ⟨f⟩_i ⟨f⟩_j (Warren, X-ray Diffraction, 1969, ch. 12: the difference is the Laue monotonic
 * diffuse scattering of vacancies and mixed sites).
 *
 * with the pair histogram h_ab of pair-histogram.ts (bin centres r = (k + ½)Δ). I is in (form-factor
 * unit)² for the whole cluster; divide by N for per-atom values. Q in Å⁻¹ (|Q| = 4π sinθ/λ).
 * On a uniform Q grid sin(Q r) comes from the recurrence e^{i(Q+ΔQ)r} = e^{iQr}·e^{iΔQ r}.
 * Isotropic B damps only the pair terms (g_a g_b carry e^{−(B_a+B_b)s²}); the self terms keep the bare
 * f² because an atom's displacement does not change its distance to itself (Warren §6 — the intensity
 * lost from the pair terms reappears as diffuse background).
 */
import type { Structure } from '../structure/types';
import type { Radiation } from './form-factors';
import { groupAtoms, groupFactor, groupSelfFactor, type ScatteringGroup } from './scatterers';
import { accumulatePairs, histogramSpec, type PairHistogramSpec } from './pair-histogram';

export interface PairHistogram extends PairHistogramSpec {
  hist: Float64Array;
  /** Σ_{i∈a} w_i per group (the i = j terms carry w_i ⟨f²⟩). */
  self: Float64Array;
  groups: ScatteringGroup[];
  atoms: number;
}

export function pairHistogram(s: Structure, binWidth = 0.005): PairHistogram {
  const { groups, groupOf, weight } = groupAtoms(s);
  const spec = histogramSpec(s.positions, groups.length, binWidth);
  const hist = new Float64Array(spec.nGroups * spec.nGroups * spec.nBins);
  accumulatePairs(s.positions, groupOf, weight, spec, hist);
  const self = new Float64Array(groups.length);
  for (let i = 0; i < groupOf.length; i++) self[groupOf[i]] += weight[i];
  return { ...spec, hist, self, groups, atoms: groupOf.length };
}

function isUniform(q: Float64Array): boolean {
  if (q.length < 3) return false;
  const dq = q[1] - q[0];
  for (let i = 2; i < q.length; i++) if (Math.abs(q[i] - q[i - 1] - dq) > 1e-12 * Math.max(1, Math.abs(q[i]))) return false;
  return true;
}

/** Σ_bins h(r) sin(Qr)/(Qr) for one histogram block, at every Q. */
function sincSum(h: Float64Array, off: number, nBins: number, binWidth: number, q: Float64Array, out: Float64Array): void {
  const m = q.length;
  const uniform = isUniform(q);
  const q0 = q[0];
  const dq = uniform ? q[1] - q[0] : 0;
  // Accumulate Σ h sin(Qr)/r, divide by Q at the end (Q = 0 handled as the limit Σ h).
  const acc = new Float64Array(m);
  let total = 0;
  for (let b = 0; b < nBins; b++) {
    const c = h[off + b];
    if (c === 0) continue;
    total += c;
    const r = (b + 0.5) * binWidth;
    const w = c / r;
    if (uniform) {
      let cr = Math.cos(q0 * r);
      let ci = Math.sin(q0 * r);
      const sr = Math.cos(dq * r);
      const si = Math.sin(dq * r);
      for (let k = 0; k < m; k++) {
        acc[k] += w * ci;
        const t = cr * sr - ci * si;
        ci = cr * si + ci * sr;
        cr = t;
        if ((k & 63) === 63) {
          // Re-seed so recurrence rounding never accumulates over more than 64 steps.
          const p = (q0 + (k + 1) * dq) * r;
          cr = Math.cos(p);
          ci = Math.sin(p);
        }
      }
    } else {
      for (let k = 0; k < m; k++) acc[k] += w * Math.sin(q[k] * r);
    }
  }
  for (let k = 0; k < m; k++) out[k] = q[k] === 0 ? total : acc[k] / q[k];
}

/** I(Q) from a pair histogram (whole cluster, including self terms). */
export function debyeFromHistogram(ph: PairHistogram, q: Float64Array, radiation: Radiation = 'xray'): Float64Array {
  const m = q.length;
  const ng = ph.groups.length;
  const out = new Float64Array(m);
  const g = new Float64Array(ng * m);
  const selfF = new Float64Array(ng * m);
  for (let a = 0; a < ng; a++) {
    for (let k = 0; k < m; k++) {
      const s2 = (q[k] / (4 * Math.PI)) ** 2;
      g[a * m + k] = groupFactor(ph.groups[a], radiation, s2);
      selfF[a * m + k] = groupSelfFactor(ph.groups[a], radiation, s2);
    }
  }
  const tmp = new Float64Array(m);
  for (let a = 0; a < ng; a++) {
    for (let k = 0; k < m; k++) out[k] += selfF[a * m + k] * ph.self[a];
    for (let b = a; b < ng; b++) {
      sincSum(ph.hist, (a * ng + b) * ph.nBins, ph.nBins, ph.binWidth, q, tmp);
      for (let k = 0; k < m; k++) out[k] += 2 * g[a * m + k] * g[b * m + k] * tmp[k];
    }
  }
  return out;
}

/** Exact Debye sum over all pairs without binning (O(N² nQ); for small clusters and for checking). */
export function debyeExact(s: Structure, q: Float64Array, radiation: Radiation = 'xray'): Float64Array {
  const { groups, groupOf, weight } = groupAtoms(s);
  const n = groupOf.length;
  const m = q.length;
  const out = new Float64Array(m);
  const g = groups.map((gr) => Float64Array.from(q, (qq) => groupFactor(gr, radiation, (qq / (4 * Math.PI)) ** 2)));
  const selfF = groups.map((gr) => Float64Array.from(q, (qq) => groupSelfFactor(gr, radiation, (qq / (4 * Math.PI)) ** 2)));
  const p = s.positions;
  for (let i = 0; i < n; i++) {
    const gi = g[groupOf[i]];
    const fi = selfF[groupOf[i]];
    for (let k = 0; k < m; k++) out[k] += weight[i] * fi[k];
    for (let j = i + 1; j < n; j++) {
      const r = Math.hypot(p[3 * j] - p[3 * i], p[3 * j + 1] - p[3 * i + 1], p[3 * j + 2] - p[3 * i + 2]);
      const gj = g[groupOf[j]];
      const w = 2 * weight[i] * weight[j];
      for (let k = 0; k < m; k++) {
        const x = q[k] * r;
        out[k] += w * gi[k] * gj[k] * (x === 0 ? 1 : Math.sin(x) / x);
      }
    }
  }
  return out;
}
