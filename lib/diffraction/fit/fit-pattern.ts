/**
 * Fit a model's powder lines to a measured pattern (refine.ts) and describe the result: the measured
 * points on 2θ, calculated and background curves, the residual y_o − y_c, R factors before and after
 * (agreement.ts, with the file's σ as weights when it has them), fitted parameters with standard
 * uncertainties, and the measured peaks labelled by the line that contributes most (labels.ts).
 */
import type { MeasuredPattern } from '../../formats/measured';
import type { Radiation } from '../form-factors';
import type { PowderPeak } from '../powder';
import { findPeaks, toTwoTheta, type CompareResult } from '../compare';
import { powderWeights } from './agreement';
import { labelPeaks, type PeakLabel } from './labels';
import { refinePowder, type RefineResult } from './refine';
import type { FitLine } from './model';

export interface FitPatternOptions {
  wavelength: number;
  radiation: Radiation;
  monochromator2Theta?: number;
  wavelength2?: number;
  ratio2?: number;
  profile: { U: number; V: number; W: number; eta: number };
  nBackground?: number;
  refineLattice?: boolean;
  refineWidths?: boolean;
  zeroSearch?: number;
  peakThreshold?: number;
}

export interface FitPatternResult extends Omit<RefineResult, 'model'> {
  twoTheta: Float64Array;
  observed: Float64Array;
  residual: Float64Array;
  weights: 'sigma' | 'counts';
  peaks: PeakLabel[];
}

/** Powder lines of a periodic model as fit input: strength Σ m|F|² of each line. */
export function fitLinesFromPeaks(peaks: readonly PowderPeak[]): FitLine[] {
  return peaks.map((p) => ({ d: p.d, strength: p.multiplicity * p.f2, hkl: p.hkl }));
}

export function fitPattern(measured: MeasuredPattern, lines: FitLine[], o: FitPatternOptions): FitPatternResult {
  if (lines.length === 0) throw new Error('model: no reflections to fit');
  const tt = toTwoTheta(measured, o.wavelength);
  const idx = Array.from(tt.keys())
    .filter((i) => Number.isFinite(tt[i]))
    .sort((a, b) => tt[a] - tt[b]);
  if (idx.length < 10) throw new Error(`range: only ${idx.length} measured points are usable; need at least 10`);
  const x = Float64Array.from(idx, (i) => tt[i]);
  const yo = Float64Array.from(idx, (i) => measured.intensity[i]);
  const sigma = measured.sigma ? Float64Array.from(idx, (i) => measured.sigma![i]) : undefined;
  const { w, source, warnings } = powderWeights(yo, sigma);
  const r = refinePowder(
    { x, lines, wavelength: o.wavelength, radiation: o.radiation, monochromator2Theta: o.monochromator2Theta, wavelength2: o.wavelength2, ratio2: o.ratio2, eta: o.profile.eta },
    yo,
    w,
    { ...o.profile, nBackground: o.nBackground, refineLattice: o.refineLattice, refineWidths: o.refineWidths, zeroSearch: o.zeroSearch },
  );
  const residual = Float64Array.from(yo, (v, i) => v - r.calculated[i]);
  const calcLines = r.model.linePositions(r.params).map((l) => ({ twoTheta: l.twoTheta, area: l.area, fwhm: l.fwhm, d: l.line.d * r.params.lattice, hkl: l.line.hkl }));
  // Peaks on the background-subtracted pattern so a sloping background does not hide them.
  const net = Float64Array.from(yo, (v, i) => v - r.background[i]);
  const found = findPeaks(x, net, o.peakThreshold ?? 0.02).map((p) => ({ x: p.x, y: yo[x.indexOf(p.x)] }));
  const peaks = labelPeaks(found, calcLines, o.profile.eta);
  const { model: _m, ...rest } = r;
  return { ...rest, warnings: [...warnings, ...r.warnings], twoTheta: x, observed: yo, residual, weights: source, peaks };
}

/** A fit result in the shape of a plain comparison (compare.ts), for plots and tables that show either. */
export function fitToComparison(f: FitPatternResult): CompareResult {
  return {
    scale: f.params.scale,
    background: 0,
    rp: f.final.rp,
    rwp: f.final.rwp,
    rexp: f.final.rexp,
    chi2: f.final.chi2,
    weights: f.weights,
    warnings: f.warnings,
    points: f.final.points,
    twoTheta: f.twoTheta,
    observed: f.observed,
    calculated: f.calculated,
    peaks: f.peaks.map((p) => ({
      twoTheta: p.twoTheta,
      intensity: p.intensity,
      nearest: p.line ? { twoTheta: p.line.twoTheta, d: p.line.d, hkl: p.line.hkl, intensity: p.line.area } : null,
      misfit: p.misfit,
      withinWidth: p.withinWidth,
    })),
    fit: { parameters: f.parameters, initialRwp: f.initial.rwp, iterations: f.iterations },
  };
}
