/**
 * Bonds to draw: pairs of atoms closer than a cut-off, from the shared cell list (lib/math/cell-list.ts),
 * O(N). Bonds join the atoms as given — no periodic images, because the viewer draws each atom once
 * and a bond to an image would end in empty space.
 */
import { forEachPairWithin } from '../math/cell-list';

export interface BondList {
  /** Atom index pairs, i < j, two per bond. */
  pairs: Uint32Array;
  /** True when there were more than maxBonds bonds; pairs then holds the first maxBonds found. */
  truncated: boolean;
}

/**
 * Pairs with minDistance < |r_i − r_j| < cutoff. `visible` (optional, 1 = shown) restricts the search to
 * shown atoms. Keeps at most maxBonds bonds, which bounds the GPU buffers the viewer builds from them.
 */
export function bondPairs(
  positions: Float64Array,
  cutoff: number,
  options: { minDistance?: number; visible?: ArrayLike<number>; maxBonds?: number } = {},
): BondList {
  const n = positions.length / 3;
  // Coincident points (a merge left undone, an overlay) would give zero-length bonds: skip them.
  const minDistance = options.minDistance ?? 0.1;
  const maxBonds = options.maxBonds ?? 2_000_000;
  if (!(cutoff > 0) || !Number.isFinite(cutoff) || n < 2) return { pairs: new Uint32Array(0), truncated: false };
  // Search only the shown atoms: pack them, then map indices back.
  let index: Uint32Array | null = null;
  let points = positions;
  if (options.visible) {
    const visible = options.visible;
    const shown: number[] = [];
    for (let i = 0; i < n; i++) if (visible[i]) shown.push(i);
    index = Uint32Array.from(shown);
    points = new Float64Array(3 * shown.length);
    for (let k = 0; k < shown.length; k++) points.set(positions.subarray(3 * shown[k], 3 * shown[k] + 3), 3 * k);
  }
  // A typed buffer that doubles as it fills: millions of bonds without a boxed JS array.
  let out = new Uint32Array(Math.min(2 * maxBonds, 16 * n));
  let len = 0;
  let found = 0;
  forEachPairWithin(points, undefined, cutoff, (i, j, d) => {
    if (!(d > minDistance) || found++ >= maxBonds) return;
    if (len + 2 > out.length) {
      const grown = new Uint32Array(Math.min(2 * maxBonds, 2 * out.length));
      grown.set(out);
      out = grown;
    }
    out[len++] = index ? index[i] : i;
    out[len++] = index ? index[j] : j;
  });
  return { pairs: out.slice(0, len), truncated: found > maxBonds };
}
