// Step-by-step console output for the bootstrap scripts: one line per step, and one-line fatal errors.
let t0 = Date.now();

export function step(message) {
  const s = ((Date.now() - t0) / 1000).toFixed(1).padStart(6);
  console.log(`[tauforge ${s}s] ${message}`);
}

/** A problem the user can fix: print one line saying what to do, exit non-zero, no stack trace. */
export class UserError extends Error {}

export function fail(message) {
  throw new UserError(message);
}

export function resetClock() {
  t0 = Date.now();
}
