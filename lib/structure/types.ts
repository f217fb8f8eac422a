/**
 * The one type every stage of Tauforge takes and returns (see DESIGN.md).
 * Coordinates are Cartesian, in ångström, packed x y z x y z … in a Float64Array.
 * 1D and 2D models (chains, tilings) use the same type with z (and y) = 0.
 */
import type { Cell } from '../math/cell';
import type { Vec3 } from '../math/vec3';
import type { ModelParams } from '../models/params';

// The vector and cell types live with their maths in lib/math; re-exported so a Structure's parts come from one place.
export type { Cell, Vec3 };

/** One kind of site: which occupation domain or cluster shell an atom came from. */
export interface SiteClass {
  /** Short label shown to the user, e.g. "node", "body centre", "Mackay shell 2". */
  name: string;
  /** Atomic number of the majority species (0 = unassigned vertex, written as element X). */
  species: number;
  /** Mixed occupancy: atomic number → fraction (fractions sum to ≤ 1). */
  mix?: Record<number, number>;
  /** Site occupancy 0..1 (default 1). */
  occupancy?: number;
  /** Isotropic displacement parameter B in Å² (default 0). */
  biso?: number;
}

/** Typed tiles of a 1D or 2D tiling, indexing into the points of the Structure. */
export interface TileSet {
  /** Tile type names, e.g. ["thick", "thin"] or ["square", "rhombus"] or ["L", "S"]. */
  kinds: string[];
  /** kinds index per tile. */
  kind: Uint8Array;
  /** Number of corners per tile (2 for chain segments, 4 for rhombi and squares). */
  cornersPerTile: number;
  /** Point indices, cornersPerTile per tile, in order around the tile. */
  corners: Uint32Array;
}

export interface Provenance {
  /** The validated Params the structure was generated from (or a description of the file it was read from). */
  params: unknown;
  /** Engine version string, see lib/version.ts. */
  engine: string;
}

export interface Structure {
  /** xyz xyz … in Å, Cartesian. length = 3·N. */
  positions: Float64Array;
  /** Atomic numbers (0 = unassigned tiling vertex). length = N. */
  species: Uint16Array;
  /** Index into siteClasses per point. */
  site?: Uint16Array;
  siteClasses?: SiteClass[];
  /** Perpendicular-space coordinates of each point when it came from a cut; perpDim per point. */
  perp?: Float64Array;
  /** Dimension of perpendicular space (1 chain, 2 planar tilings, 3 icosahedral). */
  perpDim?: number;
  /** Per-atom occupancy 0..1 (absent = 1 for every atom). */
  occupancy?: Float64Array;
  /** Present ⇔ periodic (approximant or crystal). */
  cell?: Cell;
  /** Dimension of parallel space the model lives in (1, 2 or 3; default 3). */
  dim?: 1 | 2 | 3;
  /** Tiles, for chains and planar tilings. */
  tiles?: TileSet;
  /** What generation did that the user should know: clusters placed, atoms merged. */
  notes?: string[];
  /** The validated model this cut was generated from (absent for structures read from files). */
  model?: ModelParams;
  provenance: Provenance;
}

/** Number of points in a structure. */
export function atomCount(s: Structure): number {
  return s.species.length;
}
