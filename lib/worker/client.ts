/**
 * Main-thread side of the engine worker. Each "lane" (cut, estimate, diffraction, series, indexing, qc) has its own worker,
 * so a slow powder pattern never holds up the atom-count estimate. A new job on a lane cancels the one running
 * there; cancel() terminates the worker outright and the next job starts a fresh one.
 */
import type { FromWorker, JobRequest, JobResultMap } from './protocol';

/** 'indexing' and 'qc' (the quasicrystal's own pattern) have lanes of their own, so neither cancels a powder run. */
export type Lane = 'cut' | 'estimate' | 'diffraction' | 'series' | 'indexing' | 'qc';

export class JobCancelled extends Error {
  constructor() {
    super('cancelled');
  }
}

export class JobFailed extends Error {
  field?: string;
  constructor(message: string, field?: string) {
    super(message);
    this.field = field;
  }
}

export interface Running<T> {
  promise: Promise<T>;
  cancel: () => void;
}

interface LaneState {
  worker: Worker | null;
  current: { id: number; reject: (e: Error) => void } | null;
}

let nextId = 1;
const lanes = new Map<Lane, LaneState>();

function lane(name: Lane): LaneState {
  let l = lanes.get(name);
  if (!l) {
    l = { worker: null, current: null };
    lanes.set(name, l);
  }
  return l;
}

function spawn(): Worker {
  return new Worker(new URL('./engine.worker.ts', import.meta.url), { type: 'module' });
}

export function cancelLane(name: Lane): void {
  const l = lane(name);
  if (l.current) {
    l.worker?.terminate();
    l.worker = null;
    const c = l.current;
    l.current = null;
    c.reject(new JobCancelled());
  }
}

export function runInWorker<K extends JobRequest['kind']>(
  name: Lane,
  job: Extract<JobRequest, { kind: K }>,
  onProgress?: (stage: string, fraction?: number) => void,
): Running<JobResultMap[K]> {
  cancelLane(name);
  const l = lane(name);
  if (!l.worker) l.worker = spawn();
  const worker = l.worker;
  const id = nextId++;
  const promise = new Promise<JobResultMap[K]>((resolve, reject) => {
    l.current = { id, reject };
    const onMessage = (ev: MessageEvent<FromWorker>) => {
      const m = ev.data;
      if (m.id !== id) return;
      if (m.type === 'progress') {
        onProgress?.(m.stage, m.fraction);
        return;
      }
      worker.removeEventListener('message', onMessage);
      if (l.current?.id === id) l.current = null;
      if (m.type === 'done') resolve(m.result as JobResultMap[K]);
      else reject(new JobFailed(m.message, m.field));
    };
    worker.addEventListener('message', onMessage);
    worker.addEventListener(
      'error',
      (ev) => {
        if (l.current?.id !== id) return;
        l.current = null;
        reject(new JobFailed(ev.message || 'the engine worker stopped unexpectedly'));
      },
      { once: true },
    );
    worker.postMessage({ id, job });
  });
  return {
    promise,
    cancel: () => {
      if (l.current?.id === id) cancelLane(name);
    },
  };
}
