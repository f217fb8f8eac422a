/**
 * Starting points offered when a project is created. (Written by the accounts work because it was
 * needed first; the lead owns this file and may replace the params as the engines' schemas land.)
 */
import type { ModelParamsInput } from './params';

export interface Starter {
  id: string;
  title: string;
  description: string;
  params: ModelParamsInput;
}

export const STARTERS: Starter[] = [
  {
    id: 'fibonacci',
    title: 'Fibonacci chain',
    description: 'A 1D cut of the square lattice: long and short segments, or their periodic F(n+1)/F(n) approximant.',
    params: { family: 'fibonacci', order: 10, approximant: true },
  },
  {
    id: 'penrose',
    title: 'Penrose patch',
    description: 'A finite rhombus tiling cut from the 5D lattice, round patch of a chosen radius.',
    params: { family: 'penrose', radius: 10, edge: 1 },
  },
  {
    id: 'octagonal',
    title: 'Octagonal approximant',
    description: 'Squares and 45° rhombi cut from the 4D lattice: the periodic 12/5 approximant, a square cell of 239 vertices.',
    // 12/5 is the third convergent of 1+√2 (2/1, 5/2, 12/5): a cell that cuts in milliseconds yet holds both
    // tiles in about the quasicrystal's proportion (140 rhombi : 99 squares ≈ √2). Output pinned in golden.test.ts.
    params: { family: 'octagonal', approximant: { p: 12, q: 5 }, edge: 1 },
  },
  {
    id: 'icosahedral',
    title: 'Icosahedral approximant',
    description: 'A cubic p/q approximant of the 6D icosahedral lattice, ready to decorate.',
    params: { family: 'icosahedral', mode: 'approximant', order: '2/1', aR: 4.6, lattice: 'P' },
  },
  {
    id: 'decagonal',
    title: 'Decagonal model',
    description: 'Penrose-tiled layers stacked periodically along the tenfold axis.',
    params: { family: 'decagonal', radius: 8, edge: 2.45, layers: 2, spacing: 2.04 },
  },
];
