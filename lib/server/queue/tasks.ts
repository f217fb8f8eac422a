/**
 * The heavy part of every job, run inside a worker thread (thread.ts) with a time and memory limit.
 * Only pure lib/ calls here: generate, write, powder pattern, comparison, file readers.
 */
import { generate } from '../../models';
import { runJob } from '../../worker/engine';
import { comparePatterns, findPeaks } from '../../diffraction/compare';
import { readMeasured } from '../../formats/measured';
import { renderExport } from '../export-worker';
import { parseUpload } from '../datasets';
import type { PowderSettings } from './kinds';

export type Progress = (fraction: number, stage: string) => void;

export interface TaskInput {
  export: { params: unknown; format: string };
  diffraction: { params: unknown; settings: PowderSettings };
  parse: { text: string; filename: string; kind: 'auto' | 'pattern' | 'structure' };
  index: { text: string };
  point: { params: unknown; measured: string; settings: PowderSettings };
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

  /** Placeholder until the indexer lands (`diffract index`): the measured peak positions, ready to index. */
  index(input: TaskInput['index'], progress: Progress) {
    progress(0.2, 'finding peaks');
    const m = readMeasured(input.text);
    const peaks = findPeaks(m.x, m.intensity, 0.02);
    return { axis: m.axis, peaks, indexed: false, note: 'Peak positions only: indexing arrives with the indexer.' };
  },

  point(input: TaskInput['point'], progress: Progress) {
    const { atoms, curve } = powder(input.params, input.settings, progress);
    progress(0.9, 'comparing');
    const measured = readMeasured(input.measured);
    const c = comparePatterns(measured, curve, curve.peaks, { wavelength: input.settings.wavelength });
    return { atoms, rwp: c.rwp, rp: c.rp };
  },
};

export type TaskKind = keyof typeof TASKS;
