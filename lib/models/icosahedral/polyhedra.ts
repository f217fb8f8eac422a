import { icosahedralDirections } from './hyperlattice';

/**
 * Named polyhedra as vertex sets about the origin, scaled to a circumradius (Å).
 *
 * Orientation (shared with hyperlattice.ts): the icosahedron's twelve vertices lie along ±u_i, the six
 * five-fold axes that are the e_i∥ directions of the 6D basis — the cyclic permutations of (0, ±1, ±τ).
 * The other icosahedral solids are built from that icosahedron so they share its axes:
 *   dodecahedron          = directions of the icosahedron's 20 face centres (three-fold axes);
 *   icosidodecahedron     = directions of its 30 edge midpoints (two-fold axes);
 *   truncated icosahedron = the points 1/3 and 2/3 along each of its 30 edges (60 vertices);
 *   rhombic triacontahedron = the zonohedron Σ_i [−u_i/2, u_i/2] (the projection of a 6D cube's hull;
 *     12 vertices on the five-fold axes at τ·edge — the circumradius — and 20 on the three-fold axes at
 *     0.9106 of it; inradius 1.3764·edge);
 *   rhombic triacontahedron, 92 = its 32 vertices and the midpoints of its 60 edges (the 92-atom outer
 *     shell of the Tsai cluster, Takakura et al., Nature Materials 6 (2007) 58).
 * The coordinate axes x, y, z are two-fold axes of this icosahedron, so the cube (±1,±1,±1),
 * octahedron (±1,0,0)… and tetrahedron (1,1,1),(1,−1,−1),(−1,1,−1),(−1,−1,1) use the standard
 * cubic setting and share the three-fold axes with the dodecahedron (T_h ⊂ I_h).
 * Vertices are sorted (z, then y, then x, descending) so the order does not depend on construction.
 */
export type PolyhedronName =
  | 'point'
  | 'icosahedron'
  | 'dodecahedron'
  | 'icosidodecahedron'
  | 'rhombic-triacontahedron'
  | 'rhombic-triacontahedron-92'
  | 'truncated-icosahedron'
  | 'cube'
  | 'octahedron'
  | 'tetrahedron';

export const POLYHEDRON_NAMES: readonly PolyhedronName[] = [
  'point',
  'icosahedron',
  'dodecahedron',
  'icosidodecahedron',
  'rhombic-triacontahedron',
  'rhombic-triacontahedron-92',
  'truncated-icosahedron',
  'cube',
  'octahedron',
  'tetrahedron',
];

type V = [number, number, number];

function unitAxes(): V[] {
  const d = icosahedralDirections((1 + Math.sqrt(5)) / 2, 'par');
  const out: V[] = [];
  for (let i = 0; i < 6; i++) {
    const v: V = [d[3 * i], d[3 * i + 1], d[3 * i + 2]];
    const l = Math.hypot(...v);
    out.push([v[0] / l, v[1] / l, v[2] / l]);
  }
  return out;
}

function icosahedron(): V[] {
  return unitAxes().flatMap((u) => [u, [-u[0], -u[1], -u[2]] as V]);
}

const dist = (a: V, b: V) => Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);

function icoEdges(): [V, V][] {
  const v = icosahedron();
  const edge = Math.min(...v.slice(1).map((w) => dist(v[0], w)));
  const out: [V, V][] = [];
  for (let i = 0; i < v.length; i++) for (let j = i + 1; j < v.length; j++) if (Math.abs(dist(v[i], v[j]) - edge) < 1e-9) out.push([v[i], v[j]]);
  return out; // 30
}

function icoFaces(): V[] {
  const v = icosahedron();
  const edge = dist(...icoEdges()[0]);
  const out: V[] = [];
  for (let i = 0; i < 12; i++)
    for (let j = i + 1; j < 12; j++)
      for (let k = j + 1; k < 12; k++) {
        if ([dist(v[i], v[j]), dist(v[j], v[k]), dist(v[i], v[k])].every((d) => Math.abs(d - edge) < 1e-9)) {
          out.push([0, 1, 2].map((q) => (v[i][q] + v[j][q] + v[k][q]) / 3) as V);
        }
      }
  return out; // 20
}

function zonohedron(): V[] {
  const u = unitAxes();
  const pts: V[] = [];
  for (let m = 0; m < 64; m++) {
    const p: V = [0, 0, 0];
    for (let i = 0; i < 6; i++) {
      const s = m & (1 << i) ? 0.5 : -0.5;
      for (let q = 0; q < 3; q++) p[q] += s * u[i][q];
    }
    pts.push(p);
  }
  // Hull vertices: the sums that are extreme along a five-fold or three-fold axis.
  const dirs = [...icosahedron(), ...icoFaces()].map((d) => {
    const l = Math.hypot(...d);
    return [d[0] / l, d[1] / l, d[2] / l] as V;
  });
  const out: V[] = [];
  for (const d of dirs) {
    let best = pts[0];
    let bd = -Infinity;
    for (const p of pts) {
      const x = p[0] * d[0] + p[1] * d[1] + p[2] * d[2];
      if (x > bd + 1e-12) {
        bd = x;
        best = p;
      }
    }
    out.push(best);
  }
  return out; // 32
}

function normalise(pts: V[]): V[] {
  return pts.map((p) => {
    const l = Math.hypot(...p);
    return [p[0] / l, p[1] / l, p[2] / l] as V;
  });
}

function raw(name: PolyhedronName): V[] {
  switch (name) {
    case 'point':
      return [[0, 0, 0]];
    case 'icosahedron':
      return icosahedron();
    case 'dodecahedron':
      return normalise(icoFaces());
    case 'icosidodecahedron':
      return normalise(icoEdges().map(([a, b]) => [0, 1, 2].map((q) => (a[q] + b[q]) / 2) as V));
    case 'truncated-icosahedron':
      return icoEdges().flatMap(([a, b]) => [
        [0, 1, 2].map((q) => (2 * a[q] + b[q]) / 3) as V,
        [0, 1, 2].map((q) => (a[q] + 2 * b[q]) / 3) as V,
      ]);
    case 'rhombic-triacontahedron':
      return zonohedron();
    case 'rhombic-triacontahedron-92': {
      const v = zonohedron();
      const edge = Math.min(...v.slice(1).map((w) => dist(v[0], w)));
      const mids: V[] = [];
      for (let i = 0; i < v.length; i++)
        for (let j = i + 1; j < v.length; j++) if (Math.abs(dist(v[i], v[j]) - edge) < 1e-9) mids.push([0, 1, 2].map((q) => (v[i][q] + v[j][q]) / 2) as V);
      return [...v, ...mids]; // 32 + 60
    }
    case 'cube': {
      const out: V[] = [];
      for (const x of [1, -1]) for (const y of [1, -1]) for (const z of [1, -1]) out.push([x, y, z]);
      return out;
    }
    case 'octahedron':
      return [
        [1, 0, 0],
        [-1, 0, 0],
        [0, 1, 0],
        [0, -1, 0],
        [0, 0, 1],
        [0, 0, -1],
      ];
    case 'tetrahedron':
      return [
        [1, 1, 1],
        [1, -1, -1],
        [-1, 1, -1],
        [-1, -1, 1],
      ];
    default:
      throw new Error(`unknown polyhedron "${String(name)}" (known: ${POLYHEDRON_NAMES.join(', ')})`);
  }
}

/** Vertices (packed xyz, Å) of a named polyhedron centred at the origin with the given circumradius. */
export function polyhedronVertices(name: PolyhedronName, circumradius: number): Float64Array {
  if (!(circumradius >= 0) || !Number.isFinite(circumradius)) {
    throw new RangeError(`circumradius must be a non-negative number of Å, got ${circumradius}`);
  }
  const pts = raw(name);
  const rmax = Math.max(...pts.map((p) => Math.hypot(...p)));
  const s = rmax > 0 ? circumradius / rmax : 0;
  // Round away float noise (1e-12) before sorting, so the order is the same on every platform.
  const key = (x: number) => Math.round(x * 1e9);
  pts.sort((a, b) => key(b[2]) - key(a[2]) || key(b[1]) - key(a[1]) || key(b[0]) - key(a[0]));
  const out = new Float64Array(3 * pts.length);
  pts.forEach((p, i) => {
    for (let q = 0; q < 3; q++) out[3 * i + q] = p[q] * s + 0; // + 0 turns −0 into 0
  });
  return out;
}

/** Number of vertices of each named polyhedron. */
export function vertexCount(name: PolyhedronName): number {
  return raw(name).length;
}
