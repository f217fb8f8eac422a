import { describe, expect, it } from 'vitest';
import { icosahedralBasis } from '@/lib/models/icosahedral/hyperlattice';
import { polyhedronVertices, type PolyhedronName } from '@/lib/models/icosahedral/polyhedra';
import { runPython } from '../../../helpers/python';

function distances(v: Float64Array): number[] {
  const out: number[] = [];
  const n = v.length / 3;
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) out.push(Math.hypot(v[3 * i] - v[3 * j], v[3 * i + 1] - v[3 * j + 1], v[3 * i + 2] - v[3 * j + 2]));
  return out.sort((a, b) => a - b);
}

function edgeCount(v: Float64Array): number {
  const d = distances(v);
  return d.filter((x) => Math.abs(x - d[0]) < 1e-9).length;
}

describe('named polyhedra', () => {
  // Vertex and edge counts of the Platonic and Archimedean solids and the rhombic triacontahedron
  // (Coxeter, Regular Polytopes, Table I; Euler V − E + F = 2).
  const table: [PolyhedronName, number, number][] = [
    ['tetrahedron', 4, 6],
    ['cube', 8, 12],
    ['octahedron', 6, 12],
    ['icosahedron', 12, 30],
    ['dodecahedron', 20, 30],
    ['icosidodecahedron', 30, 60],
    ['truncated-icosahedron', 60, 90],
    ['rhombic-triacontahedron', 32, 60],
  ];
  for (const [name, v, e] of table) {
    it(`${name}: ${v} vertices, ${e} edges, circumradius as asked`, () => {
      const p = polyhedronVertices(name, 3.7);
      expect(p.length / 3).toBe(v);
      expect(edgeCount(p)).toBe(e);
      let rmax = 0;
      for (let i = 0; i < p.length; i += 3) rmax = Math.max(rmax, Math.hypot(p[i], p[i + 1], p[i + 2]));
      expect(rmax).toBeCloseTo(3.7, 12);
    });
  }

  it('edge/circumradius ratios match the closed forms (icosahedron a/R = 1/sin(2π/5), dodecahedron 4/(√3(1+√5)))', () => {
    // Coxeter, Regular Polytopes, Table I.
    expect(distances(polyhedronVertices('icosahedron', 1))[0]).toBeCloseTo(1 / Math.sin((2 * Math.PI) / 5), 12);
    expect(distances(polyhedronVertices('dodecahedron', 1))[0]).toBeCloseTo(4 / (Math.sqrt(3) * (1 + Math.sqrt(5))), 12);
    // Icosidodecahedron: edge = R/τ.
    expect(distances(polyhedronVertices('icosidodecahedron', 1))[0]).toBeCloseTo(2 / (1 + Math.sqrt(5)), 12);
  });

  it('icosahedron vertices lie along the six e_i∥ axes of the 6D basis (hyperlattice.ts convention)', () => {
    const b = icosahedralBasis(1);
    const v = polyhedronVertices('icosahedron', 1);
    for (let i = 0; i < 6; i++) {
      const e = [b.par[3 * i], b.par[3 * i + 1], b.par[3 * i + 2]];
      const l = Math.hypot(...e);
      let hits = 0;
      for (let k = 0; k < 12; k++) {
        const c = (v[3 * k] * e[0] + v[3 * k + 1] * e[1] + v[3 * k + 2] * e[2]) / l;
        if (Math.abs(Math.abs(c) - 1) < 1e-12) hits++;
      }
      expect(hits).toBe(2);
    }
  });

  it('rejects bad input', () => {
    expect(() => polyhedronVertices('icosahedron', -1)).toThrow(/circumradius/);
    expect(() => polyhedronVertices('heptahedron' as PolyhedronName, 1)).toThrow(/unknown polyhedron/);
  });

  it('icosahedron and icosidodecahedron match the shells of ase.cluster.Icosahedron (pair distances)', () => {
    // ase's 3-shell Mackay icosahedron: shell 2 = 12 vertices at 2d plus 30 edge midpoints.
    const ref = runPython<{ ico: number[]; mid: number[] }>(
      `import json, numpy as np
from ase.cluster import Icosahedron
a = Icosahedron("Cu", noshells=3)
p = a.positions - a.positions[0] if np.allclose(a.positions[0], a.positions.mean(0)) else a.positions - a.positions.mean(0)
r = np.linalg.norm(p, axis=1)
rmax = r.max()
ico = p[np.isclose(r, rmax)]
mid = p[(r > 1e-6) & (r < rmax - 1e-3) & (r > 0.6 * rmax)]
def dists(q):
    q = q / np.linalg.norm(q, axis=1).max()
    d = [np.linalg.norm(q[i] - q[j]) for i in range(len(q)) for j in range(i + 1, len(q))]
    return sorted(d)
print(json.dumps({"ico": dists(ico), "mid": dists(mid)}))`,
    );
    expect(ref.ico.length).toBe(66);
    expect(ref.mid.length).toBe(435);
    distances(polyhedronVertices('icosahedron', 1)).forEach((d, i) => expect(d).toBeCloseTo(ref.ico[i], 9));
    distances(polyhedronVertices('icosidodecahedron', 1)).forEach((d, i) => expect(d).toBeCloseTo(ref.mid[i], 9));
  });
});
