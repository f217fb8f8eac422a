import { describe, expect, it } from 'vitest';
import { pointGroup } from '@/lib/structure';
import { polyhedronVertices, type PolyhedronName } from '@/lib/models/icosahedral/polyhedra';
import { runPython } from '../../helpers/python';

function shell(name: PolyhedronName, r: number, z = 13): { pos: Float64Array; sp: Uint16Array } {
  const pos = polyhedronVertices(name, r);
  return { pos, sp: new Uint16Array(pos.length / 3).fill(z) };
}

function join(...parts: { pos: Float64Array; sp: Uint16Array }[]) {
  return { pos: Float64Array.from(parts.flatMap((p) => Array.from(p.pos))), sp: Uint16Array.from(parts.flatMap((p) => Array.from(p.sp))) };
}

// Expected groups and orders: standard results for the regular and Archimedean solids
// (Cotton, Chemical Applications of Group Theory, ch. 3; group orders from the character tables).
describe('point group of a cluster', () => {
  const cases: [PolyhedronName, string, number][] = [
    ['icosahedron', 'Ih', 120],
    ['dodecahedron', 'Ih', 120],
    ['icosidodecahedron', 'Ih', 120],
    ['truncated-icosahedron', 'Ih', 120],
    ['rhombic-triacontahedron', 'Ih', 120],
    ['cube', 'Oh', 48],
    ['octahedron', 'Oh', 48],
    ['tetrahedron', 'Td', 24],
  ];
  for (const [name, pg, order] of cases) {
    it(`${name} → ${pg} (order ${order})`, () => {
      const { pos, sp } = shell(name, 2.5);
      const g = pointGroup(pos, sp);
      expect(g.name).toBe(pg);
      expect(g.order).toBe(order);
    });
  }

  it('a Mackay-like cluster (icosahedron + icosidodecahedron, two species) stays Ih', () => {
    const c = join(shell('icosahedron', 2.5, 13), shell('icosidodecahedron', 4.8, 25));
    expect(pointGroup(c.pos, c.sp).name).toBe('Ih');
  });

  it('an icosahedron with one vertex replaced by another species → C5v; two opposite → D5d', () => {
    const { pos, sp } = shell('icosahedron', 2.5);
    sp[0] = 26;
    expect(pointGroup(pos, sp).name).toBe('C5v');
    // Opposite vertex of vertex 0 is the one at −r0.
    const j = [...Array(12).keys()].find((k) => Math.abs(pos[3 * k] + pos[0]) < 1e-9 && Math.abs(pos[3 * k + 1] + pos[1]) < 1e-9 && Math.abs(pos[3 * k + 2] + pos[2]) < 1e-9)!;
    sp[j] = 26;
    expect(pointGroup(pos, sp).name).toBe('D5d');
  });

  it('an icosahedron stretched along z (a two-fold axis in our setting) → D2h', () => {
    // x, y, z are two-fold axes of the icosahedron (0, ±1, ±τ): stretching one keeps the three C2 and mirrors.
    const { pos, sp } = shell('icosahedron', 2.5);
    for (let i = 0; i < 12; i++) pos[3 * i + 2] *= 1.1;
    expect(pointGroup(pos, sp).name).toBe('D2h');
  });

  it('a distorted icosahedron (one vertex pushed out by 0.1 Å) drops to C5v, and a random shake to C1', () => {
    const { pos, sp } = shell('icosahedron', 2.5);
    const r0 = Math.hypot(pos[0], pos[1], pos[2]);
    for (let k = 0; k < 3; k++) pos[k] *= (r0 + 0.1) / r0;
    expect(pointGroup(pos, sp, 0.01).name).toBe('C5v');
    // With a tolerance above the distortion it is Ih again (tolerance matters).
    expect(pointGroup(pos, sp, 0.2).name).toBe('Ih');
    const shaken = shell('icosahedron', 2.5);
    for (let i = 0; i < shaken.pos.length; i++) shaken.pos[i] += 0.05 * Math.sin(7.3 * i + 1.1);
    expect(pointGroup(shaken.pos, shaken.sp, 0.01).name).toBe('C1');
  });

  it('small molecules: water C2v, ammonia C3v, ethane staggered D3d, square planar D4h, trans-planar Ci/C2h', () => {
    // Idealised geometries, textbook point groups (Cotton ch. 3).
    const water = pointGroup(new Float64Array([0, 0, 0.12, 0, 0.76, -0.47, 0, -0.76, -0.47]), [8, 1, 1]);
    expect(water.name).toBe('C2v');
    const h = 0.94;
    const nh3: number[] = [0, 0, 0.1];
    for (let k = 0; k < 3; k++) nh3.push(h * Math.cos((2 * Math.PI * k) / 3), h * Math.sin((2 * Math.PI * k) / 3), -0.3);
    expect(pointGroup(Float64Array.from(nh3), [7, 1, 1, 1]).name).toBe('C3v');
    const eth: number[] = [0, 0, 0.76, 0, 0, -0.76];
    for (let k = 0; k < 3; k++) eth.push(1.02 * Math.cos((2 * Math.PI * k) / 3), 1.02 * Math.sin((2 * Math.PI * k) / 3), 1.16);
    for (let k = 0; k < 3; k++) eth.push(1.02 * Math.cos((2 * Math.PI * k) / 3 + Math.PI / 3), 1.02 * Math.sin((2 * Math.PI * k) / 3 + Math.PI / 3), -1.16);
    expect(pointGroup(Float64Array.from(eth), [6, 6, 1, 1, 1, 1, 1, 1]).name).toBe('D3d');
    const sq = pointGroup(new Float64Array([0, 0, 0, 2, 0, 0, -2, 0, 0, 0, 2, 0, 0, -2, 0]), [78, 17, 17, 17, 17]);
    expect(sq.name).toBe('D4h');
    expect(sq.order).toBe(16);
    // trans-ClHC=CHCl (planar, C2h).
    const trans = pointGroup(new Float64Array([0.67, 0, 0, -0.67, 0, 0, 1.2, 0.9, 0, -1.2, -0.9, 0, 1.3, -1.0, 0, -1.3, 1.0, 0]), [6, 6, 1, 1, 17, 17]);
    expect(trans.name).toBe('C2h');
    expect(pointGroup(new Float64Array([0, 0, 0, 0, 0, 1.1]), [6, 8]).name).toBe('C∞v');
    expect(pointGroup(new Float64Array([0, 0, -1.1, 0, 0, 1.1]), [8, 8]).name).toBe('D∞h');
  });

  it('orders agree with spglib site symmetry in a large cubic box (reference library)', () => {
    const clusters: [string, Float64Array, number[]][] = [
      ['cube', polyhedronVertices('cube', 2), Array(8).fill(13)],
      ['octahedron+centre', Float64Array.from([0, 0, 0, ...polyhedronVertices('octahedron', 2)]), [25, ...Array(6).fill(13)]],
      ['tetrahedron', polyhedronVertices('tetrahedron', 2), Array(4).fill(13)],
      ['square', new Float64Array([0, 0, 0, 2, 0, 0, -2, 0, 0, 0, 2, 0, 0, -2, 0]), [78, 17, 17, 17, 17]],
      ['water', new Float64Array([0, 0, 0.12, 0, 0.76, -0.47, 0, -0.76, -0.47]), [8, 1, 1]],
    ];
    for (const [label, pos, sp] of clusters) {
      const ours = pointGroup(pos, sp);
      const ref = runPython<number>(
        `import sys, json, numpy as np, spglib
d = json.loads(sys.stdin.read())
L = 30.0
p = np.array(d["pos"]).reshape(-1, 3); p = p - p.mean(axis=0)
sym = spglib.get_symmetry((np.eye(3) * L, p / L + 0.5, d["z"]), symprec=1e-3)
# point operations of the isolated cluster = ops that leave its centre (0.5,0.5,0.5) fixed with zero translation mod 1
c = np.array([0.5, 0.5, 0.5]); n = 0
for R, t in zip(sym["rotations"], sym["translations"]):
    x = R @ c + t - c
    if np.allclose(x - np.round(x), 0, atol=1e-6): n += 1
print(json.dumps(n))`,
        JSON.stringify({ pos: Array.from(pos), z: sp }),
      );
      expect([label, ours.order]).toEqual([label, ref]);
    }
  });
});
