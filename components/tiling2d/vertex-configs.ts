/**
 * Vertex environments of a chain or planar tiling: which tiles meet at each vertex, and at what corner
 * angle. A vertex is "complete" when its corner angles sum to 360° (1D: it has a segment on both sides);
 * vertices on the patch rim are left out of the count. For the Penrose rhombus tiling these signatures
 * separate seven of de Bruijn's eight vertex types (1981; his S and S5 both read "thick 72° ×5").
 */
import type { Structure } from '@/lib/structure/types';

export interface VertexConfig {
  /** e.g. "thick 72° ×5" or "L | S". */
  signature: string;
  count: number;
}

export function vertexConfigurations(s: Structure): { configs: VertexConfig[]; complete: number; rim: number } {
  const t = s.tiles;
  if (!t) return { configs: [], complete: 0, rim: 0 };
  const n = s.species.length;
  const P = s.positions;
  const per: string[][] = Array.from({ length: n }, () => []);
  const angle: number[] = new Array(n).fill(0);
  const k = t.cornersPerTile;
  const tiles = t.kind.length;
  for (let ti = 0; ti < tiles; ti++) {
    const kind = t.kinds[t.kind[ti]];
    if (k === 2) {
      const a = t.corners[2 * ti];
      const b = t.corners[2 * ti + 1];
      const [left, right] = P[3 * a] <= P[3 * b] ? [a, b] : [b, a];
      per[left].push(`R${kind}`);
      per[right].push(`L${kind}`);
      continue;
    }
    for (let c = 0; c < k; c++) {
      const v = t.corners[k * ti + c];
      const u = t.corners[k * ti + ((c + k - 1) % k)];
      const w = t.corners[k * ti + ((c + 1) % k)];
      const ax = P[3 * u] - P[3 * v];
      const ay = P[3 * u + 1] - P[3 * v + 1];
      const bx = P[3 * w] - P[3 * v];
      const by = P[3 * w + 1] - P[3 * v + 1];
      const deg = (Math.acos(Math.max(-1, Math.min(1, (ax * bx + ay * by) / (Math.hypot(ax, ay) * Math.hypot(bx, by))))) * 180) / Math.PI;
      const rounded = Math.round(deg);
      per[v].push(`${kind} ${rounded}°`);
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
      if (list.length < 2) {
        rim++;
        continue;
      }
      const l = list.find((x) => x[0] === 'L')!.slice(1);
      const r = list.find((x) => x[0] === 'R')!.slice(1);
      sig = `${l} | ${r}`;
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
  const configs = [...counts.entries()].map(([signature, count]) => ({ signature, count })).sort((a, b) => b.count - a.count);
  return { configs, complete, rim };
}
