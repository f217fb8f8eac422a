/**
 * Integer lattice helpers for planar approximants: the integer kernel of an integer matrix (the period
 * lattice of a rational cut) and Lagrange–Gauss reduction of a 2D basis.
 */

/**
 * Z-basis of {t ∈ Zⁿ : M t = 0} for an integer m×n matrix (row-major), by unimodular column operations
 * (Euclid on columns, tracking U with M·U in column echelon form; the columns of U past the pivots span
 * the kernel over Z because U is unimodular — Cohen, A Course in Computational Algebraic Number Theory,
 * 1993, §2.4). BigInt inside so no intermediate can overflow.
 */
export function integerKernel(M: number[][], n: number): number[][] {
  const m = M.length;
  const A = M.map((r) => r.map((v) => BigInt(v)));
  const U: bigint[][] = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 1n : 0n)));
  const colOp = (dst: number, src: number, q: bigint) => {
    for (let r = 0; r < m; r++) A[r][dst] -= q * A[r][src];
    for (let r = 0; r < n; r++) U[r][dst] -= q * U[r][src];
  };
  const swap = (a: number, b: number) => {
    for (let r = 0; r < m; r++) [A[r][a], A[r][b]] = [A[r][b], A[r][a]];
    for (let r = 0; r < n; r++) [U[r][a], U[r][b]] = [U[r][b], U[r][a]];
  };
  let col = 0;
  for (let row = 0; row < m && col < n; row++) {
    for (let c = col + 1; c < n; c++) {
      while (A[row][c] !== 0n) {
        colOp(col, c, A[row][col] / A[row][c]);
        swap(col, c);
      }
    }
    if (A[row][col] !== 0n) col++;
  }
  const out: number[][] = [];
  for (let c = col; c < n; c++) {
    const v = U.map((r) => r[c]);
    for (const x of v) {
      if (x > BigInt(Number.MAX_SAFE_INTEGER) || -x > BigInt(Number.MAX_SAFE_INTEGER)) {
        throw new RangeError('approximant: period vectors exceed the safe-integer range');
      }
    }
    out.push(v.map(Number));
  }
  return out;
}

/**
 * Lagrange–Gauss reduction of a 2D lattice basis given by integer vectors t1, t2 and their images a1, a2
 * under a linear map (the parallel projection). Returns the reduced pair, a pointing most along +x, det(a, b) > 0.
 */
export function reduceBasis2(
  t1: number[], t2: number[], proj: (t: number[]) => [number, number],
): { t: [number[], number[]]; a: [[number, number], [number, number]] } {
  let u = t1.slice(), v = t2.slice();
  let a = proj(u), b = proj(v);
  const n2 = (x: [number, number]) => x[0] * x[0] + x[1] * x[1];
  for (let iter = 0; iter < 200; iter++) {
    if (n2(b) < n2(a)) {
      [u, v] = [v, u];
      [a, b] = [b, a];
    }
    const mu = Math.round((a[0] * b[0] + a[1] * b[1]) / n2(a));
    if (mu === 0) break;
    v = v.map((x, i) => x - mu * u[i]);
    b = proj(v);
  }
  // Orientation: a is the one of ±u, ±v pointing most along +x (then +y); b the other, with det(a, b) > 0.
  const options: [number[], [number, number], number[], [number, number]][] = [
    [u, a, v, b], [u.map((x) => -x), [-a[0], -a[1]], v, b],
    [v, b, u, a], [v.map((x) => -x), [-b[0], -b[1]], u, a],
  ];
  const tolX = 1e-9 * Math.sqrt(n2(b));
  options.sort((p, q) => (Math.abs(q[1][0] - p[1][0]) > tolX ? q[1][0] - p[1][0] : q[1][1] - p[1][1]));
  const [tu, ta] = options[0];
  let [, , tv, tb] = options[0];
  if (ta[0] * tb[1] - ta[1] * tb[0] < 0) {
    tv = tv.map((x) => -x);
    tb = [-tb[0], -tb[1]];
  }
  return { t: [tu, tv], a: [ta, tb] };
}
