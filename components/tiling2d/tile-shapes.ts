/**
 * The tiles of a chain or planar cut grouped by shape as drawn: kind, corner angles (planar) or length
 * (chain), each measured on the unwrapped tile (lib/view/unwrap-tile.ts). A rhombus tiling has exactly one
 * shape per kind, so a second line for a kind — a "thick 5°" — means the tiles are read wrongly.
 */
import type { Structure } from '@/lib/structure/types';
import { periodicityOf, unwrapTile } from '@/lib/view/unwrap-tile';

export interface TileShape {
  /** Index into tiles.kinds (colour). */
  kind: number;
  name: string;
  /** "72°/108°" for a rhombus, "1.000 Å" for a chain segment. */
  shape: string;
  count: number;
}

export function tileShapes(s: Structure): TileShape[] {
  const t = s.tiles;
  if (!t) return [];
  const periodicity = periodicityOf(s);
  const k = t.cornersPerTile;
  const xy = new Float64Array(2 * k);
  const byKey = new Map<string, TileShape>();
  for (let ti = 0; ti < t.kind.length; ti++) {
    unwrapTile(s.positions, t, ti, periodicity, xy);
    let shape: string;
    if (k === 2) {
      shape = `${Math.abs(xy[2] - xy[0]).toFixed(3)} Å`;
    } else {
      const angles = new Set<number>();
      for (let c = 0; c < k; c++) {
        const u = (c + k - 1) % k;
        const w = (c + 1) % k;
        const ax = xy[2 * u] - xy[2 * c], ay = xy[2 * u + 1] - xy[2 * c + 1];
        const bx = xy[2 * w] - xy[2 * c], by = xy[2 * w + 1] - xy[2 * c + 1];
        const cos = (ax * bx + ay * by) / (Math.hypot(ax, ay) * Math.hypot(bx, by));
        angles.add(Math.round((Math.acos(Math.max(-1, Math.min(1, cos))) * 180) / Math.PI));
      }
      shape = [...angles].sort((a, b) => a - b).map((a) => `${a}°`).join('/');
    }
    const key = `${t.kind[ti]}|${shape}`;
    const e = byKey.get(key);
    if (e) e.count++;
    else byKey.set(key, { kind: t.kind[ti], name: t.kinds[t.kind[ti]], shape, count: 1 });
  }
  return [...byKey.values()].sort((a, b) => a.kind - b.kind || b.count - a.count);
}
