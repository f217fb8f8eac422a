/**
 * How a sweep's points are handed to the workers: in batches of decreasing size, so a worker pays the queue
 * and database round trips once per batch rather than once per point, while the last batches are single
 * points and no worker waits long for another at the end. Guided self-scheduling (Polychronopoulos & Kuck,
 * IEEE Trans. Computers C-36 (1987) 1425): each batch takes ⌈R / (f·P)⌉ of the R points left for P workers;
 * f = 1 is the published rule, a larger f (and a cap) keeps the first batches small enough that a killed
 * worker loses little and a worker that joins later still finds work.
 */
export interface BatchOptions {
  /** Live workers (at least 1 is assumed). */
  workers: number;
  /** f in ⌈R / (f·P)⌉. */
  factor?: number;
  /** Largest batch. */
  max?: number;
}

/** Split `items` (in order) into consecutive batches of guided sizes. */
export function guidedBatches<T>(items: readonly T[], o: BatchOptions): T[][] {
  const p = Math.max(1, Math.floor(o.workers) || 1);
  const f = o.factor ?? 1;
  const max = o.max ?? Infinity;
  if (!(f > 0) || !(max >= 1)) throw new Error('guidedBatches: factor must be > 0 and max at least 1');
  const out: T[][] = [];
  let at = 0;
  while (at < items.length) {
    const left = items.length - at;
    const n = Math.max(1, Math.min(max, Math.ceil(left / (f * p))));
    out.push(items.slice(at, at + n));
    at += n;
  }
  return out;
}
