/**
 * Vertex environments of a chain or planar tiling: which tiles meet at each vertex, and at what corner
 * angle. A vertex is "complete" when its corner angles sum to 360° (1D: it has one segment on each side);
 * vertices on the rim of a finite patch are left out of the count. A periodic cut (approximant) has no
 * rim: each tile is unwrapped across the cell edges first (lib/view/unwrap-tile.ts), so every vertex of the
 * cell is counted with all its tiles, once. For the Penrose rhombus tiling these signatures separate seven
 * of de Bruijn's eight vertex types (1981; his S and S5 both read "thick 72° ×5").
 */
import type { Structure } from '@/lib/structure/types';
import { periodicityOf, unwrapTile } from '@/lib/view/unwrap-tile';

export interface VertexConfig {
  /** e.g. "thick 72° ×5" or "L | S". */
  signature: string;
  count: number;
}

export interface VertexConfigurations {
  configs: VertexConfig[];
  /** Vertices with a full set of tiles around them. */
  complete: number;
  /** Vertices left out: on the rim of a patch (or, in a periodic cell, not closed — which would be a defect). */
  rim: number;
  /** Counted over periodic boundaries (the cut has a cell). */
  periodic: boolean;
}

export function vertexConfigurations(s: Structure): VertexConfigurations {
  const t = s.tiles;
  const periodicity = periodicityOf(s);
  const periodic = periodicity.kind !== 'none';
  if (!t) return { configs: [], complete: 0, rim: 0, periodic };
  const n = s.species.length;
  const P = s.positions;
  const per: string[][] = Array.from({ length: n }, () => []);
  const angle = new Float64Array(n);
  const k = t.cornersPerTile;
  const tiles = t.kind.length;
  const xy = new Float64Array(2 * k);
  for (let ti = 0; ti < tiles; ti++) {
    const kind = t.kinds[t.kind[ti]];
    unwrapTile(P, t, ti, periodicity, xy);
    if (k === 2) {
      const a = t.corners[2 * ti];
      const b = t.corners[2 * ti + 1];
      const [left, right] = xy[0] <= xy[2] ? [a, b] : [b, a];
      per[left].push(`R${kind}`);
      per[right].push(`L${kind}`);
      continue;
    }
    for (let c = 0; c < k; c++) {
      const v = t.corners[k * ti + c];
      const u = (c + k - 1) % k;
      const w = (c + 1) % k;
      const ax = xy[2 * u] - xy[2 * c];
      const ay = xy[2 * u + 1] - xy[2 * c + 1];
      const bx = xy[2 * w] - xy[2 * c];
      const by = xy[2 * w + 1] - xy[2 * c + 1];
      const deg = (Math.acos(Math.max(-1, Math.min(1, (ax * bx + ay * by) / (Math.hypot(ax, ay) * Math.hypot(bx, by))))) * 180) / Math.PI;
      per[v].push(`${kind} ${Math.round(deg)}°`);
      angle[v] += deg;
    }
  }
  const counts = new Map<string, number>();
  let complete = 0;
  let rim = 0;
  for (let v = 0; v < n; v++) {
    const list = per[v];
    if (list.length === 0) continue;
    let sig: string;
    if (k === 2) {
      // One segment ending here from the left and one starting here to the right; anything else is a chain end.
      const l = list.filter((x) => x[0] === 'L');
      const r = list.filter((x) => x[0] === 'R');
      if (l.length !== 1 || r.length !== 1) {
        rim++;
        continue;
      }
      sig = `${l[0].slice(1)} | ${r[0].slice(1)}`;
    } else {
      if (Math.abs(angle[v] - 360) > 0.5) {
        rim++;
        continue;
      }
      const m = new Map<string, number>();
      for (const x of list) m.set(x, (m.get(x) ?? 0) + 1);
      sig = [...m.entries()]
        .sort((a, b) => (a[0] < b[0] ? -1 : 1))
        .map(([x, c]) => (c > 1 ? `${x} ×${c}` : x))
        .join(', ');
    }
    complete++;
    counts.set(sig, (counts.get(sig) ?? 0) + 1);
  }
  const configs = [...counts.entries()].map(([signature, count]) => ({ signature, count })).sort((a, b) => b.count - a.count || (a.signature < b.signature ? -1 : 1));
  return { configs, complete, rim, periodic };
}
