/**
 * Runs tasks in one reusable worker thread with a heap limit (resourceLimits.maxOldGenerationSizeMb)
 * and a wall-clock limit per task. A task over time, cancelled, or out of memory ends the thread;
 * the next task starts a fresh one. Errors say which of these happened, in words a user can act on.
 */
import { Worker } from 'node:worker_threads';
import type { TaskReply, TaskRequest } from './thread';
import type { TaskKind } from './tasks';

export class TaskError extends Error {
  constructor(
    readonly code: string,
    message: string,
    readonly details: unknown = null,
  ) {
    super(message);
    this.name = 'TaskError';
  }
}

export interface RunOptions {
  timeMs: number;
  onProgress?: (fraction: number, stage: string) => void;
}

export class TaskThread {
  private worker: Worker | null = null;
  private seq = 0;
  private current: { id: number; stop: (why: 'cancel' | 'time') => void } | null = null;
  /** Counts thread starts: state kept inside the thread (caches) belongs to one generation. */
  generation = 0;

  constructor(
    private readonly file: URL,
    private readonly memoryMb: number,
  ) {}

  private spawn(): Worker {
    if (!this.worker) {
      this.worker = new Worker(this.file, { resourceLimits: { maxOldGenerationSizeMb: this.memoryMb } });
      this.worker.unref();
      this.generation += 1;
    }
    return this.worker;
  }

  /** Start the thread now (worker start-up), so the first job does not wait for it to load. */
  warm(): void {
    this.spawn();
  }

  /** Stop the running task (a cancel): the thread ends and the run rejects with code "cancelled". */
  cancel(): void {
    this.current?.stop('cancel');
  }

  run<T>(kind: TaskKind, input: unknown, o: RunOptions): Promise<T> {
    const w = this.spawn();
    const id = ++this.seq;
    const mb = this.memoryMb;
    return new Promise<T>((resolve, reject) => {
      let stopped: 'cancel' | 'time' | null = null;
      const done = () => {
        clearTimeout(timer);
        w.off('message', onMessage);
        w.off('error', onError);
        w.off('exit', onExit);
        this.current = null;
      };
      const kill = () => {
        this.worker = null;
        void w.terminate();
      };
      const onMessage = (m: TaskReply) => {
        if (m.id !== id) return;
        if (m.type === 'progress') o.onProgress?.(m.fraction, m.stage);
        else if (m.type === 'done') {
          done();
          resolve(m.result as T);
        } else {
          done();
          reject(new TaskError(m.error.code, m.error.message, m.error.details));
        }
      };
      const onError = (e: Error & { code?: string }) => {
        done();
        this.worker = null;
        if (e.code === 'ERR_WORKER_OUT_OF_MEMORY') reject(new TaskError('out_of_memory', `The job ran out of its ${mb} MB memory limit and was stopped; cut a smaller model.`));
        else reject(new TaskError('crashed', `The job crashed: ${e.message}`));
      };
      const onExit = (code: number) => {
        done();
        this.worker = null;
        if (stopped === 'cancel') reject(new TaskError('cancelled', 'The job was cancelled.'));
        else if (stopped === 'time') reject(new TaskError('timed_out', `The job ran longer than its ${Math.round(o.timeMs / 1000)} s limit and was stopped; cut a smaller model.`));
        else reject(new TaskError('crashed', `The job's thread stopped unexpectedly (exit ${code}).`));
      };
      const timer = setTimeout(() => {
        stopped = 'time';
        kill();
      }, o.timeMs);
      this.current = {
        id,
        stop: (why) => {
          stopped = why;
          kill();
        },
      };
      w.on('message', onMessage);
      w.on('error', onError);
      w.on('exit', onExit);
      w.postMessage({ id, kind, input } satisfies TaskRequest);
    });
  }

  async close(): Promise<void> {
    const w = this.worker;
    this.worker = null;
    if (w) await w.terminate();
  }
}
