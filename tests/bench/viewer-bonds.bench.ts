/**
 * The viewer's bond search on the CPU (the WebGL bench in viewer.bench.ts draws no bonds): fcc balls of
 * 10⁵ and 10⁶ atoms without a cell, bonds up to 3 Å (nearest neighbours at a/√2 = 2.86 Å, 12 per atom),
 * as the viewer asks for them when the bonds box is ticked. Median of 3 runs after one warm-up.
 */
import { bondPairs } from '../../lib/view/bonds';

/** fcc ball of about n points, a = 4.05 Å, centred on the origin (same lattice as app/lab/viewer). */
function fccBall(n: number): Float64Array {
  const a = 4.05;
  const basis = [0, 0, 0, 0.5, 0.5, 0, 0.5, 0, 0.5, 0, 0.5, 0.5];
  const r = Math.cbrt((3 * n) / (16 * Math.PI)) * a; // 4 atoms per a³ → ball of n atoms
  const m = Math.ceil(r / a) + 1;
  const out: number[] = [];
  for (let i = -m; i <= m; i++)
    for (let j = -m; j <= m; j++)
      for (let k = -m; k <= m; k++)
        for (let b = 0; b < 4; b++) {
          const x = (i + basis[3 * b]) * a;
          const y = (j + basis[3 * b + 1]) * a;
          const z = (k + basis[3 * b + 2]) * a;
          if (x * x + y * y + z * z <= r * r) out.push(x, y, z);
        }
  return Float64Array.from(out);
}

export default async function benchViewerBonds(): Promise<void> {
  for (const n of [100_000, 1_000_000]) {
    const p = fccBall(n);
    const N = p.length / 3;
    let bonds = 0;
    bondPairs(p, 3, { maxBonds: 10_000_000 });
    const times: number[] = [];
    for (let rep = 0; rep < 3; rep++) {
      const t0 = performance.now();
      bonds = bondPairs(p, 3, { maxBonds: 10_000_000 }).pairs.length / 2;
      times.push(performance.now() - t0);
    }
    times.sort((x, y) => x - y);
    console.log(`bondPairs N=${N} cutoff=3 Å: ${(times[1] / 1000).toFixed(3)} s (median of 3), ${bonds} bonds`);
  }
}
