/**
 * Limits of the job system, each settable in the environment of the server and the workers.
 * Time limits are per kind; the memory limit caps the V8 heap of the thread a task runs in
 * (worker_threads resourceLimits.maxOldGenerationSizeMb), so one huge cut cannot take the machine.
 */
import type { JobKind } from './kinds';

const num = (name: string, fallback: number) => {
  const v = Number(process.env[name]);
  return Number.isFinite(v) && v > 0 ? v : fallback;
};

export const limits = () => ({
  /** Jobs one user may have waiting or running at once (sweeps count once). */
  maxQueuedPerUser: num('TAUFORGE_JOBS_MAX_QUEUED', 10),
  /** Jobs of one user that run at the same time; the rest wait their turn. */
  maxRunningPerUser: num('TAUFORGE_JOBS_MAX_RUNNING', 2),
  /** Heap of the thread a task runs in, MB. */
  memoryMb: num('TAUFORGE_JOB_MEMORY_MB', 1536),
  /** A job whose worker stops answering is handed to another worker after this long, ms. */
  lockMs: num('TAUFORGE_JOB_LOCK_MS', 30_000),
  /** Grid points one sweep may hold. */
  maxSweepPoints: num('TAUFORGE_SWEEP_MAX_POINTS', 2000),
});

const SECONDS: Record<JobKind, number> = {
  export: 120,
  diffraction: 300,
  parse: 10,
  index: 60,
  sweep: 60,
  point: 60,
};

/** Wall-clock limit of one task of this kind, ms (TAUFORGE_JOB_TIME_<KIND> in seconds overrides). */
export function timeLimitMs(kind: JobKind): number {
  return num(`TAUFORGE_JOB_TIME_${kind.toUpperCase()}`, SECONDS[kind]) * 1000;
}
