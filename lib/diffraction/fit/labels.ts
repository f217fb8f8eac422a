/**
 * Labels of measured peaks: each measured maximum is named after the calculated line that contributes
 * most to the calculated profile at that 2θ among the lines within one FWHM of it — not after the
 * nearest line, which for a pattern with a small zero shift is often a weak neighbour of the strong one.
 * When no line lies within one FWHM, the nearest line is given and `withinWidth` is false.
 */
import { pseudoVoigt } from '../profile';

export interface CalculatedLine {
  /** Position on the measured scale (zero shift included), degrees. */
  twoTheta: number;
  /** Integrated intensity on the measured scale. */
  area: number;
  fwhm: number;
  d: number;
  hkl: number[] | null;
}

export interface PeakLabel {
  twoTheta: number;
  intensity: number;
  line: CalculatedLine | null;
  /** Measured − calculated position, degrees. */
  misfit: number | null;
  withinWidth: boolean;
  /** Share of the calculated peak intensity at this 2θ that comes from the named line (0–1). */
  share: number;
}

export function labelPeaks(measured: { x: number; y: number }[], lines: CalculatedLine[], eta: number): PeakLabel[] {
  return measured.map((p) => {
    let best: CalculatedLine | null = null;
    let bestC = -Infinity;
    let total = 0;
    let nearest: CalculatedLine | null = null;
    for (const l of lines) {
      if (!nearest || Math.abs(l.twoTheta - p.x) < Math.abs(nearest.twoTheta - p.x)) nearest = l;
      const c = l.area * pseudoVoigt(p.x - l.twoTheta, l.fwhm, eta);
      total += c;
      if (Math.abs(l.twoTheta - p.x) <= l.fwhm && c > bestC) {
        bestC = c;
        best = l;
      }
    }
    const line = best ?? nearest;
    return {
      twoTheta: p.x,
      intensity: p.y,
      line,
      misfit: line ? p.x - line.twoTheta : null,
      withinWidth: best !== null,
      share: best && total > 0 ? bestC / total : 0,
    };
  });
}
