/**
 * Direct sums at Cartesian scattering vectors Q (Å⁻¹, phase Q·r, no 2π):  A_g(Q) = Σ_{j∈g} w_j e^{iQ·r_j}.
 *
 * qListPartialSums: arbitrary Q, one cos+sin per term (for a handful of points).
 * gridPartialSums: Q = q0 + a·du + b·dv on an na × nb grid. Along each grid row the phase factor is
 * advanced by one complex multiplication with e^{i du·r} (a recurrence, no trigonometry per term);
 * each row start is computed directly so rounding drift never exceeds one row (≈ na·ε).
 */

export function qListPartialSums(
  positions: Float64Array,
  groupOf: Uint16Array,
  weight: Float64Array,
  q: Float64Array,
  re: Float64Array,
  im: Float64Array,
  j0 = 0,
  j1 = groupOf.length,
): void {
  const m = q.length / 3;
  for (let j = j0; j < j1; j++) {
    const w = weight[j];
    if (w === 0) continue;
    const x = positions[3 * j];
    const y = positions[3 * j + 1];
    const z = positions[3 * j + 2];
    const base = groupOf[j] * m;
    for (let i = 0; i < m; i++) {
      const p = q[3 * i] * x + q[3 * i + 1] * y + q[3 * i + 2] * z;
      re[base + i] += w * Math.cos(p);
      im[base + i] += w * Math.sin(p);
    }
  }
}

export interface PlaneGrid {
  q0: [number, number, number];
  du: [number, number, number];
  dv: [number, number, number];
  na: number;
  nb: number;
}

/** Grid point (a, b) is stored at index b·na + a; group-major in re/im (g·na·nb + …). */
export function gridPartialSums(
  positions: Float64Array,
  groupOf: Uint16Array,
  weight: Float64Array,
  grid: PlaneGrid,
  re: Float64Array,
  im: Float64Array,
  j0 = 0,
  j1 = groupOf.length,
): void {
  const { q0, du, dv, na, nb } = grid;
  const cells = na * nb;
  for (let j = j0; j < j1; j++) {
    const w = weight[j];
    if (w === 0) continue;
    const x = positions[3 * j];
    const y = positions[3 * j + 1];
    const z = positions[3 * j + 2];
    const pu = du[0] * x + du[1] * y + du[2] * z;
    const sr = Math.cos(pu);
    const si = Math.sin(pu);
    const p0 = q0[0] * x + q0[1] * y + q0[2] * z;
    const pv = dv[0] * x + dv[1] * y + dv[2] * z;
    const base = groupOf[j] * cells;
    for (let b = 0; b < nb; b++) {
      const p = p0 + b * pv;
      let cr = w * Math.cos(p);
      let ci = w * Math.sin(p);
      let m = base + b * na;
      for (let a = 0; a < na; a++, m++) {
        re[m] += cr;
        im[m] += ci;
        const t = cr * sr - ci * si;
        ci = cr * si + ci * sr;
        cr = t;
      }
    }
  }
}
