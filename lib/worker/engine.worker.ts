/// <reference lib="webworker" />
/**
 * The workspace's Web Worker: runs lib/worker/engine.ts off the main thread. Cancel = the page terminates
 * this worker (see client.ts), so no job needs to check a flag.
 */
import { runJob } from './engine';
import type { FromWorker, JobRequest, ToWorker } from './protocol';
import { splitFieldError } from './protocol';

const post = (m: FromWorker) => (self as unknown as DedicatedWorkerGlobalScope).postMessage(m);

self.onmessage = (ev: MessageEvent<ToWorker>) => {
  const { id, job } = ev.data;
  const t0 = performance.now();
  try {
    const result = runJob(job as Extract<JobRequest, { kind: typeof job.kind }>, (stage, fraction) => post({ id, type: 'progress', stage, fraction }));
    post({ id, type: 'done', result, ms: performance.now() - t0 });
  } catch (e) {
    const text = e instanceof Error ? e.message : String(e);
    const { field, message } = splitFieldError(text);
    post({ id, type: 'failed', message, field });
  }
};
