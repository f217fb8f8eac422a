/**
 * Diffraction results kept in the client, so leaving the Diffraction tab (even mid-run) or switching between
 * zone axis and powder never drops a computed pattern or a loaded measured file.
 *
 * Two levels of keys:
 * - the scope (a project id, or "scratch"): the panel's settings, its sub-tab and the measured pattern;
 * - the result key: scope + the model the structure was cut from + the job's settings, written as canonical
 *   JSON (lib/formats/canonical-json.ts), so one model's pattern is never shown for another model or for
 *   other settings.
 * Jobs run here rather than in a component: a run started before the tab was left lands in the store.
 */
import { create, type StoreApi, type UseBoundStore } from 'zustand';
import { canonicalJson } from '@/lib/formats/canonical-json';
import { JobCancelled, JobFailed, runInWorker, type Lane, type Running } from '@/lib/worker/client';
import type { JobRequest, JobResultMap } from '@/lib/worker/protocol';
import type { MeasuredPattern } from '@/lib/formats/measured';
import type { JobState } from './useJob';

export type DiffractionKind = 'zone' | 'powder';

export interface DiffractionForm {
  sub: DiffractionKind;
  axis: string;
  qmax: string;
  radiation: 'xray' | 'neutron' | 'electron';
  wl: string;
  tt0: string;
  tt1: string;
  fwhm: string;
}

export interface MeasuredRef {
  name: string;
  data: MeasuredPattern;
  /** A local file, kept so it can be stored as a project dataset. */
  file?: File;
  datasetId?: string;
}

export interface ScopeState {
  form: DiffractionForm;
  measured: MeasuredRef | null;
}

export type Slot = JobState<unknown>;

export const IDLE: Slot = { running: false, stage: null, fraction: null, startedAt: null, result: null, error: null, ms: null };

/** How a job is run; the worker by default, a stand-in in tests. */
export type Runner = (lane: Lane, job: JobRequest, progress: (stage: string, fraction?: number) => void) => Running<unknown>;

export interface ResultsState {
  scopes: Record<string, ScopeState>;
  slots: Record<string, Slot>;
  /** Per scope: the hyperlattice the measured pattern is indexed with (IndexingPanel), kept like the form. */
  indexLattice: Record<string, 'P' | 'F'>;
  setIndexLattice(scope: string, lattice: 'P' | 'F'): void;
  setForm(scope: string, defaults: DiffractionForm, patch: Partial<DiffractionForm>): void;
  setMeasured(scope: string, defaults: DiffractionForm, m: MeasuredRef | null | ((old: MeasuredRef | null) => MeasuredRef | null)): void;
  /** Start `job` under `key`; a running job on another key of the same lane is cancelled by the worker lane. */
  run(key: string, lane: Lane, job: JobRequest): Promise<unknown>;
  cancel(key: string): void;
}

/**
 * Which measured pattern a result was computed from: its name, axis, length, ends and a position-weighted
 * intensity sum (the same file opened again gives the same id; another file, or the same name with other data,
 * another — up to a coincidence of that sum).
 */
export function measuredId(m: MeasuredRef): string {
  const { x, intensity } = m.data;
  let sum = 0;
  for (let i = 0; i < intensity.length; i++) sum += intensity[i] * (1 + (i % 7));
  return `${m.name}:${x.length}:${x[0]}:${x[x.length - 1]}:${m.data.axis}:${sum}`;
}

/** The key of one result: where, for which model, with which settings (canonical JSON, so key order does not matter). */
export function resultKey(scope: string, model: string, settings: Record<string, unknown>): string {
  return canonicalJson({ scope, model, settings });
}

export type ResultsStore = UseBoundStore<StoreApi<ResultsState>>;

const defaultRunner: Runner = (lane, job, progress) => runInWorker(lane, job as Extract<JobRequest, { kind: JobRequest['kind'] }>, progress) as Running<unknown>;

export function createResultsStore(runner: Runner = defaultRunner): ResultsStore {
  const cancels = new Map<string, () => void>();
  return create<ResultsState>()((set) => {
    const patchSlot = (key: string, f: (s: Slot) => Slot) => set((st) => ({ slots: { ...st.slots, [key]: f(st.slots[key] ?? IDLE) } }));
    const scopeOf = (st: ResultsState, scope: string, defaults: DiffractionForm): ScopeState => st.scopes[scope] ?? { form: defaults, measured: null };
    return {
      scopes: {},
      slots: {},
      indexLattice: {},
      setIndexLattice: (scope, lattice) => set((st) => ({ indexLattice: { ...st.indexLattice, [scope]: lattice } })),
      setForm: (scope, defaults, patch) =>
        set((st) => {
          const sc = scopeOf(st, scope, defaults);
          return { scopes: { ...st.scopes, [scope]: { ...sc, form: { ...sc.form, ...patch } } } };
        }),
      setMeasured: (scope, defaults, m) =>
        set((st) => {
          const sc = scopeOf(st, scope, defaults);
          const measured = typeof m === 'function' ? m(sc.measured) : m;
          return { scopes: { ...st.scopes, [scope]: { ...sc, measured } } };
        }),
      run: (key, lane, job) => {
        const t0 = performance.now();
        patchSlot(key, (s) => ({ ...s, running: true, stage: 'starting', fraction: 0, startedAt: Date.now(), error: null }));
        const r = runner(lane, job, (stage, fraction) => patchSlot(key, (s) => ({ ...s, stage, fraction: fraction ?? s.fraction })));
        cancels.set(key, r.cancel);
        return r.promise.then(
          (result) => {
            cancels.delete(key);
            patchSlot(key, () => ({ running: false, stage: null, fraction: null, startedAt: null, result, error: null, ms: performance.now() - t0 }));
            return result;
          },
          (e: unknown) => {
            cancels.delete(key);
            if (e instanceof JobCancelled) {
              patchSlot(key, (s) => ({ ...s, running: false, stage: null, fraction: null, startedAt: null }));
              return null;
            }
            const error = e instanceof JobFailed ? { message: e.message, field: e.field } : { message: e instanceof Error ? e.message : String(e) };
            patchSlot(key, (s) => ({ ...s, running: false, stage: null, fraction: null, startedAt: null, error }));
            return null;
          },
        );
      },
      cancel: (key) => {
        cancels.get(key)?.();
      },
    };
  });
}

/** The store the workspace shares. */
export const useResultsStore: ResultsStore = createResultsStore();

/** The slot of one key, typed for its job kind. */
export function slotOf<K extends keyof JobResultMap>(slots: Record<string, Slot>, key: string): JobState<JobResultMap[K]> {
  return (slots[key] ?? IDLE) as JobState<JobResultMap[K]>;
}
