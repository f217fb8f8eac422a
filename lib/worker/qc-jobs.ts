/**
 * The quasicrystal jobs of the workspace's Web Worker (engine.ts): indexing a measured icosahedral pattern
 * (lib/diffraction/quasicrystal/index-icosahedral.ts) and the model's own occupation-domain powder pattern fitted
 * to the measured one (powder.ts, fit.ts). Pure calls into lib/, so they are unit-tested in Node; progress goes
 * to `report` as (stage, fraction) with the fraction rising to 1, at most about one message per 1 %.
 */
import type { MeasuredPattern } from '../formats/measured';
import { toTwoTheta } from '../diffraction/compare';
import { indexIcosahedralPattern, type IndexResult } from '../diffraction/quasicrystal/index-icosahedral';
import { qcPowder } from '../diffraction/quasicrystal/powder';
import { fitLinesToPattern, type PatternFit } from '../diffraction/quasicrystal/fit';
import type { QcModel } from '../diffraction/quasicrystal/structure-factor';

export type Report = (stage: string, fraction?: number) => void;

export interface IndexJob {
  kind: 'qc-index';
  measured: MeasuredPattern;
  /** Å */
  wavelength: number;
  lattice: 'P' | 'F';
}

export interface OverlayJob {
  kind: 'qc-overlay';
  model: QcModel;
  measured: MeasuredPattern;
  /** Å */
  wavelength: number;
  /** Constant peak width (degrees 2θ) of the model's profile. */
  fwhm: number;
}

export type IndexJobResult = IndexResult & { found: number };

export interface OverlayJobResult {
  fit: PatternFit;
  warnings: string[];
  /** The quasilattice constant the pattern was computed with, Å. */
  aR: number;
  /** Lines (icosahedral stars) of the model in the measured range. */
  stars: number;
  /** The measured pattern on the 2θ axis it was fitted on (ascending). */
  x: Float64Array;
  y: Float64Array;
}

/** The measured pattern on an ascending 2θ axis (|Q| and d converted with λ; unreachable points dropped), σ with it. */
export function sortedTwoTheta(m: MeasuredPattern, lambda: number): { x: Float64Array; y: Float64Array; sigma?: Float64Array } {
  const tt = toTwoTheta(m, lambda);
  const order = Array.from(tt.keys())
    .filter((i) => Number.isFinite(tt[i]))
    .sort((a, b) => tt[a] - tt[b]);
  const x = Float64Array.from(order, (i) => tt[i]);
  for (let k = 1; k < x.length; k++) if (!(x[k] > x[k - 1])) throw new Error(`measured: two points at 2θ = ${x[k].toFixed(4)}°; the 2θ values must all differ`);
  return {
    x,
    y: Float64Array.from(order, (i) => m.intensity[i]),
    sigma: m.sigma ? Float64Array.from(order, (i) => m.sigma![i]) : undefined,
  };
}

/** (stage, fraction) reports from a lib fraction, named by where it stands, sent when it rose by 1 % or the stage changed. */
export function staged(report: Report, stages: [upTo: number, name: string][]): (fraction: number) => void {
  let last = -1;
  let lastStage = '';
  return (f) => {
    const stage = (stages.find(([upTo]) => f <= upTo) ?? stages[stages.length - 1])[1];
    if (f - last >= 0.01 || stage !== lastStage || f === 1) {
      last = f;
      lastStage = stage;
      report(stage, f);
    }
  };
}

export function indexJob(job: Omit<IndexJob, 'kind'>, report: Report = () => {}): IndexJobResult {
  if (!(job.wavelength > 0) || !Number.isFinite(job.wavelength)) throw new Error(`wavelength: must be a positive length in Å, got ${job.wavelength}`);
  const { x, y } = sortedTwoTheta(job.measured, job.wavelength);
  const onProgress = staged(report, [
    [0.5, 'finding peaks'],
    [1, 'indexing'],
  ]);
  return indexIcosahedralPattern(x, y, { wavelength: job.wavelength, lattice: job.lattice, onProgress });
}

/** Share of the overlay's progress taken by the model's reflections (the fit takes the rest; measured shares). */
const OVERLAY_PATTERN_SHARE = 0.45;

export function overlayJob(job: Omit<OverlayJob, 'kind'>, report: Report = () => {}): OverlayJobResult {
  if (!(job.wavelength > 0) || !Number.isFinite(job.wavelength)) throw new Error(`wavelength: must be a positive length in Å, got ${job.wavelength}`);
  if (!(job.fwhm > 0) || !Number.isFinite(job.fwhm)) throw new Error(`fwhm: the peak width must be positive, got ${job.fwhm}`);
  const { x, y, sigma } = sortedTwoTheta(job.measured, job.wavelength);
  if (x.length < 10) throw new Error(`measured: ${x.length} points on the 2θ axis; need at least 10 to fit`);
  // Checked before the (seconds-long) pattern, with the fit's own words (fit.ts).
  sigma?.forEach((v, i) => {
    if (!(v > 0)) throw new Error(`sigma: point ${i + 1} has σ = ${v}; every σ must be positive`);
  });
  const progress = staged(report, [
    [OVERLAY_PATTERN_SHARE, 'the model’s reflections'],
    [1, 'fitting scale, zero shift and background'],
  ]);
  const shape = { U: 0, V: 0, W: job.fwhm * job.fwhm, eta: 0.5 };
  const p = qcPowder(job.model, {
    wavelength: job.wavelength,
    twoThetaMin: Math.max(1, x[0] - 1),
    twoThetaMax: Math.min(179, x[x.length - 1] + 1),
    onProgress: (f) => progress(OVERLAY_PATTERN_SHARE * f),
  });
  const lines = p.stars.map((s) => ({ twoTheta: s.twoTheta, intensity: s.intensity }));
  const fit = fitLinesToPattern(x, y, lines, shape, { sigma, onProgress: (f) => progress(OVERLAY_PATTERN_SHARE + (1 - OVERLAY_PATTERN_SHARE) * f) });
  const warnings = [...p.warnings, ...fit.warnings];
  // The same test as the periodic fit (lib/diffraction/fit/refine.ts): a fit far outside the noise is said so.
  if (fit.rwp > 2 * fit.rexp) {
    warnings.push(
      `fit: R_wp = ${(fit.rwp * 100).toFixed(2)} % is more than twice R_exp = ${(fit.rexp * 100).toFixed(2)} %; the model’s pattern does not describe the measured one within its noise (only scale, zero shift and background are fitted, not the decoration or B factors), and the σ understate the error`,
    );
  }
  return { fit, warnings, aR: job.model.aR, stars: p.stars.length, x, y };
}
