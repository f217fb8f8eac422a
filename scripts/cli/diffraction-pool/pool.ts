/**
 * Split the diffraction loops over Node worker threads (the command line and the benchmarks; the browser
 * runs the same lib/ functions in its Web Worker). A pool keeps its workers alive between calls; each
 * call gives every worker an equal share of the outer loop and sums the partial results — the same sums
 * as the single-threaded call up to floating-point reassociation (≈ 1e-15 relative).
 */
import { Worker } from 'node:worker_threads';
import { fileURLToPath } from 'node:url';
import type { HklRows } from '../../../lib/diffraction/hkl-sum';
import type { PlaneGrid } from '../../../lib/diffraction/cartesian-sum';
import { balancedRowRanges, type PairHistogramSpec } from '../../../lib/diffraction/pair-histogram';
import type { DiffractionJob } from './worker';

// The worker is this module's sibling; the URL is computed from where this module is loaded from.
const WORKER_URL = new URL('./worker.ts', import.meta.url);

/** From TypeScript sources (CLI and bench under tsx, tests under vitest) the worker first registers tsx's require hook. */
function spawn(): Worker {
  if (!WORKER_URL.pathname.endsWith('.ts')) return new Worker(WORKER_URL);
  const file = fileURLToPath(WORKER_URL);
  return new Worker(`require('tsx/cjs/api').register(); require(${JSON.stringify(file)});`, { eval: true });
}

type JobResult = { re: Float64Array; im: Float64Array } | { hist: Float64Array };

export class DiffractionPool {
  private readonly workers: Worker[];
  /** Time each worker spent on its share of the last call, ms (to see that all of them were busy). */
  lastJobMs: number[] = [];

  constructor(readonly threads = 2) {
    if (!Number.isInteger(threads) || threads < 1) throw new Error(`threads: must be a positive integer, got ${threads}`);
    this.workers = Array.from({ length: threads }, spawn);
  }

  private run(w: Worker, job: DiffractionJob): Promise<JobResult> {
    return new Promise((resolve, reject) => {
      const onMessage = (m: { ok: boolean; out?: JobResult; ms?: number; error?: string }) => {
        w.off('error', onError);
        this.lastJobMs[this.workers.indexOf(w)] = m.ms ?? NaN;
        if (m.ok) resolve(m.out!);
        else reject(new Error(m.error));
      };
      const onError = (e: Error) => {
        w.off('message', onMessage);
        reject(e);
      };
      w.once('message', onMessage);
      w.once('error', onError);
      w.postMessage(job);
    });
  }

  /** Start every worker (loads the code) so later timings exclude start-up. */
  async warm(): Promise<void> {
    const rows: HklRows = { h: Int32Array.of(0), k: Int32Array.of(0), l0: Int32Array.of(1), l1: Int32Array.of(1), start: Int32Array.of(0), count: 1 };
    await Promise.all(
      this.workers.map((w) => this.run(w, { kind: 'hkl', frac: new Float64Array(3), groupOf: new Uint16Array(1), weight: Float64Array.of(1), rows, nGroups: 1, j0: 0, j1: 1 })),
    );
  }

  async hklPartialSums(frac: Float64Array, groupOf: Uint16Array, weight: Float64Array, rows: HklRows, nGroups: number): Promise<{ re: Float64Array; im: Float64Array }> {
    return this.summedOverAtoms(groupOf.length, (j0, j1) => ({ kind: 'hkl', frac, groupOf, weight, rows, nGroups, j0, j1 }));
  }

  async gridPartialSums(positions: Float64Array, groupOf: Uint16Array, weight: Float64Array, grid: PlaneGrid, nGroups: number): Promise<{ re: Float64Array; im: Float64Array }> {
    return this.summedOverAtoms(groupOf.length, (j0, j1) => ({ kind: 'grid', positions, groupOf, weight, grid, nGroups, j0, j1 }));
  }

  /** Split atoms 0…n into one contiguous range per worker and add the workers' partial complex sums. */
  private async summedOverAtoms(n: number, job: (j0: number, j1: number) => DiffractionJob): Promise<{ re: Float64Array; im: Float64Array }> {
    const t = this.threads;
    const outs = (await Promise.all(
      this.workers.map((w, i) => this.run(w, job(Math.floor((n * i) / t), Math.floor((n * (i + 1)) / t)))),
    )) as { re: Float64Array; im: Float64Array }[];
    const { re, im } = outs[0];
    for (const o of outs.slice(1)) {
      for (let i = 0; i < re.length; i++) {
        re[i] += o.re[i];
        im[i] += o.im[i];
      }
    }
    return { re, im };
  }

  async pairHistogram(positions: Float64Array, groupOf: Uint16Array, weight: Float64Array, spec: PairHistogramSpec): Promise<Float64Array> {
    const ranges = balancedRowRanges(groupOf.length, this.threads);
    const outs = (await Promise.all(
      this.workers.map((w, i) => this.run(w, { kind: 'pairs', positions, groupOf, weight, spec, i0: ranges[i][0], i1: ranges[i][1] })),
    )) as { hist: Float64Array }[];
    const hist = outs[0].hist;
    for (const o of outs.slice(1)) for (let i = 0; i < hist.length; i++) hist[i] += o.hist[i];
    return hist;
  }

  async close(): Promise<void> {
    await Promise.all(this.workers.map((w) => w.terminate()));
  }
}
