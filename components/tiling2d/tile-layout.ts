/**
 * What the tiling view draws, in model coordinates (Å, y up): every tile unwrapped, and for a periodic
 * cut the translates that fall on the shown cells (`repeat` × `repeat` of them, drawn in full and clipped to
 * the cells) or on a margin of about one and a half edges around them (drawn faded, so the cell edge reads
 * as a cut through a continuing tiling rather than as the end of it). Pure, so it is tested on its own.
 */
import type { Structure } from '@/lib/structure/types';
import { periodicityOf, unwrapTile, type Periodicity } from '@/lib/view/unwrap-tile';
import type { Vec2 } from '@/lib/view/lattice2';

/** Layer bits of a drawn tile image. */
export const MAIN = 1;
export const CONTEXT = 2;

export interface TileLayout {
  periodicity: Periodicity['kind'];
  cornersPerTile: number;
  /** Unwrapped corners of each drawn image: x y per corner, cornersPerTile corners per image. */
  polygons: Float64Array;
  /** Tile kind of each image. */
  kind: Uint8Array;
  /** MAIN and/or CONTEXT per image. */
  layer: Uint8Array;
  count: number;
  /** More images would have been drawn than maxImages. */
  truncated: boolean;
  /** Bounding box of everything shown, in Å. */
  box: { x0: number; y0: number; x1: number; y1: number };
  /** Outlines of the shown cells (periodic planar cuts), four corners each. */
  cells: Vec2[][];
  /** The shown cells as one outline (clip of the MAIN layer), and the margin around them (clip of CONTEXT). */
  mainClip: Vec2[] | null;
  contextClip: Vec2[] | null;
  /** x of cell boundaries along a periodic chain. */
  chainBounds: number[];
}

export function layoutTiles(s: Structure, repeat = 1, maxImages = 20000): TileLayout | null {
  const t = s.tiles;
  if (!t || t.kind.length === 0) return null;
  const periodicity = periodicityOf(s);
  const k = t.cornersPerTile;
  const tiles = t.kind.length;
  const R = Math.max(1, Math.floor(repeat));
  let polygons = new Float64Array(2 * k * Math.min(tiles, maxImages));
  let kind = new Uint8Array(polygons.length / (2 * k));
  let layer = new Uint8Array(kind.length);
  let count = 0;
  let truncated = false;
  const push = (src: Float64Array, dx: number, dy: number, kd: number, bits: number): boolean => {
    if (count >= maxImages) {
      truncated = true;
      return false;
    }
    if (count >= kind.length) {
      const p2 = new Float64Array(2 * polygons.length);
      p2.set(polygons);
      polygons = p2;
      const k2 = new Uint8Array(2 * kind.length);
      k2.set(kind);
      kind = k2;
      const l2 = new Uint8Array(2 * layer.length);
      l2.set(layer);
      layer = l2;
    }
    for (let c = 0; c < k; c++) {
      polygons[2 * k * count + 2 * c] = src[2 * c] + dx;
      polygons[2 * k * count + 2 * c + 1] = src[2 * c + 1] + dy;
    }
    kind[count] = kd;
    layer[count] = bits;
    count++;
    return true;
  };
  const xy = new Float64Array(2 * k);
  const out = (box: TileLayout['box'], extra: Partial<TileLayout> = {}): TileLayout => ({
    periodicity: periodicity.kind,
    cornersPerTile: k,
    polygons: polygons.slice(0, 2 * k * count),
    kind: kind.slice(0, count),
    layer: layer.slice(0, count),
    count,
    truncated,
    box,
    cells: [],
    mainClip: null,
    contextClip: null,
    chainBounds: [],
    ...extra,
  });

  if (periodicity.kind === 'none') {
    let x0 = Infinity, x1 = -Infinity, y0 = Infinity, y1 = -Infinity;
    for (let ti = 0; ti < tiles; ti++) {
      unwrapTile(s.positions, t, ti, periodicity, xy);
      for (let c = 0; c < k; c++) {
        x0 = Math.min(x0, xy[2 * c]);
        x1 = Math.max(x1, xy[2 * c]);
        y0 = Math.min(y0, xy[2 * c + 1]);
        y1 = Math.max(y1, xy[2 * c + 1]);
      }
      if (!push(xy, 0, 0, t.kind[ti], MAIN)) break;
    }
    return out({ x0, y0, x1, y1 });
  }

  if (periodicity.kind === 'chain') {
    const P = periodicity.period;
    // Margin: the longest segment, so the neighbouring cells' first and last segments show.
    let m = 0;
    for (let ti = 0; ti < tiles; ti++) {
      unwrapTile(s.positions, t, ti, periodicity, xy);
      m = Math.max(m, xy[2] - xy[0]);
    }
    for (let i = -1; i <= R && !truncated; i++) {
      for (let ti = 0; ti < tiles; ti++) {
        unwrapTile(s.positions, t, ti, periodicity, xy);
        const a = xy[0] + i * P, b = xy[2] + i * P;
        if (b <= -m || a >= R * P + m) continue;
        const inside = a >= 0 && b <= R * P + 1e-9 * P;
        if (!push(xy, i * P, 0, t.kind[ti], inside ? MAIN : CONTEXT)) break;
      }
    }
    return out({ x0: -m, y0: 0, x1: R * P + m, y1: 0 }, { chainBounds: Array.from({ length: R + 1 }, (_, i) => i * P) });
  }

  const L = periodicity.lattice;
  const [ax, ay] = L.a;
  const [bx, by] = L.b;
  const area = Math.abs(L.det);
  unwrapTile(s.positions, t, 0, periodicity, xy);
  const edge = Math.hypot(xy[2] - xy[0], xy[3] - xy[1]);
  const margin = 1.5 * edge;
  // Fractional widths of the margin: f = 1 and f = 0 are lines |det|/|b| apart, likewise g and |a|.
  const mf = margin / (area / Math.hypot(bx, by));
  const mg = margin / (area / Math.hypot(ax, ay));
  const fg = new Float64Array(2 * k);
  outer: for (let ti = 0; ti < tiles; ti++) {
    unwrapTile(s.positions, t, ti, periodicity, xy);
    let f0 = Infinity, f1 = -Infinity, g0 = Infinity, g1 = -Infinity;
    for (let c = 0; c < k; c++) {
      const [f, g] = L.fractional(xy[2 * c], xy[2 * c + 1]);
      fg[2 * c] = f;
      fg[2 * c + 1] = g;
      f0 = Math.min(f0, f);
      f1 = Math.max(f1, f);
      g0 = Math.min(g0, g);
      g1 = Math.max(g1, g);
    }
    for (let i = Math.ceil(-mf - f1); i <= Math.floor(R + mf - f0); i++) {
      for (let j = Math.ceil(-mg - g1); j <= Math.floor(R + mg - g0); j++) {
        // Fractional bounding boxes: a superset of the tiles that meet each region; the clip trims the rest.
        const meetsCells = f0 + i < R && f1 + i > 0 && g0 + j < R && g1 + j > 0;
        const insideCells = f0 + i >= 0 && f1 + i <= R && g0 + j >= 0 && g1 + j <= R;
        const bits = (meetsCells ? MAIN : 0) | (insideCells ? 0 : CONTEXT);
        if (!push(xy, i * ax + j * bx, i * ay + j * by, t.kind[ti], bits)) break outer;
      }
    }
  }
  const at = (f: number, g: number): Vec2 => [f * ax + g * bx, f * ay + g * by];
  const quad = (f0: number, g0: number, f1: number, g1: number): Vec2[] => [at(f0, g0), at(f1, g0), at(f1, g1), at(f0, g1)];
  const contextClip = quad(-mf, -mg, R + mf, R + mg);
  const cells: Vec2[][] = [];
  for (let i = 0; i < R; i++) for (let j = 0; j < R; j++) cells.push(quad(i, j, i + 1, j + 1));
  const xs = contextClip.map((p) => p[0]);
  const ys = contextClip.map((p) => p[1]);
  return out(
    { x0: Math.min(...xs), y0: Math.min(...ys), x1: Math.max(...xs), y1: Math.max(...ys) },
    { cells, mainClip: quad(0, 0, R, R), contextClip },
  );
}
