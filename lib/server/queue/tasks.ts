/**
 * The heavy part of every job, run inside a worker thread (thread.ts) with a time and memory limit.
 * Only pure lib/ calls here: generate, write, powder pattern, comparison, file readers.
 */
import { generate } from '../../models';
import { runJob } from '../../worker/engine';
import { comparePatterns } from '../../diffraction/compare';
import { indexIcosahedralPattern } from '../../diffraction/quasicrystal/index-icosahedral';
import { readMeasured, type MeasuredPattern } from '../../formats/measured';
import { renderExport } from '../export-worker';
import { parseUpload } from '../datasets';
import { NEED_MEASURED, type IndexJob, type PowderSettings } from './kinds';

export type Progress = (fraction: number, stage: string) => void;

export interface TaskInput {
  export: { params: unknown; format: string };
  diffraction: { params: unknown; settings: PowderSettings };
  parse: { text: string; filename: string; kind: 'auto' | 'pattern' | 'structure' };
  index: { text: string; settings: Omit<IndexJob, 'kind' | 'dataset'> };
  /** `measured` is sent once per thread and dataset; later points name only the dataset (see measuredOf). */
  point: { params: unknown; dataset: number; measured?: string; settings: PowderSettings };
}

/**
 * Parsed measured patterns of this thread, by dataset id (a stored dataset never changes). A sweep's points
 * all compare with one pattern: reading ~5 000 lines again per point cost ~20 ms, 10 % of a 2/1 point.
 */
const measuredCache = new Map<number, MeasuredPattern>();

function measuredOf(dataset: number, text: string | undefined): MeasuredPattern {
  let m = measuredCache.get(dataset);
  if (!m) {
    if (text === undefined) throw Object.assign(new Error('The task thread needs the measured pattern.'), { name: 'ApiError', code: NEED_MEASURED });
    m = readMeasured(text);
    if (measuredCache.size >= 8) measuredCache.clear();
    measuredCache.set(dataset, m);
  }
  return m;
}

function powder(params: unknown, settings: PowderSettings, progress: Progress) {
  progress(0.1, 'cutting');
  const structure = generate(params);
  progress(0.5, 'powder pattern');
  const curve = runJob({ kind: 'powder', structure, ...settings });
  return { atoms: structure.species.length, curve };
}

export const TASKS = {
  export(input: TaskInput['export'], progress: Progress): { bytes: Uint8Array } {
    progress(0.1, 'cutting and writing');
    return { bytes: new TextEncoder().encode(renderExport(input.params, input.format)) };
  },

  diffraction(input: TaskInput['diffraction'], progress: Progress) {
    const { atoms, curve } = powder(input.params, input.settings, progress);
    const peaks = [...curve.peaks].sort((a, b) => b.intensity - a.intensity).slice(0, 500).sort((a, b) => a.twoTheta - b.twoTheta);
    return { atoms, wavelength: curve.wavelength, twoTheta: Array.from(curve.twoTheta), intensity: Array.from(curve.intensity), peaks };
  },

  parse(input: TaskInput['parse'], progress: Progress) {
    progress(0.1, 'reading the file');
    return parseUpload(input.text, input.filename, input.kind);
  },

  /**
   * Index a measured icosahedral pattern: peaks, six indices and N, M per peak, aR ± σ and the zero shift by
   * least squares (the indexer behind `diffract index`). A Q or d axis is turned into 2θ at the job's wavelength.
   */
  index(input: TaskInput['index'], progress: Progress) {
    progress(0.1, 'reading the pattern');
    const o = input.settings;
    const m = readMeasured(input.text);
    const lambda = o.wavelength;
    const tt = Float64Array.from(m.x, (x, i) => {
      const v = m.axis === '2theta' ? x : m.axis === 'q' ? (360 / Math.PI) * Math.asin((x * lambda) / (4 * Math.PI)) : (360 / Math.PI) * Math.asin(lambda / (2 * x));
      if (!Number.isFinite(v)) throw new Error(`Point ${i + 1} of the pattern (${x}) is out of reach for λ = ${lambda} Å.`);
      return v;
    });
    const order = Array.from(tt.keys()).sort((a, b) => tt[a] - tt[b]);
    progress(0.3, 'finding and indexing peaks');
    const r = indexIcosahedralPattern(Float64Array.from(order, (i) => tt[i]), Float64Array.from(order, (i) => m.intensity[i]), {
      wavelength: lambda,
      lattice: o.lattice,
      radiation: o.radiation,
      aRGuess: o.aR,
      aRMin: o.aRMin,
      aRMax: o.aRMax,
      peaks: o.prominence !== undefined ? { minProminence: o.prominence } : undefined,
    });
    return {
      family: 'icosahedral',
      lattice: r.lattice,
      wavelength: r.wavelength,
      axis: m.axis,
      aR: r.aR,
      aRSigma: r.aRSigma,
      zeroShift: r.zeroShift,
      zeroShiftSigma: r.zeroShiftSigma,
      peaksFound: r.found,
      indexed: r.indexed,
      rmsResidual: r.rmsResidual,
      score: r.score,
      intensityMisfit: r.intensityMisfit,
      peaks: r.peaks,
      phasonStrain: r.phasonStrain,
      warnings: r.warnings,
      units: { twoTheta: 'degrees', aR: 'Å', zeroShift: 'degrees 2θ', qPar: 'Å⁻¹ (2π/d)', qPerp: 'Å⁻¹' },
    };
  },

  point(input: TaskInput['point'], progress: Progress) {
    const { atoms, curve } = powder(input.params, input.settings, progress);
    progress(0.9, 'comparing');
    const measured = measuredOf(input.dataset, input.measured);
    const c = comparePatterns(measured, curve, curve.peaks, { wavelength: input.settings.wavelength });
    return { atoms, rwp: c.rwp, rp: c.rp };
  },
};

export type TaskKind = keyof typeof TASKS;
