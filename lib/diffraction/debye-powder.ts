/**
 * Powder profile of a finite patch or cluster from the Debye equation, on a 2θ grid.
 * I(2θ) = P(2θ) · I_Debye(Q(2θ)) / N with the polarization factor P only: the Debye sum is already the
 * orientation average of a free cluster, so no Lorentz factor applies (Warren, X-ray Diffraction, §6.3).
 * I_Debye is evaluated on a uniform Q grid twice as fine as the 2θ grid (fast recurrence) and
 * interpolated linearly.
 */
import type { Structure } from '../structure/types';
import { formFactorRangeWarning, neutronAbsorptionWarning, type Radiation } from './form-factors';
import { debyeFromHistogram, pairHistogram, type PairHistogram } from './debye';
import { polarization, qOfTwoTheta } from './lorentz-polarization';

export interface DebyePowderOptions {
  wavelength: number;
  radiation: Radiation;
  twoThetaMin: number;
  twoThetaMax: number;
  step: number;
  monochromator2Theta?: number;
  binWidth?: number;
  /** Reuse a histogram computed elsewhere (e.g. by worker threads). */
  histogram?: PairHistogram;
}

export interface DebyePowderResult {
  twoTheta: Float64Array;
  q: Float64Array;
  /** Per atom, polarization applied, in (form-factor unit)². */
  intensity: Float64Array;
  /** Local maxima of the profile (2θ, intensity scaled so the largest = 100). */
  maxima: { twoTheta: number; q: number; d: number; intensity: number }[];
  /** Form factors beyond their fit range; strong neutron absorbers (real parts of b only on this route). */
  warnings: string[];
}

export function debyePowder(s: Structure, o: DebyePowderOptions): DebyePowderResult {
  if (!(o.step > 0)) throw new Error(`step: must be positive, got ${o.step}`);
  if (!(o.twoThetaMax > o.twoThetaMin && o.twoThetaMin >= 0 && o.twoThetaMax <= 180)) {
    throw new Error(`range: need 0 ≤ start < end ≤ 180 degrees, got ${o.twoThetaMin}:${o.twoThetaMax}`);
  }
  const n = Math.floor((o.twoThetaMax - o.twoThetaMin) / o.step + 1e-9) + 1;
  const tt = Float64Array.from({ length: n }, (_, i) => o.twoThetaMin + i * o.step);
  const q = Float64Array.from(tt, (t) => qOfTwoTheta(t, o.wavelength));
  const ph = o.histogram ?? pairHistogram(s, o.binWidth ?? 0.005);
  const m = 2 * n;
  const q0 = q[0];
  const dq = (q[n - 1] - q0) / (m - 1);
  const qu = Float64Array.from({ length: m }, (_, k) => q0 + k * dq);
  const iu = debyeFromHistogram(ph, qu, o.radiation);
  const out = new Float64Array(n);
  const atoms = Math.max(1, ph.atoms);
  for (let i = 0; i < n; i++) {
    const x = (q[i] - q0) / dq;
    const k = Math.min(m - 2, Math.max(0, Math.floor(x)));
    const t = x - k;
    out[i] = (((1 - t) * iu[k] + t * iu[k + 1]) / atoms) * polarization(tt[i], o.radiation, o.monochromator2Theta);
  }
  const maxima: DebyePowderResult['maxima'] = [];
  let top = 0;
  for (let i = 1; i < n - 1; i++) {
    if (out[i] > out[i - 1] && out[i] >= out[i + 1]) {
      maxima.push({ twoTheta: tt[i], q: q[i], d: (2 * Math.PI) / q[i], intensity: out[i] });
      top = Math.max(top, out[i]);
    }
  }
  for (const p of maxima) p.intensity = (100 * p.intensity) / (top || 1);
  const warnings: string[] = [];
  const range = formFactorRangeWarning(o.radiation, q[n - 1] / (4 * Math.PI));
  if (range) warnings.push(range);
  if (o.radiation === 'neutron') {
    const zs = ph.groups.flatMap((g) => g.parts.map(([z]) => z));
    const abs = neutronAbsorptionWarning(zs);
    if (abs) warnings.push(`${abs}; this finite-patch route uses the real parts b′ only`);
  }
  return { twoTheta: tt, q, intensity: out, maxima: maxima.filter((p) => p.intensity >= 1), warnings };
}
