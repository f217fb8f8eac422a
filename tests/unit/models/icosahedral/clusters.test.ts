import { describe, expect, it } from 'vitest';
import { composition, mergeClose, minimumDistance, pointGroup, type Structure } from '@/lib/structure';
import { BERGMAN, clusterAtoms, clusterSize, MACKAY, placeClusters, TSAI, type ClusterTemplate } from '@/lib/models/icosahedral/clusters';
import { runPython } from '../../../helpers/python';

const prov = { engine: 'test', params: null };
const empty = (cell?: Structure['cell']): Structure => ({ positions: new Float64Array(0), species: new Uint16Array(0), provenance: prov, ...(cell ? { cell } : {}) });

describe('cluster templates', () => {
  it('have the published atom counts: Mackay 54, Bergman 116 (12+20+12+60+12), Tsai 158 (4+20+12+30+92)', () => {
    // Mackay: 12 + 42 (Elser & Henley 1985); Bergman shells 12/20/12/60 and the 12 Mg capping the truncated
    // icosahedron's pentagons (Bergman, Waugh & Pauling 1957); Tsai shells 4/20/12/30 and the complete
    // 92-atom triacontahedron, 32 vertices + 60 edge midpoints (Takakura et al. 2007). From memory.
    expect(clusterSize(MACKAY)).toBe(54);
    expect(clusterSize(BERGMAN)).toBe(116);
    expect(clusterSize(TSAI)).toBe(158);
  });

  it('Tsai triacontahedron: inradius half the YbCd6 cell constant 15.64 Å (clusters share a face along the two-fold axes; Takakura et al. 2007), edge-midpoint atoms half an edge from the vertices', () => {
    const c = clusterAtoms(TSAI);
    const rt: number[][] = [];
    for (let i = 0; i < c.shell.length; i++) if (c.shell[i] === 4) rt.push([c.positions[3 * i], c.positions[3 * i + 1], c.positions[3 * i + 2]]);
    expect(rt.length).toBe(92);
    // The face normals are the 30 two-fold axes; the x axis is one of them: the largest x is the inradius.
    expect(Math.max(...rt.map((p) => p[0]))).toBeCloseTo(15.64 / 2, 6);
  });

  it('Mackay and Bergman are Ih; Tsai with its tetrahedron core is T (Td ∩ Ih = T, group theory)', () => {
    for (const [t, g] of [
      [MACKAY, 'Ih'],
      [BERGMAN, 'Ih'],
      [TSAI, 'T'],
    ] as [ClusterTemplate, string][]) {
      const c = clusterAtoms(t);
      expect(pointGroup(c.positions, c.species).name).toBe(g);
    }
  });

  it('rejects a bad template', () => {
    expect(() => clusterAtoms({ name: 'bad', reference: '', shells: [{ name: 's', polyhedron: 'cube', radius: -1, species: 13 }] })).toThrow(/radius/);
    expect(() => clusterAtoms({ name: 'bad', reference: '', shells: [] })).toThrow(/no shells/);
  });
});

describe('placeClusters', () => {
  it('places a cluster per centre with one site class per shell, inner shells first', () => {
    const s = placeClusters(empty(), MACKAY, new Float64Array([0, 0, 0, 20, 0, 0]));
    expect(s.species.length).toBe(108);
    expect(s.siteClasses!.map((c) => c.name)).toEqual(['Mackay: inner icosahedron', 'Mackay: icosidodecahedron', 'Mackay: Mn icosahedron']);
    expect(Array.from(s.site!.slice(0, 12))).toEqual(Array(12).fill(0));
    expect(s.positions[3 * 54]).toBeCloseTo(20 + s.positions[0], 12);
    // Mackay composition Al42Mn12 (12 inner + 30 outer Al, 12 Mn).
    const c = composition(s);
    expect(c.entries.map((e) => [e.symbol, e.count])).toEqual([
      ['Al', 84],
      ['Mn', 24],
    ]);
  });

  it('replaces the atoms a predicate picks and keeps the others', () => {
    const base: Structure = { positions: new Float64Array([0, 0, 0, 30, 0, 0]), species: new Uint16Array([0, 26]), provenance: prov };
    const s = placeClusters(base, TSAI, (i) => base.species[i] === 0);
    expect(s.species.length).toBe(1 + 158);
    expect(s.species[0]).toBe(26);
    expect(s.siteClasses![0]).toEqual({ name: 'input 26', species: 26 });
    expect(s.siteClasses!.length).toBe(1 + 5);
  });

  it('Bergman mixed (Al,Zn) shells give a mixed composition', () => {
    const c = composition(placeClusters(empty(), BERGMAN, new Float64Array(3)));
    // 84 (Al,Zn) sites at 1:1 and 20 + 12 Mg.
    expect(c.entries.map((e) => [e.symbol, e.count])).toEqual([
      ['Mg', 32],
      ['Al', 42],
      ['Zn', 42],
    ]);
  });
});

describe('mergeClose', () => {
  it('merges the periodic duplicates of an octahedron cluster sitting on a cubic lattice point', () => {
    // Octahedron of radius a/2 about (0,0,0) in a cube of edge a: (±a/2,0,0) are one point modulo a.
    const oct: ClusterTemplate = { name: 'oct', reference: 'test', centre: { name: 'c', species: 25 }, shells: [{ name: 'o', polyhedron: 'octahedron', radius: 2, species: 13 }] };
    const s = placeClusters(empty([[4, 0, 0], [0, 4, 0], [0, 0, 4]]), oct, new Float64Array(3));
    const r = mergeClose(s, 0.01);
    expect(r.count).toBe(3);
    expect(r.structure.species.length).toBe(4);
    expect(r.merged.every((m) => m.kept < m.removed && Math.abs(m.distance) < 1e-9)).toBe(true);
    expect(r.conflicts).toBe(0);
    // After merging, the nearest distance is the centre–vertex distance a/2.
    expect(minimumDistance(r.structure).distance).toBeCloseTo(2, 12);
  });

  it('keeps the lower index, and on a conflict the earlier site class, and reports it', () => {
    const s: Structure = {
      positions: new Float64Array([0, 0, 0, 0.05, 0, 0, 5, 5, 5, 5.02, 5, 5]),
      species: new Uint16Array([13, 25, 25, 13]),
      site: new Uint16Array([1, 0, 0, 1]),
      siteClasses: [
        { name: 'inner', species: 25 },
        { name: 'outer', species: 13 },
      ],
      provenance: prov,
    };
    const r = mergeClose(s, 0.1);
    expect(r.count).toBe(2);
    expect(r.conflicts).toBe(2);
    expect(r.merged.map((m) => [m.kept, m.removed, m.conflict?.result])).toEqual([
      [0, 1, 'removed'],
      [2, 3, 'kept'],
    ]);
    // Atom 0 stays where it was but takes the earlier class (0, Mn) of the removed atom.
    expect(Array.from(r.structure.species)).toEqual([25, 25]);
    expect(Array.from(r.structure.site!)).toEqual([0, 0]);
    expect(r.structure.positions[0]).toBe(0);
  });

  it('does not collapse a chain: a–b and b–c close, a–c not → only b goes', () => {
    const s: Structure = { positions: new Float64Array([0, 0, 0, 0.08, 0, 0, 0.16, 0, 0]), species: new Uint16Array([13, 13, 13]), provenance: prov };
    const r = mergeClose(s, 0.1);
    expect(r.merged.map((m) => [m.kept, m.removed])).toEqual([[0, 1]]);
  });

  it('removes one atom per close pair that ase.neighborlist finds (periodic, triclinic)', () => {
    // Random points plus near copies of some of them (some across the cell boundary).
    let seed = 12345;
    const rnd = () => ((seed = (1664525 * seed + 1013904223) >>> 0) / 2 ** 32);
    const cell: Structure['cell'] = [
      [9, 0, 0],
      [2, 8, 0],
      [1, -1, 7],
    ];
    const pos: number[] = [];
    for (let i = 0; i < 80; i++) {
      const f = [rnd(), rnd(), rnd()];
      pos.push(...[0, 1, 2].map((q) => f[0] * cell[0][q] + f[1] * cell[1][q] + f[2] * cell[2][q]));
    }
    for (let i = 0; i < 15; i++) {
      const j = i * 5;
      const shift = i % 3 === 0 ? cell[i % 2 ? 0 : 1] : [0, 0, 0];
      pos.push(pos[3 * j] + shift[0] + 0.03, pos[3 * j + 1] + shift[1], pos[3 * j + 2] + shift[2] - 0.02);
    }
    const s: Structure = { positions: Float64Array.from(pos), species: new Uint16Array(pos.length / 3).fill(13), cell, provenance: prov };
    const ours = mergeClose(s, 0.1);
    const ref = runPython<number[][]>(
      `import sys, json
from ase import Atoms
from ase.neighborlist import neighbor_list
d = json.loads(sys.stdin.read())
a = Atoms("Al%d" % (len(d["pos"]) // 3), positions=[d["pos"][i:i+3] for i in range(0, len(d["pos"]), 3)], cell=d["cell"], pbc=True)
i, j = neighbor_list("ij", a, 0.1)
print(json.dumps([[int(x), int(y)] for x, y in zip(i, j) if x < y]))`,
      JSON.stringify({ pos, cell }),
    );
    // (ase.geometry.get_duplicate_atoms is not periodic in ase 3.22, so the neighbour list is the referee.)
    // Random background points are ≥ 0.1 Å apart here (checked by the pair count), so each duplicate pair is one removal.
    expect(ref.length).toBe(15);
    expect(ours.count).toBe(15);
    expect(ours.merged.map((m) => [m.kept, m.removed]).sort()).toEqual(ref.map((p) => [Math.min(...p), Math.max(...p)]).sort());
  });
});
