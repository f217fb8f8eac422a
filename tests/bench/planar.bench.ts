/** 1D/2D cut-and-project throughput: points per second for the chain, Penrose and Ammann–Beenker patches. */
import { generate } from '../../lib/models';

function time(label: string, make: () => { species: Uint16Array }): void {
  const t0 = performance.now();
  const s = make();
  const ms = performance.now() - t0;
  console.log(`${label.padEnd(34)} ${String(s.species.length).padStart(9)} points  ${ms.toFixed(0).padStart(6)} ms  ${(s.species.length / ms / 1000).toFixed(2)} Mpoints/s`);
}

export default async function planarBench(): Promise<void> {
  time('chain order 28', () => generate({ family: 'fibonacci', order: 28 }));
  time('penrose radius 100', () => generate({ family: 'penrose', radius: 100 }));
  time('penrose radius 200', () => generate({ family: 'penrose', radius: 200 }));
  time('octagonal radius 200', () => generate({ family: 'octagonal', radius: 200 }));
  time('penrose approximant 34/21', () => generate({ family: 'penrose', approximant: { p: 34, q: 21 } }));
}
