/**
 * The one neighbour search of Tauforge: every pair of points closer than a cut-off, in O(N), for periodic
 * cells (triclinic included, every periodic image within the cut-off, so the minimum image and beyond) and
 * for finite point sets. Used by the checks (minimum distance, shells), by mergeClose and by the viewer's
 * bonds.
 */
import { faceSpacings, type Cell } from './cell';
import { toCartesian, toFractional, wrapFractional } from './frac';

/**
 * Called once per unordered pair (periodic image) closer than the cut-off: i ≤ j, (dx, dy, dz) =
 * r_j + shift − r_i with r wrapped into the cell when periodic, d = |(dx, dy, dz)|.
 */
export type PairVisitor = (i: number, j: number, d: number, dx: number, dy: number, dz: number) => void;

/** Upper bound on grid bins per atom: keeps memory O(N) when the cut-off is tiny compared with the box. */
const MAX_BINS_PER_ATOM = 2;

/**
 * Visit every pair of points closer than rCut (strictly), O(N) with a cell list (linked-cell method,
 * Allen & Tildesley, Computer Simulation of Liquids, §5.3). With a cell the search is periodic for a
 * general triclinic cell: points are wrapped into the cell and binned along fractional axes; bins are
 * at least rCut wide measured between the cell's faces, so two points within rCut are at most
 * ceil(rCut·n/spacing) bins apart along each axis (|Δf_i| = |Δr·a_i*| ≤ rCut/spacing_i). Every
 * periodic image counts as its own pair, including an atom and its own image when the cell is small
 * (an image and its inverse once: only the lexicographically positive shift). Without a cell the same
 * grid covers the bounding box, without wrapping. Pairs come by increasing i (deterministic).
 */
export function forEachPairWithin(positions: Float64Array, cell: Cell | undefined, rCut: number, visit: PairVisitor): void {
  if (!(rCut > 0) || !Number.isFinite(rCut)) throw new RangeError(`cut-off must be a positive number of Å, got ${rCut}`);
  const n = positions.length / 3;
  if (n === 0) return;
  // Grid coordinates in [0, 1) per axis and the matrix that maps grid offsets to Cartesian shifts.
  let g: Float64Array;
  let wrapped: Float64Array;
  let span: [number, number, number];
  const periodic = cell !== undefined;
  if (periodic) {
    g = wrapFractional(toFractional(cell, positions));
    wrapped = toCartesian(cell, g);
    span = faceSpacings(cell);
  } else {
    const lo = [Infinity, Infinity, Infinity];
    const hi = [-Infinity, -Infinity, -Infinity];
    for (let i = 0; i < n; i++)
      for (let k = 0; k < 3; k++) {
        const x = positions[3 * i + k];
        if (x < lo[k]) lo[k] = x;
        if (x > hi[k]) hi[k] = x;
      }
    span = [0, 1, 2].map((k) => Math.max(hi[k] - lo[k], 1e-9) * (1 + 1e-9)) as [number, number, number];
    g = new Float64Array(3 * n);
    for (let i = 0; i < n; i++) for (let k = 0; k < 3; k++) g[3 * i + k] = Math.min((positions[3 * i + k] - lo[k]) / span[k], 1 - 1e-12);
    wrapped = positions;
  }
  const nb = span.map((w) => Math.max(1, Math.floor(w / rCut))) as [number, number, number];
  while (nb[0] * nb[1] * nb[2] > Math.max(27, MAX_BINS_PER_ATOM * n)) {
    const k = nb.indexOf(Math.max(...nb));
    nb[k] = Math.max(1, Math.floor(nb[k] / 2));
  }
  const reach = nb.map((m, k) => Math.ceil((rCut * m) / span[k] - 1e-12)) as [number, number, number];
  if (!periodic) for (let k = 0; k < 3; k++) reach[k] = Math.min(reach[k], nb[k] - 1);
  const nbin = nb[0] * nb[1] * nb[2];
  const binOf = new Int32Array(n);
  const start = new Int32Array(nbin + 1);
  for (let i = 0; i < n; i++) {
    const bx = Math.min(nb[0] - 1, Math.floor(g[3 * i] * nb[0]));
    const by = Math.min(nb[1] - 1, Math.floor(g[3 * i + 1] * nb[1]));
    const bz = Math.min(nb[2] - 1, Math.floor(g[3 * i + 2] * nb[2]));
    const b = (bx * nb[1] + by) * nb[2] + bz;
    binOf[i] = b;
    start[b + 1]++;
  }
  for (let b = 0; b < nbin; b++) start[b + 1] += start[b];
  const fill = start.slice(0, nbin);
  const members = new Int32Array(n);
  for (let i = 0; i < n; i++) members[fill[binOf[i]]++] = i; // ascending i within each bin: deterministic order
  const r2 = rCut * rCut;
  const A = cell ?? [
    [0, 0, 0],
    [0, 0, 0],
    [0, 0, 0],
  ];
  for (let i = 0; i < n; i++) {
    const b = binOf[i];
    const bx = Math.floor(b / (nb[1] * nb[2]));
    const by = Math.floor(b / nb[2]) % nb[1];
    const bz = b % nb[2];
    const xi = wrapped[3 * i];
    const yi = wrapped[3 * i + 1];
    const zi = wrapped[3 * i + 2];
    for (let ox = -reach[0]; ox <= reach[0]; ox++) {
      const cx = bx + ox;
      if (!periodic && (cx < 0 || cx >= nb[0])) continue;
      const sx = Math.floor(cx / nb[0]);
      const jx = cx - sx * nb[0];
      for (let oy = -reach[1]; oy <= reach[1]; oy++) {
        const cy = by + oy;
        if (!periodic && (cy < 0 || cy >= nb[1])) continue;
        const sy = Math.floor(cy / nb[1]);
        const jy = cy - sy * nb[1];
        for (let oz = -reach[2]; oz <= reach[2]; oz++) {
          const cz = bz + oz;
          if (!periodic && (cz < 0 || cz >= nb[2])) continue;
          const sz = Math.floor(cz / nb[2]);
          const jz = cz - sz * nb[2];
          const shiftZero = sx === 0 && sy === 0 && sz === 0;
          // Self-images: count the shift and its negative once (lexicographically positive shift only).
          const selfOk = !shiftZero && (sx > 0 || (sx === 0 && (sy > 0 || (sy === 0 && sz > 0))));
          // Cartesian shift s·M of the image (s = 0 without a cell).
          const tx = sx * A[0][0] + sy * A[1][0] + sz * A[2][0];
          const ty = sx * A[0][1] + sy * A[1][1] + sz * A[2][1];
          const tz = sx * A[0][2] + sy * A[1][2] + sz * A[2][2];
          const nbk = (jx * nb[1] + jy) * nb[2] + jz;
          for (let m = start[nbk]; m < start[nbk + 1]; m++) {
            const j = members[m];
            if (j < i || (j === i && !selfOk)) continue;
            const dx = wrapped[3 * j] + tx - xi;
            const dy = wrapped[3 * j + 1] + ty - yi;
            const dz = wrapped[3 * j + 2] + tz - zi;
            const d2 = dx * dx + dy * dy + dz * dz;
            if (d2 < r2) visit(i, j, Math.sqrt(d2), dx, dy, dz);
          }
        }
      }
    }
  }
}
