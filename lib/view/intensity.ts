/**
 * How intensities are drawn: the powder plot's linear / square-root / logarithmic axis, the zone pattern's
 * spot size with an adjustable dynamic range, and the reflection nearest a 2θ under the pointer.
 */

export type IntensityScale = 'linear' | 'sqrt' | 'log';

/** Smallest positive intensity the log axis shows (relative to a peak of order 1–100). */
export const LOG_FLOOR = 1e-6;

/** An intensity as drawn on the chosen axis; √ keeps the sign (differences may be negative). */
export function toAxis(v: number, scale: IntensityScale, floor = LOG_FLOOR): number {
  if (scale === 'linear') return v;
  if (scale === 'sqrt') return Math.sign(v) * Math.sqrt(Math.abs(v));
  return Math.log10(Math.max(v, floor));
}

/** The intensity a drawn axis value stands for (tick labels). */
export function fromAxis(a: number, scale: IntensityScale): number {
  if (scale === 'linear') return a;
  if (scale === 'sqrt') return Math.sign(a) * a * a;
  return 10 ** a;
}

/**
 * Spot weight in [0, 1] for a relative intensity I (strongest = 1) shown over `decades` decades:
 * 0 at or below 10^−decades, 1 at I = 1, logarithmic in between. `decades` = 0 means linear (weight = I).
 */
export function spotWeight(I: number, decades: number): number {
  if (!(I > 0)) return 0;
  if (decades <= 0) return Math.min(1, I);
  return Math.min(1, Math.max(0, 1 + Math.log10(I) / decades));
}

export interface Reflection {
  twoTheta: number;
  hkl: number[] | null;
  intensity: number;
}

/**
 * The reflection nearest to 2θ = x within `tolerance` degrees among those at least `minIntensity` strong
 * (ties go to the stronger one), or null.
 */
export function nearestReflection<R extends Reflection>(peaks: readonly R[], x: number, tolerance: number, minIntensity = 0): R | null {
  let best: R | null = null;
  let bestD = Infinity;
  for (const p of peaks) {
    if (p.intensity < minIntensity) continue;
    const d = Math.abs(p.twoTheta - x);
    if (d > tolerance) continue;
    if (d < bestD || (d === bestD && best && p.intensity > best.intensity)) {
      best = p;
      bestD = d;
    }
  }
  return best;
}
