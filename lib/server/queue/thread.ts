/**
 * Entry of the task thread (built to dist/worker/thread.mjs): takes one task at a time from the
 * worker process, reports progress, answers with the result or a plain error. The worker process
 * terminates this thread to enforce a time limit or a cancel; V8 ends it when its heap limit is hit.
 */
import { parentPort } from 'node:worker_threads';
import { TASKS, type TaskKind } from './tasks';

export interface TaskRequest {
  id: number;
  kind: TaskKind;
  input: unknown;
}

export type TaskReply =
  | { id: number; type: 'progress'; fraction: number; stage: string }
  | { id: number; type: 'done'; result: unknown }
  | { id: number; type: 'error'; error: { code: string; message: string; details: unknown } };

function errorOf(e: unknown): { code: string; message: string; details: unknown } {
  if (e instanceof Error && e.name === 'ApiError' && typeof (e as { code?: unknown }).code === 'string') {
    const a = e as unknown as { code: string; message: string; details?: unknown };
    return { code: a.code, message: a.message, details: a.details ?? null };
  }
  // A bad model or file raises a plain Error with a readable message: that is the user's to fix (422).
  return { code: 'unprocessable', message: e instanceof Error ? e.message : String(e), details: null };
}

const port = parentPort;
if (port) {
  port.on('message', (req: TaskRequest) => {
    let last = 0;
    const progress = (fraction: number, stage: string) => {
      const now = Date.now();
      if (now - last < 200 && fraction < 1) return;
      last = now;
      port.postMessage({ id: req.id, type: 'progress', fraction, stage } satisfies TaskReply);
    };
    try {
      const task = TASKS[req.kind] as (input: unknown, p: typeof progress) => unknown;
      const result = task(req.input, progress);
      const bytes = (result as { bytes?: Uint8Array } | null)?.bytes;
      // Large export bytes move to the worker process without a copy.
      port.postMessage({ id: req.id, type: 'done', result } satisfies TaskReply, bytes ? [bytes.buffer as ArrayBuffer] : []);
    } catch (e) {
      port.postMessage({ id: req.id, type: 'error', error: errorOf(e) } satisfies TaskReply);
    }
  });
}
