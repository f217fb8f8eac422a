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
 * grid covers the bounding box, without wrapping. Each pair of bins is met once (half the neighbour
 * offsets), and each pair is measured from its lower index as r_j + shift − r_i, whichever bin it was met
 * from, so the distances do not depend on the visiting order. That order is by bin, deterministic for a
 * given input; callers that need an order sort.
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
  for (let i = 0; i < n; i++) members[fill[binOf[i]]++] = i; // ascending i within each bin
  // Positions in bin order, so the pair loops below read memory in sequence.
  const P = new Float64Array(3 * n);
  for (let m = 0; m < n; m++) {
    const i = members[m];
    P[3 * m] = wrapped[3 * i];
    P[3 * m + 1] = wrapped[3 * i + 1];
    P[3 * m + 2] = wrapped[3 * i + 2];
  }
  // Half the neighbour offsets (o lexicographically ≥ 0): bin B meets bin B + o, and B + o meets B through
  // −o, so each pair of bins is visited once. o = 0 pairs atoms of one bin with each other once.
  const offsets: number[] = [];
  for (let ox = 0; ox <= reach[0]; ox++)
    for (let oy = ox === 0 ? 0 : -reach[1]; oy <= reach[1]; oy++)
      for (let oz = ox === 0 && oy === 0 ? 0 : -reach[2]; oz <= reach[2]; oz++) offsets.push(ox, oy, oz);
  const r2 = rCut * rCut;
  const A = cell ?? [
    [0, 0, 0],
    [0, 0, 0],
    [0, 0, 0],
  ];
  const [n0, n1, n2] = nb;
  const [[a00, a01, a02], [a10, a11, a12], [a20, a21, a22]] = A;
  // Translation of the zero shift, by the same formula as any other (its zeros may be −0).
  const t0x = 0 * a00 + 0 * a10 + 0 * a20;
  const t0y = 0 * a01 + 0 * a11 + 0 * a21;
  const t0z = 0 * a02 + 0 * a12 + 0 * a22;
  for (let bx = 0; bx < n0; bx++)
    for (let by = 0; by < n1; by++)
      for (let bz = 0; bz < n2; bz++) {
        const b = (bx * n1 + by) * n2 + bz;
        const m0 = start[b];
        const m1 = start[b + 1];
        if (m0 === m1) continue;
        for (let k = 0; k < offsets.length; k += 3) {
          const cx = bx + offsets[k];
          const cy = by + offsets[k + 1];
          const cz = bz + offsets[k + 2];
          if (!periodic && (cx >= n0 || cy < 0 || cy >= n1 || cz < 0 || cz >= n2)) continue;
          // Image shift s (in cells) of the other bin, and its Cartesian translation t = s·M; seen from the
          // other bin the shift is −s (written 0 − s so that s = 0 stays +0, exactly as computed from there).
          const sx = cx >= 0 && cx < n0 ? 0 : Math.floor(cx / n0);
          const sy = cy >= 0 && cy < n1 ? 0 : Math.floor(cy / n1);
          const sz = cz >= 0 && cz < n2 ? 0 : Math.floor(cz / n2);
          let tx = t0x;
          let ty = t0y;
          let tz = t0z;
          let ux = t0x;
          let uy = t0y;
          let uz = t0z;
          if (sx !== 0 || sy !== 0 || sz !== 0) {
            tx = sx * a00 + sy * a10 + sz * a20;
            ty = sx * a01 + sy * a11 + sz * a21;
            tz = sx * a02 + sy * a12 + sz * a22;
            const rx = 0 - sx;
            const ry = 0 - sy;
            const rz = 0 - sz;
            ux = rx * a00 + ry * a10 + rz * a20;
            uy = rx * a01 + ry * a11 + rz * a21;
            uz = rx * a02 + ry * a12 + rz * a22;
          }
          const other = ((cx - sx * n0) * n1 + (cy - sy * n1)) * n2 + (cz - sz * n2);
          const same = offsets[k] === 0 && offsets[k + 1] === 0 && offsets[k + 2] === 0;
          const q1 = start[other + 1];
          for (let m = m0; m < m1; m++) {
            const a = members[m];
            const xa = P[3 * m];
            const ya = P[3 * m + 1];
            const za = P[3 * m + 2];
            for (let q = same ? m + 1 : start[other]; q < q1; q++) {
              const c = members[q];
              // Always measured from the lower index i to the image of j (a self-image only arises for
              // o ≠ 0, whose shift is then lexicographically positive: each ± pair once).
              let dx: number;
              let dy: number;
              let dz: number;
              if (a <= c) {
                dx = P[3 * q] + tx - xa;
                dy = P[3 * q + 1] + ty - ya;
                dz = P[3 * q + 2] + tz - za;
              } else {
                dx = xa + ux - P[3 * q];
                dy = ya + uy - P[3 * q + 1];
                dz = za + uz - P[3 * q + 2];
              }
              const d2 = dx * dx + dy * dy + dz * dz;
              if (d2 < r2) {
                if (a <= c) visit(a, c, Math.sqrt(d2), dx, dy, dz);
                else visit(c, a, Math.sqrt(d2), dx, dy, dz);
              }
            }
          }
        }
      }
}
