'use client';
/** One worker job as React state: start, progress, result, error, cancel. */
import { useCallback, useEffect, useRef, useState } from 'react';
import { JobCancelled, JobFailed, runInWorker, type Lane } from '@/lib/worker/client';
import type { JobRequest, JobResultMap } from '@/lib/worker/protocol';

export interface JobState<T> {
  running: boolean;
  stage: string | null;
  fraction: number | null;
  startedAt: number | null;
  result: T | null;
  error: { message: string; field?: string } | null;
  ms: number | null;
}

export function useJob<K extends JobRequest['kind']>(lane: Lane) {
  const [state, setState] = useState<JobState<JobResultMap[K]>>({ running: false, stage: null, fraction: null, startedAt: null, result: null, error: null, ms: null });
  const cancelRef = useRef<(() => void) | null>(null);

  const start = useCallback(
    (job: Extract<JobRequest, { kind: K }>) => {
      const t0 = performance.now();
      setState((s) => ({ ...s, running: true, stage: 'starting', fraction: 0, startedAt: Date.now(), error: null }));
      const run = runInWorker<K>(lane, job, (stage, fraction) => setState((s) => ({ ...s, stage, fraction: fraction ?? s.fraction })));
      cancelRef.current = run.cancel;
      return run.promise.then(
        (result) => {
          setState({ running: false, stage: null, fraction: null, startedAt: null, result, error: null, ms: performance.now() - t0 });
          return result;
        },
        (e: unknown) => {
          if (e instanceof JobCancelled) {
            setState((s) => ({ ...s, running: false, stage: null, fraction: null, startedAt: null }));
            return null;
          }
          const err = e instanceof JobFailed ? { message: e.message, field: e.field } : { message: e instanceof Error ? e.message : String(e) };
          setState((s) => ({ ...s, running: false, stage: null, fraction: null, startedAt: null, error: err }));
          return null;
        },
      );
    },
    [lane],
  );

  const cancel = useCallback(() => cancelRef.current?.(), []);
  const clear = useCallback(() => setState((s) => ({ ...s, result: null, error: null })), []);
  useEffect(() => () => cancelRef.current?.(), []);
  return { ...state, start, cancel, clear };
}
