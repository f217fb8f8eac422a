/** Expected vertex counts of planar cuts (Penrose, Ammann–Beenker, and the layers of decagonal stacks). */
import { approximantCell, type PlanarSpec } from './cut';

/**
 * Planar patches keep whole tiles whose centre lies inside the radius, so their vertices fill a disc
 * about 0.65 edge wider (fitted to our own Penrose and Ammann–Beenker cuts of radius 3–40 edges:
 * 0.46–0.81; an estimate, not a bound).
 */
const RIM = 0.65;

/** Area of the approximant cell of this spec, in edge² units. */
export function planarCellArea(spec: PlanarSpec): number {
  const [[ax, ay], [bx, by]] = approximantCell(spec).a;
  return Math.abs(ax * by - ay * bx);
}

/** Vertices of one planar cut: density × cell area, or density × the rim-widened disc of a patch. */
export function planarCount(spec: PlanarSpec, p: { approximant?: unknown; radius?: number; edge: number }): number {
  if (p.approximant) return spec.density * planarCellArea(spec);
  return spec.density * Math.PI * (p.radius! / p.edge + RIM) ** 2;
}
