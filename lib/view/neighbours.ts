/**
 * Bonds under a cut-off by a cell list: atoms are binned into cubes of edge ≥ cut-off, and each atom is
 * compared only with atoms in its own and the 26 neighbouring cubes — O(N) for a dense structure instead
 * of O(N²). Bonds are drawn between the atoms as given (no periodic images).
 */

export interface BondList {
  /** Atom index pairs, i < j, two per bond. */
  pairs: Uint32Array;
  /** True when maxBonds stopped the search early. */
  truncated: boolean;
}

/**
 * Pairs with minDistance < |r_i − r_j| ≤ cutoff. `visible` (optional) restricts the search to shown
 * atoms. Stops after maxBonds bonds.
 */
export function bondPairs(
  positions: ArrayLike<number>,
  cutoff: number,
  options: { minDistance?: number; visible?: ArrayLike<number>; maxBonds?: number } = {},
): BondList {
  const n = positions.length / 3;
  const minD2 = (options.minDistance ?? 0.1) ** 2;
  const maxBonds = options.maxBonds ?? 2_000_000;
  const visible = options.visible;
  if (!(cutoff > 0) || n < 2) return { pairs: new Uint32Array(0), truncated: false };
  let x0 = Infinity, y0 = Infinity, z0 = Infinity, x1 = -Infinity, y1 = -Infinity, z1 = -Infinity;
  for (let i = 0; i < n; i++) {
    const x = positions[3 * i], y = positions[3 * i + 1], z = positions[3 * i + 2];
    if (x < x0) x0 = x;
    if (y < y0) y0 = y;
    if (z < z0) z0 = z;
    if (x > x1) x1 = x;
    if (y > y1) y1 = y;
    if (z > z1) z1 = z;
  }
  // Cube edge ≥ cutoff; grow it when the box is sparse so the grid never has more than ~4N cubes.
  let edge = cutoff;
  const dims = () => [Math.floor((x1 - x0) / edge) + 1, Math.floor((y1 - y0) / edge) + 1, Math.floor((z1 - z0) / edge) + 1];
  let [nx, ny, nz] = dims();
  while (nx * ny * nz > 4 * n + 64) {
    edge *= 1.5;
    [nx, ny, nz] = dims();
  }
  const cellOf = new Uint32Array(n);
  const start = new Uint32Array(nx * ny * nz + 1);
  for (let i = 0; i < n; i++) {
    const cx = Math.floor((positions[3 * i] - x0) / edge);
    const cy = Math.floor((positions[3 * i + 1] - y0) / edge);
    const cz = Math.floor((positions[3 * i + 2] - z0) / edge);
    const c = (cz * ny + cy) * nx + cx;
    cellOf[i] = c;
    start[c + 1]++;
  }
  for (let c = 0; c < nx * ny * nz; c++) start[c + 1] += start[c];
  const fill = start.slice(0, nx * ny * nz);
  const members = new Uint32Array(n);
  for (let i = 0; i < n; i++) members[fill[cellOf[i]]++] = i;

  const cut2 = cutoff * cutoff;
  const out: number[] = [];
  let truncated = false;
  outer: for (let i = 0; i < n; i++) {
    if (visible && !visible[i]) continue;
    const xi = positions[3 * i], yi = positions[3 * i + 1], zi = positions[3 * i + 2];
    const c = cellOf[i];
    const cx = c % nx;
    const cy = Math.floor(c / nx) % ny;
    const cz = Math.floor(c / (nx * ny));
    for (let dz = -1; dz <= 1; dz++) {
      const z = cz + dz;
      if (z < 0 || z >= nz) continue;
      for (let dy = -1; dy <= 1; dy++) {
        const y = cy + dy;
        if (y < 0 || y >= ny) continue;
        for (let dx = -1; dx <= 1; dx++) {
          const x = cx + dx;
          if (x < 0 || x >= nx) continue;
          const cell = (z * ny + y) * nx + x;
          for (let m = start[cell]; m < start[cell + 1]; m++) {
            const j = members[m];
            if (j <= i || (visible && !visible[j])) continue;
            const ex = positions[3 * j] - xi, ey = positions[3 * j + 1] - yi, ez = positions[3 * j + 2] - zi;
            const d2 = ex * ex + ey * ey + ez * ez;
            if (d2 <= cut2 && d2 > minD2) {
              if (out.length / 2 >= maxBonds) {
                truncated = true;
                break outer;
              }
              out.push(i, j);
            }
          }
        }
      }
    }
  }
  return { pairs: Uint32Array.from(out), truncated };
}
