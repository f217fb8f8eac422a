/**
 * Messages between the workspace and its Web Worker (engine.worker.ts). One request runs at a time per
 * worker ("lane"); cancelling terminates the worker, so a long cut never has to poll for a flag.
 */
import type { MeasuredPattern } from '../formats/measured';
import type { FitLine } from '../diffraction/fit/model';
import type { FitPatternOptions } from '../diffraction/fit/fit-pattern';
import type { CompareResult } from '../diffraction/compare';
import type { Structure } from '../structure/types';
import type { IndexJob, IndexJobResult, OverlayJob, OverlayJobResult } from './qc-jobs';

export interface CutSummary {
  count: number;
  /** Atoms per Å³ over the cell (periodic) or the inner ball (patches). */
  numberDensity?: number;
  massDensity?: number;
  formula?: string;
  composition?: { symbol: string; count: number; fraction: number }[];
  /** Lattice constants a, b, c (Å) when periodic. */
  cellLengths?: [number, number, number];
  /** Site class name → count. */
  perClass?: { name: string; count: number }[];
}

export interface ZoneSpot {
  /** In-plane reciprocal coordinates, Å⁻¹. */
  x: number;
  y: number;
  /** Relative intensity, strongest = 1. */
  intensity: number;
  /** Indices as written for the user, e.g. "2 0 -1" or six-index form. */
  label: string;
  qPar: number;
  qPerp?: number;
}

export interface ZoneResult {
  spots: ZoneSpot[];
  axisLabel: string;
  qmax: number;
}

export interface PowderCurve {
  twoTheta: Float64Array;
  intensity: Float64Array;
  peaks: { twoTheta: number; d: number; hkl: number[] | null; intensity: number }[];
  wavelength: number;
  /** Kα2 line drawn in the profile (periodic cells), with its intensity ratio to the first line. */
  wavelength2?: number;
  ratio2?: number;
  /** Warnings of the run (form-factor range, resolution, neutron absorption). */
  warnings?: string[];
}

export interface SeriesRow {
  p: number;
  q: number;
  /** Cubic lattice constant a(p/q), Å. */
  a: number;
  atoms: number;
  /** atoms/Å³ */
  numberDensity: number;
  massDensity?: number;
  formula: string;
  /** Phason strain s = (qτ − p)/(pτ + q). */
  strain: number;
  /** (ρ(p/q) − ρ_QC)/ρ_QC, the density misfit against the quasicrystal model. */
  densityMisfit?: number;
  /** True when atoms came from a full cut, false when only estimated. */
  exact: boolean;
}

export type JobRequest =
  | { kind: 'generate'; params: unknown }
  | { kind: 'estimate'; params: unknown }
  | { kind: 'zone'; structure: Structure; axis: string; qmax: number; slab: number; radiation: 'xray' | 'neutron' | 'electron' }
  | { kind: 'powder'; structure: Structure; wavelength: number; radiation: 'xray' | 'neutron' | 'electron'; twoThetaMin: number; twoThetaMax: number; step: number; fwhm: number; wavelength2?: number; ratio2?: number; dMin?: number }
  | { kind: 'series'; params: unknown }
  | { kind: 'fit'; measured: MeasuredPattern; lines: FitLine[]; options: FitPatternOptions }
  | IndexJob
  | OverlayJob;

export interface JobResultMap {
  generate: { structure: Structure; summary: CutSummary };
  estimate: { estimate: number };
  zone: ZoneResult;
  powder: PowderCurve;
  series: { rows: SeriesRow[]; quasicrystalDensity?: number };
  fit: CompareResult;
  'qc-index': IndexJobResult;
  'qc-overlay': OverlayJobResult;
}

export type ToWorker = { id: number; job: JobRequest };

export type FromWorker =
  | { id: number; type: 'progress'; stage: string; fraction?: number }
  | { id: number; type: 'done'; result: unknown; ms: number }
  | { id: number; type: 'failed'; message: string; field?: string };

/** Engines throw "field: message"; split it so forms can put the message beside the field. */
export function splitFieldError(message: string): { field?: string; message: string } {
  const m = /^([A-Za-z][\w.[\]]*): (.+)$/s.exec(message);
  return m ? { field: m[1], message } : { message };
}
