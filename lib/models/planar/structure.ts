import type { Cell, SiteClass, Structure } from '../../structure/types';
import { ENGINE_VERSION } from '../../version';
import type { PlanarResult } from './spec';

/** Height of the c axis given to planar approximant cells so periodic exports work; only a, b are meaningful. */
export const PLANAR_PADDING = 10;

/**
 * A planar tiling as a Structure: dim 2, z = 0, species 0 (vertex, written X), perpDim 2,
 * site = hyperlattice index level ΣK_j (site class "index ι"; one class "vertex" when levels are unused).
 */
export function planarStructure(
  r: PlanarResult,
  kinds: string[],
  edge: number,
  params: unknown,
  useLevels: boolean,
): Structure {
  const N = r.xy.length / 2;
  const positions = new Float64Array(3 * N);
  const perp = new Float64Array(2 * N);
  for (let i = 0; i < N; i++) {
    positions[3 * i] = r.xy[2 * i] * edge;
    positions[3 * i + 1] = r.xy[2 * i + 1] * edge;
    perp[2 * i] = r.perp[2 * i] * edge;
    perp[2 * i + 1] = r.perp[2 * i + 1] * edge;
  }
  let site: Uint16Array;
  let siteClasses: SiteClass[];
  if (useLevels) {
    const levels = Array.from(new Set(r.level)).sort((a, b) => a - b);
    siteClasses = levels.map((l) => ({ name: `index ${l}`, species: 0 }));
    // Class of each level by a table over the (few, consecutive-ish) levels present.
    const low = levels[0];
    const classOf = new Uint16Array(levels[levels.length - 1] - low + 1);
    levels.forEach((l, i) => (classOf[l - low] = i));
    site = new Uint16Array(N);
    for (let i = 0; i < N; i++) site[i] = classOf[r.level[i] - low];
  } else {
    siteClasses = [{ name: 'vertex', species: 0 }];
    site = new Uint16Array(N);
  }
  const s: Structure = {
    positions,
    species: new Uint16Array(N),
    site,
    siteClasses,
    perp,
    perpDim: 2,
    dim: 2,
    tiles: { kinds, kind: r.kind, cornersPerTile: 4, corners: r.corners },
    provenance: { params, engine: ENGINE_VERSION },
  };
  if (r.cell) {
    const [[ax, ay], [bx, by]] = r.cell;
    const cell: Cell = [[ax * edge, ay * edge, 0], [bx * edge, by * edge, 0], [0, 0, PLANAR_PADDING]];
    s.cell = cell;
  }
  return s;
}
