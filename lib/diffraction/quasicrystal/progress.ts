/**
 * Progress of the quasicrystal computations (indexing, the occupation-domain powder pattern, its fit): an
 * optional callback that receives a fraction in [0, 1], never smaller than the one before, and exactly 1 when
 * the work is done. The callback may throw to stop the work: nothing in these modules catches what it throws,
 * so the run ends at the next report with the callback's own error (the page's worker is simply terminated
 * instead; this is for callers on one thread, e.g. tests and the command line).
 */
export type OnProgress = (fraction: number) => void;

/**
 * A callback for a sub-task that covers [from, to] of the caller's range: its own [0, 1] is mapped there and
 * clamped, and a report that would go back is raised to the last one (undefined stays undefined).
 */
export function progressRange(report: OnProgress | undefined, from: number, to: number): OnProgress | undefined {
  if (!report) return undefined;
  let last = -Infinity;
  return (f) => {
    const x = Math.max(last, from + (to - from) * Math.min(1, Math.max(0, f)));
    last = x;
    report(x);
  };
}
