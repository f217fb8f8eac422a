/**
 * The diffraction results store (issue #14 item 3: leaving the Diffraction tab or switching zone axis / powder
 * must not drop a pattern or a measured file). The worker is replaced by a runner whose jobs the test settles
 * by hand, so a run can be left "in flight" while the panel is gone.
 */
import { describe, expect, it } from 'vitest';
import { createResultsStore, measuredId, resultKey, slotOf, type DiffractionForm, type MeasuredRef, type Runner } from '@/components/workspace/resultsStore';
import { JobCancelled } from '@/lib/worker/client';
import type { JobRequest } from '@/lib/worker/protocol';

const DEFAULTS: DiffractionForm = { sub: 'zone', axis: '5', qmax: '3', radiation: 'xray', wl: '1.5406', tt0: '10', tt1: '90', fwhm: '0.15' };

function manualRunner() {
  const pending: { job: JobRequest; resolve: (v: unknown) => void }[] = [];
  const runner: Runner = (_lane, job) => {
    let resolve!: (v: unknown) => void;
    const promise = new Promise<unknown>((r) => (resolve = r));
    pending.push({ job, resolve });
    return { promise, cancel: () => undefined };
  };
  return { runner, pending };
}

const zoneJob = { kind: 'zone', axis: '5', qmax: 3, slab: 0, radiation: 'xray' } as unknown as JobRequest;
const pattern = { spots: [{ x: 1, y: 0, intensity: 1, label: '1 0 0 0 0 0', qPar: 1 }], axisLabel: '5-fold', qmax: 3 };

describe('diffraction results store', () => {
  it('keeps a pattern that finished while the panel was away, and the sub-tab and measured file with it', async () => {
    const { runner, pending } = manualRunner();
    const s = createResultsStore(runner);
    const key = resultKey('p1', 'model-a', { kind: 'zone', axis: '5', qmax: 3, radiation: 'xray' });
    const done = s.getState().run(key, 'diffraction', zoneJob);
    expect(slotOf<'zone'>(s.getState().slots, key).running).toBe(true);
    // The panel is left: nothing of the store depends on it. The run finishes meanwhile.
    s.getState().setForm('p1', DEFAULTS, { sub: 'powder' });
    s.getState().setMeasured('p1', DEFAULTS, { name: 'scan.xy', data: { x: [10, 20], y: [1, 2], axis: '2theta' } as never });
    pending[0].resolve(pattern);
    await done;
    // Back on the tab and on the zone sub-tab: the same key reads the same pattern, the file is still there.
    s.getState().setForm('p1', DEFAULTS, { sub: 'zone' });
    const slot = slotOf<'zone'>(s.getState().slots, key);
    expect(slot.running).toBe(false);
    expect(slot.result).toBe(pattern);
    expect(s.getState().scopes.p1.measured?.name).toBe('scan.xy');
    expect(s.getState().scopes.p1.form).toEqual({ ...DEFAULTS, sub: 'zone' });
  });

  it('another model or other settings read no pattern; the key does not depend on the order of the settings', async () => {
    const { runner, pending } = manualRunner();
    const s = createResultsStore(runner);
    const key = resultKey('p1', 'model-a', { kind: 'zone', axis: '5', qmax: 3, radiation: 'xray' });
    const done = s.getState().run(key, 'diffraction', zoneJob);
    pending[0].resolve(pattern);
    await done;
    expect(resultKey('p1', 'model-a', { radiation: 'xray', qmax: 3, axis: '5', kind: 'zone' })).toBe(key);
    for (const other of [
      resultKey('p1', 'model-b', { kind: 'zone', axis: '5', qmax: 3, radiation: 'xray' }),
      resultKey('p1', 'model-a', { kind: 'zone', axis: '5', qmax: 4, radiation: 'xray' }),
      resultKey('p2', 'model-a', { kind: 'zone', axis: '5', qmax: 3, radiation: 'xray' }),
    ]) {
      expect(other).not.toBe(key);
      expect(slotOf<'zone'>(s.getState().slots, other).result).toBeNull();
    }
  });

  it('a failed run keeps its message under its own key and stops running', async () => {
    const s = createResultsStore((_l, _j) => ({ promise: Promise.reject(new Error('qmax too large')), cancel: () => undefined }));
    const key = resultKey('p1', 'm', { kind: 'zone', qmax: 99 });
    await s.getState().run(key, 'diffraction', zoneJob);
    expect(slotOf<'zone'>(s.getState().slots, key).error?.message).toBe('qmax too large');
    expect(slotOf<'zone'>(s.getState().slots, key).running).toBe(false);
  });

  it('an indexing run (lane "indexing") lands under its key while the panel is away; Cancel stops it with no error', async () => {
    const lanes: string[] = [];
    let cancelled = 0;
    const pending: { resolve: (v: unknown) => void; reject: (e: Error) => void }[] = [];
    const s = createResultsStore((lane) => {
      lanes.push(lane);
      let resolve!: (v: unknown) => void;
      let reject!: (e: Error) => void;
      const promise = new Promise<unknown>((res, rej) => {
        resolve = res;
        reject = rej;
      });
      pending.push({ resolve, reject });
      return {
        promise,
        cancel: () => {
          cancelled++;
          reject(new JobCancelled());
        },
      };
    });
    const m: MeasuredRef = { name: 'scan.xy', data: { axis: '2theta', x: Float64Array.from([20, 21, 22]), intensity: Float64Array.from([5, 9, 4]), comments: [] } };
    const key = resultKey('p1', 'measured', { kind: 'qc-index', measured: measuredId(m), wavelength: 1.5406, lattice: 'P' });
    const job = { kind: 'qc-index', measured: m.data, wavelength: 1.5406, lattice: 'P' } as const;
    // First run: cancelled mid-way — not running, no error, no result.
    const first = s.getState().run(key, 'indexing', job);
    expect(slotOf<'qc-index'>(s.getState().slots, key).running).toBe(true);
    s.getState().cancel(key);
    expect(await first).toBeNull();
    expect(cancelled).toBe(1);
    expect(slotOf<'qc-index'>(s.getState().slots, key)).toMatchObject({ running: false, error: null, result: null });
    // Second run finishes while nothing reads the store; the hyperlattice choice is kept per scope.
    const second = s.getState().run(key, 'indexing', job);
    s.getState().setIndexLattice('p1', 'F');
    const result = { aR: 4.56 };
    pending[1].resolve(result);
    await second;
    expect(slotOf<'qc-index'>(s.getState().slots, key).result).toBe(result);
    expect(s.getState().indexLattice).toEqual({ p1: 'F' });
    expect(lanes).toEqual(['indexing', 'indexing']);
  });

  it('measuredId tells files apart by name and data, and gives the same file the same id', () => {
    const data = () => ({ axis: '2theta' as const, x: Float64Array.from([20, 21, 22]), intensity: Float64Array.from([5, 9, 4]), comments: [] });
    const a: MeasuredRef = { name: 'scan.xy', data: data() };
    expect(measuredId({ name: 'scan.xy', data: data() })).toBe(measuredId(a));
    expect(measuredId({ name: 'other.xy', data: data() })).not.toBe(measuredId(a));
    const changed = data();
    changed.intensity[1] = 10;
    expect(measuredId({ name: 'scan.xy', data: changed })).not.toBe(measuredId(a));
    // the same intensities in another order are another pattern
    const swapped = data();
    swapped.intensity.set([4, 9, 5]);
    expect(measuredId({ name: 'scan.xy', data: swapped })).not.toBe(measuredId(a));
  });
});
