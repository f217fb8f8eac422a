/**
 * The box of integer (h, k, l) that can reach d ≥ dMin, and the reciprocal metric tensor that tests each index:
 * |h_i| = |a_i · G| ≤ |a_i| |G| bounds each index, |G|² = Σ g_ij h_i h_j decides (International Tables Vol. B
 * §1.1.3, the reciprocal metric). For 1D and 2D models (dim < 3) the missing directions are held at 0 (their
 * cell vectors are only padding). Refuses boxes too large to walk, naming dMin.
 */
import { reciprocal, type Mat3 } from '../math/mat3';
import { norm } from '../math/vec3';
import type { Structure } from '../structure/types';

export interface HklBox {
  hMax: number;
  kMax: number;
  lMax: number;
  /** Reciprocal metric tensor g_ij = b_i · b_j (Å⁻²). */
  g: number[][];
  /** (1/dMin)² with a relative margin of 1e-12, so reflections exactly at dMin are kept. */
  g2max: number;
}

/** Largest box walked: (2hMax+1)(2kMax+1)(2lMax+1) above this asks the caller for a larger dMin. */
export const MAX_HKL_BOX = 5e7;

export function hklBox(s: Structure, dMin: number): HklBox {
  if (!s.cell) throw new Error('cell: the structure is not periodic; use the Debye or zone-axis routes for patches');
  if (!(dMin > 0) || !Number.isFinite(dMin)) throw new Error(`dMin: must be a positive length in Å, got ${dMin}`);
  const recip = reciprocal(s.cell);
  const dim = s.dim ?? 3;
  const gMax = 1 / dMin;
  const lim = s.cell.map((a) => Math.floor(norm(a) * gMax + 1e-9));
  const hMax = lim[0];
  const kMax = dim >= 2 ? lim[1] : 0;
  const lMax = dim >= 3 ? lim[2] : 0;
  const total = (2 * hMax + 1) * (2 * kMax + 1) * (2 * lMax + 1);
  if (total > MAX_HKL_BOX) throw new Error(`dMin: ${dMin} Å asks for about ${total} reflections; use a larger dMin`);
  return { hMax, kMax, lMax, g: metricOf(recip), g2max: gMax * gMax * (1 + 1e-12) };
}

/** The reciprocal metric tensor g_ij = b_i · b_j of a cell (Å⁻²). */
export function reciprocalMetric(cell: Mat3): number[][] {
  return metricOf(reciprocal(cell));
}

function metricOf(recip: Mat3): number[][] {
  return [0, 1, 2].map((i) => [0, 1, 2].map((j) => recip[i][0] * recip[j][0] + recip[i][1] * recip[j][1] + recip[i][2] * recip[j][2]));
}
