import { forEachPairWithin } from '../../math/cell-list';
import type { Structure } from '../types';
import { validateStructure } from '../validate';

export interface ShellHistogram {
  /** Bin edges in Å, length bins + 1, from 0 to rMax. */
  edges: Float64Array;
  /** Unordered pairs (periodic images counted) per bin. */
  pairs: Float64Array;
  /** Mean neighbours per atom in each bin: 2·pairs/N. Summed up to r, the mean coordination number. */
  perAtom: Float64Array;
}

/**
 * Distance histogram up to rMax (periodic minimum image and beyond: every image within rMax),
 * the usual way to see neighbour shells. Optionally restricted to pairs involving given species
 * (`from` for atom i, `to` for atom j, either order).
 */
export function shellHistogram(
  s: Structure,
  rMax: number,
  bins: number,
  opts: { from?: number; to?: number } = {},
): ShellHistogram {
  validateStructure(s);
  if (!Number.isInteger(bins) || bins < 1) throw new RangeError(`bins must be a positive integer, got ${bins}`);
  const edges = new Float64Array(bins + 1);
  for (let b = 0; b <= bins; b++) edges[b] = (rMax * b) / bins;
  const pairs = new Float64Array(bins);
  const sp = s.species;
  const { from, to } = opts;
  const match = (a: number, b: number) => (from === undefined || sp[a] === from) && (to === undefined || sp[b] === to);
  forEachPairWithin(s.positions, s.cell, rMax, (i, j, d) => {
    if (from !== undefined || to !== undefined) {
      if (!match(i, j) && !match(j, i)) return;
    }
    const b = Math.min(bins - 1, Math.floor((d / rMax) * bins));
    pairs[b]++;
  });
  const n = s.species.length;
  const perAtom = pairs.map((p) => (n > 0 ? (2 * p) / n : 0));
  return { edges, pairs, perAtom };
}
