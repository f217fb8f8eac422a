/**
 * worker_threads entry for the heavy diffraction loops (Node only: the command line and the benchmarks).
 * It runs the same pure functions as the browser's Web Worker would: the caller splits the outer loop (atoms for hkl sums,
 * rows i for the pair histogram) and adds the returned partial arrays.
 *
 * Messages: { kind: 'hkl', frac, groupOf, weight, rows, nGroups, j0, j1 } → { re, im }
 *           { kind: 'pairs', positions, groupOf, weight, spec, i0, i1 } → { hist }
 *           { kind: 'grid', positions, groupOf, weight, grid, nGroups, j0, j1 } → { re, im }
 * Every answer also carries `ms`, the job's time inside the worker (to check that all workers were busy).
 */
import { parentPort } from 'node:worker_threads';
import { hklPartialSums, type HklRows } from '../../../lib/diffraction/hkl-sum';
import { accumulatePairs, type PairHistogramSpec } from '../../../lib/diffraction/pair-histogram';
import { gridPartialSums, type PlaneGrid } from '../../../lib/diffraction/cartesian-sum';

export type DiffractionJob =
  | { kind: 'hkl'; frac: Float64Array; groupOf: Uint16Array; weight: Float64Array; rows: HklRows; nGroups: number; j0: number; j1: number }
  | { kind: 'pairs'; positions: Float64Array; groupOf: Uint16Array; weight: Float64Array; spec: PairHistogramSpec; i0: number; i1: number }
  | { kind: 'grid'; positions: Float64Array; groupOf: Uint16Array; weight: Float64Array; grid: PlaneGrid; nGroups: number; j0: number; j1: number };

export function runJob(job: DiffractionJob): { re: Float64Array; im: Float64Array } | { hist: Float64Array } {
  if (job.kind === 'hkl') {
    const re = new Float64Array(job.nGroups * job.rows.count);
    const im = new Float64Array(job.nGroups * job.rows.count);
    hklPartialSums(job.frac, job.groupOf, job.weight, job.rows, re, im, job.j0, job.j1);
    return { re, im };
  }
  if (job.kind === 'grid') {
    const cells = job.grid.na * job.grid.nb;
    const re = new Float64Array(job.nGroups * cells);
    const im = new Float64Array(job.nGroups * cells);
    gridPartialSums(job.positions, job.groupOf, job.weight, job.grid, re, im, job.j0, job.j1);
    return { re, im };
  }
  const hist = new Float64Array(job.spec.nGroups * job.spec.nGroups * job.spec.nBins);
  accumulatePairs(job.positions, job.groupOf, job.weight, job.spec, hist, job.i0, job.i1);
  return { hist };
}

if (parentPort) {
  const port = parentPort;
  port.on('message', (job: DiffractionJob) => {
    try {
      const t0 = performance.now();
      const out = runJob(job);
      const ms = performance.now() - t0;
      const transfer = 'hist' in out ? [out.hist.buffer] : [out.re.buffer, out.im.buffer];
      port.postMessage({ ok: true, out, ms }, transfer as ArrayBuffer[]);
    } catch (e) {
      port.postMessage({ ok: false, error: (e as Error).message });
    }
  });
}
