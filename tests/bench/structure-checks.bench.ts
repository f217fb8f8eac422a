/**
 * Checks at scale: minimum distance, shell histogram and mergeClose on fcc Al blocks of 1e5 and 1e6
 * atoms in a periodic cell. Target (ours): 1e6 atoms minimum distance well under 10 s on one core.
 */
import { mergeClose, minimumDistance, shellHistogram, type Structure } from '../../lib/structure';

function fcc(a: number, n: number): Structure {
  const pos = new Float64Array(4 * 3 * n ** 3);
  const basis = [0, 0, 0, 0.5, 0.5, 0, 0.5, 0, 0.5, 0, 0.5, 0.5];
  let m = 0;
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++)
      for (let k = 0; k < n; k++)
        for (let b = 0; b < 4; b++) {
          pos[m++] = (i + basis[3 * b]) * a;
          pos[m++] = (j + basis[3 * b + 1]) * a;
          pos[m++] = (k + basis[3 * b + 2]) * a;
        }
  return {
    positions: pos,
    species: new Uint16Array(pos.length / 3).fill(13),
    cell: [
      [n * a, 0, 0],
      [0, n * a, 0],
      [0, 0, n * a],
    ],
    provenance: { engine: 'bench', params: null },
  };
}

function time<T>(label: string, f: () => T): T {
  const t0 = performance.now();
  const r = f();
  console.log(`${label}: ${((performance.now() - t0) / 1000).toFixed(2)} s`);
  return r;
}

export default async function benchStructureChecks(): Promise<void> {
  for (const n of [30, 63]) {
    const s = fcc(4.0495, n);
    const N = s.species.length;
    const d = time(`minimumDistance N=${N}`, () => minimumDistance(s, { threshold: 2.5 }));
    console.log(`  min ${d.distance.toFixed(4)} Å, pairs below 2.5 Å: ${d.belowCount}`);
    time(`shellHistogram N=${N} rMax=6 Å`, () => shellHistogram(s, 6, 120));
    time(`mergeClose N=${N} tol=0.1 Å`, () => mergeClose(s, 0.1));
  }
}
