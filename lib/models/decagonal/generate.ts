/**
 * Decagonal model: Penrose rhombus layers (penrose.ts) stacked periodically along z — quasiperiodic in the
 * plane, periodic along c.
 *
 * Layer k (k = 0 … layers−1) is the layer tiling moved by k·(shift_x, shift_y, spacing); with the default
 * 'screw' stacking the odd layers are first turned by 36° about the tenfold axis through the origin. For the
 * Penrose vertex set this turn is the point inversion (x, y) → (−x, −y) with the perpendicular window
 * inverted (u⊥ → −u⊥, index level ι → 5 − ι): the turn by 36° is the inversion followed by a turn by 144°, a
 * symmetry of the five-fold pentagrid (de Bruijn 1981). It makes the 10₅ screw axis of the decagonal
 * quasicrystals, whose period along the tenfold axis is two layers (≈ 4 Å in d-Al–Ni–Co; Steurer, Z.
 * Kristallogr. 219 (2004) 391, and Steurer & Deloudi, Crystallography of Quasicrystals (2009) — from memory):
 * the reflections with odd l of the two-layer cell are present. 'translation' stacks identical layers.
 * - Quasiperiodic (radius): the layers of one c period are listed; there is no cell, because the plane is
 *   aperiodic. The stacking period is c = layers·(shift_x, shift_y, spacing), recorded in provenance only.
 * - Approximant (p/q): the planar approximant cell a, b (rectangular for the τ convergents) and
 *   c = layers·(shift_x, shift_y, spacing); orthorhombic when the shift is zero, otherwise monoclinic with c
 *   tilted by the accumulated shift. In-plane positions are wrapped into the cell (fractional [0,1), with
 *   the same 1e-9 rule as the planar cell).
 * Perp coordinates (perpDim 2) and index-level site classes are those of the layer tiling.
 */
import { checkPointCap } from '../point-cap';
import type { DecagonalParams } from './schema';
import { atomicNumber } from '../../structure/elements';
import { buildPlanar } from '../planar/cut';
import { planarCount } from '../planar/estimate';
import { penroseSpec } from '../penrose/generate';
import { planarStructure } from '../planar/structure';
import { ENGINE_VERSION } from '../../version';
import type { Cell, Structure } from '../../structure/types';

/** Expected number of points: one Penrose layer's count times the layers per period. */
export function decagonalCount(p: DecagonalParams): number {
  return planarCount(penroseSpec(p.gamma ?? [0, 0, 0, 0, 0], p.approximant), p) * p.layers;
}

export function decagonalModel(p: DecagonalParams): Structure {
  const { layers, spacing, shift, edge } = p;
  const screw = p.stacking !== 'translation';
  if (screw && layers % 2 !== 0) throw new Error(`layers: the 10₅ screw stacking needs an even number of layers, got ${layers}`);
  const spec = penroseSpec(p.gamma ?? [0, 0, 0, 0, 0], p.approximant);
  // Size estimate before anything is allocated.
  checkPointCap(decagonalCount(p), p.maxPoints, `${layers} decagonal layers`);
  const r = buildPlanar(spec, p.approximant ? { approximant: true } : { radius: p.radius! / edge }, p.maxPoints);
  const layer = planarStructure(r, ['thick', 'thin'], edge, null, true);

  const m = layer.species.length;
  const N = m * layers;
  checkPointCap(N, p.maxPoints, `${layers} decagonal layers`);
  const positions = new Float64Array(3 * N);
  const perp = new Float64Array(2 * N);
  const site = new Uint16Array(N);
  let cell: Cell | undefined;
  let wrap: ((x: number, y: number) => [number, number]) | undefined;
  if (layer.cell) {
    const [a, b] = layer.cell;
    cell = [a, b, [layers * shift[0], layers * shift[1], layers * spacing]];
    const det = a[0] * b[1] - a[1] * b[0];
    wrap = (x, y) => {
      let f = (x * b[1] - y * b[0]) / det, g = (a[0] * y - a[1] * x) / det;
      f -= Math.floor(f + 1e-9);
      g -= Math.floor(g + 1e-9);
      return [f * a[0] + g * b[0], f * a[1] + g * b[1]];
    };
  }
  // Inverted layers: index level ι → 5 − ι (the class named "index 5−ι" when the layer has it).
  const classes = layer.siteClasses ?? [];
  const invertedSite = classes.map((c, k) => {
    const lv = /^index (\d)$/.exec(c.name);
    const j = lv ? classes.findIndex((d) => d.name === `index ${5 - Number(lv[1])}`) : -1;
    return j >= 0 ? j : k;
  });
  for (let k = 0; k < layers; k++) {
    const turn = screw && k % 2 === 1 ? -1 : 1;
    for (let i = 0; i < m; i++) {
      const o = k * m + i;
      let x = turn * layer.positions[3 * i] + k * shift[0];
      let y = turn * layer.positions[3 * i + 1] + k * shift[1];
      if (wrap) [x, y] = wrap(x, y);
      positions[3 * o] = x;
      positions[3 * o + 1] = y;
      positions[3 * o + 2] = k * spacing;
      perp[2 * o] = turn * layer.perp![2 * i];
      perp[2 * o + 1] = turn * layer.perp![2 * i + 1];
      site[o] = turn < 0 ? invertedSite[layer.site![i]] : layer.site![i];
    }
  }
  const s: Structure = {
    positions,
    species: new Uint16Array(N).fill(p.species ? atomicNumber(p.species) : 0),
    site,
    siteClasses: p.species ? layer.siteClasses!.map((c) => ({ ...c, species: atomicNumber(p.species!) })) : layer.siteClasses,
    perp,
    perpDim: 2,
    dim: 3,
    provenance: {
      params: p,
      engine: ENGINE_VERSION,
    },
  };
  if (cell) s.cell = cell;
  return s;
}
