/**
 * Each cluster preset on its site in a 1/1 cell, cut with the quasilattice constant of the crystal it is
 * modelled on: no pair closer than the Check step's threshold (0.8 × the sum of CN-12 metallic radii) and the
 * atomic density of the published phase. Outside references (from memory, as in clusters.ts):
 *   YbCd6, cI168, a = 15.638 Å (Gómez & Lidin, Angew. Chem. Int. Ed. 40 (2001) 4037);
 *   R-phase Mg32(Al,Zn)49, cI162, a = 14.16 Å (Bergman, Waugh & Pauling, Acta Cryst. 10 (1957) 254);
 *   α-AlMnSi, cP138, a = 12.68 Å (Cooper & Robinson, Acta Cryst. 20 (1966) 614).
 */
import { describe, expect, it } from 'vitest';
import { generate, estimateCount } from '../../../../lib/models';
import { presetDecoration } from '../../../../lib/models/icosahedral/decorate';
import { forEachPairWithin } from '../../../../lib/math/cell-list';
import { tooCloseThreshold } from '../../../../lib/structure/radii';
import type { Structure } from '../../../../lib/structure/types';
import { CLUSTER_PRESETS } from '../../../../lib/models/icosahedral/clusters';
import { runPython } from '../../../helpers/python';

/** Published cells (from memory): a in Å and atoms per cell. */
const PHASES = {
  tsai: { a: 15.638, atoms: 168, composition: { 70: 24, 48: 144 } },
  bergman: { a: 14.16, atoms: 162 },
  mackay: { a: 12.68, atoms: 138 },
} as const;

/** a(1/1) = 2(τ + 1)·a_R/√(2 + τ) (Elser & Henley 1985), inverted. */
const TAU = (1 + Math.sqrt(5)) / 2;
const aROf = (a: number) => (a * Math.sqrt(2 + TAU)) / (2 * (TAU + 1));

function tooClosePairs(s: Structure): { count: number; worst: number } {
  let count = 0;
  let worst = Infinity;
  forEachPairWithin(s.positions, s.cell, 3.5, (i, j, d) => {
    if (i === j) return;
    const t = tooCloseThreshold(s.species[i], s.species[j]);
    if (d < t) count++;
    worst = Math.min(worst, d / t);
  });
  return { count, worst };
}

const volume = (s: Structure) => s.cell![0][0] * s.cell![1][1] * s.cell![2][2];

describe('cluster presets on their site in a 1/1 cell', () => {
  it('Tsai: Yb24Cd144 in the YbCd6 cell — the 92-atom triacontahedra shared with the neighbours — no pair too close', () => {
    const s = generate({ family: 'icosahedral', mode: 'approximant', order: '1/1', aR: aROf(PHASES.tsai.a), decoration: presetDecoration('tsai') });
    expect(s.species.length).toBe(168);
    const comp: Record<number, number> = {};
    for (const z of s.species) comp[z] = (comp[z] ?? 0) + 1;
    expect(comp).toEqual(PHASES.tsai.composition);
    const density = s.species.length / volume(s);
    expect(Math.abs(density / (PHASES.tsai.atoms / PHASES.tsai.a ** 3) - 1)).toBeLessThan(0.1);
    expect(tooClosePairs(s).count).toBe(0);
    expect(s.notes?.join('\n')).not.toMatch(/warning/);
    // Every atom inside the cell.
    const a = s.cell![0][0];
    for (const x of s.positions) expect(x >= 0 && x < a).toBe(true);
  });

  it('Bergman: within 10 % of the R-phase density, no pair too close', () => {
    const s = generate({ family: 'icosahedral', mode: 'approximant', order: '1/1', aR: aROf(PHASES.bergman.a), decoration: presetDecoration('bergman') });
    const ref = PHASES.bergman.atoms / PHASES.bergman.a ** 3;
    expect(Math.abs(s.species.length / volume(s) / ref - 1)).toBeLessThan(0.1);
    expect(tooClosePairs(s).count).toBe(0);
  });

  it('Mackay with its glue class: 2 × 54 cluster atoms + 12 glue Al, no pair too close; 120 of the α-phase’s 138 atoms (density 13 % low)', () => {
    const d = presetDecoration('mackay');
    expect(d.classes.map((c) => c.name)).toEqual(['cluster centre', 'glue']);
    const s = generate({ family: 'icosahedral', mode: 'approximant', order: '1/1', aR: aROf(PHASES.mackay.a), decoration: d });
    expect(tooClosePairs(s).count).toBe(0);
    const comp: Record<number, number> = {};
    for (const z of s.species) comp[z] = (comp[z] ?? 0) + 1;
    // Mn: 2 icosahedra of 12 — the α-phase's 24 Mn per cell (from memory); Al: 2 × 42 + 12 glue.
    expect(comp).toEqual({ 13: 96, 25: 24 });
    // Known shortfall, stated in clusters.ts: 138 = 2 × 54 + 30 glue atoms (Steurer & Deloudi, Acta Cryst. A64
    // (2008) 1, Fig. 4, after Sugiyama et al. 1998: the glue is the outer double-Mackay shells around the origin);
    // the cut supplies 12 of the 30, so the density is 13 % low, not within the 10 % asked for.
    expect(s.species.length).toBe(120);
    expect(s.species.length / volume(s) / (PHASES.mackay.atoms / PHASES.mackay.a ** 3)).toBeCloseTo(120 / 138, 6);
  });

  it('Mackay: no room for the missing glue between these clusters — the largest hole is below an ordinary Al contact (pymatgen radii, scipy)', () => {
    const s = generate({ family: 'icosahedral', mode: 'approximant', order: '1/1', aR: aROf(PHASES.mackay.a), decoration: presetDecoration('mackay') });
    // Distance from every point of a 48³ grid to the nearest atom (periodic k-d tree, scipy.spatial.cKDTree with
    // boxsize), away from the two cluster centres (the Mackay cluster is empty-centred, Elser & Henley 1985).
    // An Al atom placed in the largest hole would sit at that distance from its nearest neighbour; the shortest
    // Al contacts in Al–transition-metal phases are about 0.87 of the CN-12 radius sum (radii.ts, from memory).
    const r = runPython<{ hole: number; rAl: number; rMn: number }>(
      `
import sys, json, numpy as np
from scipy.spatial import cKDTree
from pymatgen.core.periodic_table import Element
d = json.load(sys.stdin); a = d['a']
pos = np.array(d['pos']).reshape(-1, 3) % a
tree = cKDTree(pos, boxsize=a)
n = 48
g = (np.indices((n, n, n)).reshape(3, -1).T + 0.5) * (a / n)
dist, _ = tree.query(g)
c = np.array([[0, 0, 0], [a / 2, a / 2, a / 2]])
dc = np.min([np.linalg.norm((g - x + a / 2) % a - a / 2, axis=1) for x in c], axis=0)
print(json.dumps({'hole': float(dist[dc > 3.0].max()), 'rAl': float(Element('Al').metallic_radius), 'rMn': float(Element('Mn').metallic_radius)}))
`,
      JSON.stringify({ a: s.cell![0][0], pos: Array.from(s.positions) }),
    );
    expect(r.hole).toBeLessThan(0.87 * 2 * r.rAl);
    expect(r.hole).toBeGreaterThan(2.2); // measured 2.34 Å: a real gap, just too small for another Al
  });

  it('the cluster-centre site (canonical window / τ²) keeps the same vertices at every a_R: 2, 8, 32 per 1/1, 2/1, 3/2 cell, each with its twelve five-fold neighbours at a_R, at least 2.384·a_R apart', () => {
    for (const preset of ['mackay', 'bergman', 'tsai'] as const) {
      const aR = CLUSTER_PRESETS[preset].aR!;
      const site = CLUSTER_PRESETS[preset].site!;
      for (const [order, count] of [['1/1', 2], ['2/1', 8], ['3/2', 32]] as const) {
        const s = generate({
          family: 'icosahedral', mode: 'approximant', order, aR,
          decoration: { classes: [{ name: 'c', position: site.position, window: { kind: 'hypercube', scale: site.windowScale }, species: 'Mn' }, { name: 'v', position: 'node', species: 'Al' }] },
        });
        const centre = (i: number) => s.site![i] === 0;
        let centres = 0;
        for (let i = 0; i < s.species.length; i++) if (centre(i)) centres++;
        expect(centres, `${preset} ${order}`).toBe(count);
        const star = new Map<number, number>();
        let closest = Infinity;
        forEachPairWithin(s.positions, s.cell, 2.5 * aR, (i, j, d) => {
          if (i === j || !centre(i)) return;
          if (centre(j)) closest = Math.min(closest, d);
          else if (Math.abs(d - aR) < 1e-6) star.set(i, (star.get(i) ?? 0) + (s.occupancy?.[j] ?? 1));
        });
        for (const [, k] of star) expect(k).toBe(12);
        expect(star.size).toBe(count);
        // 2.384·a_R = |e₁ + e₂ + e₃|: the three-fold linkage of the canonical cells (Henley 1991, from memory).
        expect(closest / aR).toBeCloseTo(Math.sqrt(3 + 6 / Math.sqrt(5)), 6);
      }
    }
  });
});

describe('a placement that finds no centre is not silent', () => {
  it('a centre window scaled by 1/τ³ keeps no vertex of the 2/1: no cluster, and a warning says so', () => {
    const s = generate({
      family: 'icosahedral', mode: 'approximant', order: '2/1', aR: 4.61,
      decoration: { classes: [{ name: 'c', position: 'node', window: { kind: 'hypercube', scale: 1 / TAU ** 3 }, species: 'Mn' }], clusters: [{ at: 'c', preset: 'mackay' }] },
    });
    expect(s.species.length).toBe(0);
    expect(s.notes?.join('\n')).toMatch(/warning: no point of site class "c" lies in its window here, so no Mackay cluster was placed/);
  });
});

describe('decorated atoms count against the estimate and the point cap', () => {
  const p = { family: 'icosahedral', mode: 'approximant', order: '1/1', aR: aROf(PHASES.tsai.a), decoration: presetDecoration('tsai') } as const;

  const onVertices = {
    family: 'icosahedral', mode: 'approximant', order: '1/1', aR: 4.6,
    decoration: { classes: [{ name: 'vertex', position: 'node', species: 'Mn' }], clusters: [{ at: 'vertex', preset: 'mackay' }] },
  } as const;

  it('the estimate is the points times the atoms per cluster: 32 vertices of the 1/1 (Elser & Henley 1985) × 54, a bound on the merged count', () => {
    expect(estimateCount(onVertices)).toBe(32 * 54);
    expect(generate(onVertices).species.length).toBeLessThanOrEqual(32 * 54);
  });

  it('the cap refuses before allocating when the clusters would exceed it', () => {
    expect(() => generate({ ...onVertices, maxPoints: 1000 })).toThrow(/maxPoints: the 1\/1 cell with its clusters would hold about 1,728 points, more than the cap of 1,000/);
  });

  it('the cap also counts the real centres (a small window the density estimate underrates): 2 Tsai clusters of 158 atoms', () => {
    expect(() => generate({ ...p, maxPoints: 300 })).toThrow(/maxPoints: 2 Tsai clusters of 158 atoms would hold about 316 points, more than the cap of 300/);
  });

  it('a 2/1 cell with a preset on every vertex: nothing outside the cell, nothing closer than the merge tolerance (minimum image)', () => {
    const s = generate({
      family: 'icosahedral', mode: 'approximant', order: '2/1', aR: 4.2,
      decoration: { classes: [{ name: 'vertex', position: 'node', species: 'Mn' }], clusters: [{ at: 'vertex', preset: 'mackay' }] },
    });
    const a = s.cell![0][0];
    for (const x of s.positions) expect(x >= 0 && x < a).toBe(true);
    let closest = Infinity;
    forEachPairWithin(s.positions, s.cell, 1.2, (i, j, d) => {
      if (i !== j) closest = Math.min(closest, d);
    });
    expect(closest).toBeGreaterThanOrEqual(1.1);
    expect(s.notes?.join('\n')).toMatch(/merged \d+ atoms closer than 1.1 Å \(across the cell boundary too, minimum image\)/);
    // Clusters 4.2 Å apart overlap: the pairs the Check step would flag are counted in a warning.
    const flagged = tooClosePairs(s).count;
    expect(flagged).toBeGreaterThan(1000);
    expect(s.notes?.join('\n')).toContain(`warning: ${flagged.toLocaleString('en-US')} pairs are closer than 0.8 of their metallic radii sum`);
    expect(s.notes?.join('\n')).toMatch(/warning: the Mackay preset is sized for a_R = 4.61 Å \(α-AlMnSi \(cP138\)\); this cut has a_R = 4.2 Å/);
  });
});
