/**
 * The model form's "put a preset on its site" (components/forms/preset-site.ts): what it fills in, what it keeps,
 * and what the filled-in model cuts to.
 *
 * Outside references:
 * - YbCd6, the 1/1 approximant of the Tsai-type i-phase: cI168, space group Im-3 (No. 204), a = 15.638 Å,
 *   Yb24Cd144 per cell (Gómez & Lidin, Angew. Chem. Int. Ed. 40 (2001) 4037; from memory). The Tsai preset put on
 *   its site with the suggested a_R must give that count and that composition, the cell a = 2(τ+1)a_R/√(2+τ)
 *   (Elser & Henley 1985) within 0.01 Å of 15.638 Å, and by spglib (Debian's python3-spglib, symprec 1e-3 —
 *   common practice) I23 (No. 197): the published Im-3 averages the orientationally disordered Cd4 tetrahedron,
 *   and an ordered tetrahedron on the m-3 site keeps only its subgroup 23, so the maximal ordered subgroup of
 *   Im-3 is I23 (as tests/unit/models/icosahedral/done-when.test.ts states).
 * - The form's params must pass the engine's own schema (that is the workspace's gate, not a reference).
 */
import { describe, expect, it } from 'vitest';
import { presetAR, presetFormDecoration, presetOffSite, presetPlan, usualSpecies, withPresetOnSite } from '../../../components/forms/preset-site';
import { validate, type Params } from '../../../components/forms/families';
import { generate } from '../../../lib/models/index';
import { presetDecoration } from '../../../lib/models/icosahedral/decorate';
import { runPython } from '../../helpers/python';

const start: Params = {
  family: 'icosahedral',
  mode: 'approximant',
  order: '1/1',
  aR: 4.6,
  lattice: 'P',
  offset: [0, 0, 0],
  decoration: { classes: [{ name: 'vertex', position: 'node', species: 'Al' }, { name: 'mine', position: 'body', species: 'Mn' }], clusters: [{ at: 'vertex', preset: 'mackay' }], mergeTolerance: 0.9 },
};

describe('putting a preset on its site in the form', () => {
  it('fills the decoration the preset is meant for, keeps the merge tolerance and every other field, and sets a_R only when asked', () => {
    const p = withPresetOnSite(start, 'mackay', true);
    expect(p.decoration).toEqual({
      classes: [
        { name: 'cluster centre', position: 'node', window: { kind: 'hypercube', scale: 0.381966 } },
        // The six glue classes at ½(1,…,1) − ½e_k (clusters.ts: the Al6/Al7 glue of α-(AlMnSi), Sugiyama et al. 1998).
        ...[0, 1, 2, 3, 4, 5].map((k) => ({
          name: `glue ${k + 1}`,
          position: [0, 1, 2, 3, 4, 5].map((i) => (i === k ? 0 : 0.5)),
          window: { kind: 'hypercube', scale: 0.381966 },
          species: 'Al',
        })),
      ],
      clusters: [{ at: 'cluster centre', preset: 'mackay', species: ['Al', 'Al', 'Mn'] }],
      mergeTolerance: 0.9,
    });
    expect(p.aR).toBe(4.606);
    expect({ ...p, decoration: undefined, aR: undefined }).toEqual({ ...start, decoration: undefined, aR: undefined });
    expect(withPresetOnSite(start, 'tsai', false).aR).toBe(4.6);
    for (const name of ['mackay', 'bergman', 'tsai'] as const) expect(validate(withPresetOnSite(start, name, true))).toBeUndefined();
  });

  it('spells out the usual species only where the field can say them exactly (Bergman’s mixed (Al,Zn) shells stay with the preset)', () => {
    expect(usualSpecies('tsai')).toEqual(['Cd', 'Cd', 'Yb', 'Cd', 'Cd']);
    expect(usualSpecies('bergman')).toBeUndefined();
    expect(presetFormDecoration('bergman').clusters).toEqual(presetDecoration('bergman').clusters);
  });

  it('the form’s six-decimal window scalings and spelt-out species cut the same atoms as the exact preset decoration (1/1, 2/1, 3/2)', () => {
    expect(presetFormDecoration('mackay').classes.map((c) => (c.window.kind === 'hypercube' ? c.window.scale : 0))).toEqual(Array(7).fill(0.381966));
    for (const name of ['mackay', 'bergman', 'tsai'] as const)
      for (const order of ['1/1', '2/1', '3/2']) {
        const base = { family: 'icosahedral', mode: 'approximant', order, aR: presetAR(name) } as const;
        const exact = generate({ ...base, decoration: presetDecoration(name) });
        const form = generate({ ...base, decoration: presetFormDecoration(name) });
        expect([name, order, form.species.length]).toEqual([name, order, exact.species.length]);
        expect(Array.from(form.species)).toEqual(Array.from(exact.species));
      }
  });

  it('says what it brings and what it replaces before it is pressed', () => {
    const plan = presetPlan(start, 'mackay');
    expect(plan.classes).toHaveLength(7);
    expect(plan.classes[0]).toBe('“cluster centre”: cluster centres, node, triacontahedral window × 1/τ² ≈ 0.382');
    expect(plan.classes[1]).toBe('“glue 1”: Al, ½(1,…,1) − ½e₁, triacontahedral window × 1/τ² ≈ 0.382');
    expect(plan.classes[6]).toBe('“glue 6”: Al, ½(1,…,1) − ½e₆, triacontahedral window × 1/τ² ≈ 0.382');
    expect(plan.cluster).toMatch(/^Mackay, 54 atoms: .*Mn icosahedron \(Mn\)$/);
    expect(plan.replaces).toEqual({ classes: ['vertex', 'mine'], clusters: 1 });
    expect(plan.aR).toEqual({ suggested: 4.606, current: 4.6 });
    expect(presetPlan({ family: 'icosahedral' }, 'bergman').replaces).toEqual({ classes: [], clusters: 0 });
    expect(presetPlan(start, 'bergman').cluster).toMatch(/inner icosahedron \(Al 50 % \/ Zn 50 %\)/);
  });

  it('notices a preset picked in a cluster but placed off its site, and is satisfied once it is put there', () => {
    expect(presetOffSite(start)).toEqual({ preset: 'mackay', cluster: 0, at: 'vertex' });
    expect(presetOffSite(withPresetOnSite(start, 'mackay', true))).toBeUndefined();
    expect(presetOffSite({ family: 'icosahedral' })).toBeUndefined();
    const widened = withPresetOnSite(start, 'tsai', true) as Params & { decoration: { classes: { window: unknown }[] } };
    widened.decoration.classes[0].window = { kind: 'hypercube', scale: 1 };
    expect(presetOffSite(widened)).toEqual({ preset: 'tsai', cluster: 0, at: 'cluster centre' });
  });

  it('the Tsai preset on its site in a 1/1 cell is YbCd6: 168 atoms, Yb24Cd144, a = 15.64 Å, I23 by spglib (Im-3 with the tetrahedron ordered) (Gómez & Lidin 2001)', () => {
    const s = generate(withPresetOnSite({ family: 'icosahedral', mode: 'approximant', order: '1/1' }, 'tsai', true));
    expect(s.species.length).toBe(168);
    let yb = 0;
    let cd = 0;
    for (const z of s.species) if (z === 70) yb++;
    else if (z === 48) cd++;
    expect([yb, cd]).toEqual([24, 144]);
    const cell = s.cell!;
    expect(Math.abs(cell[0][0] - 15.638)).toBeLessThan(0.01);
    expect(presetAR('tsai')).toBeCloseTo(5.682, 3);
    const frac = Array.from({ length: s.species.length }, (_, i) => [0, 1, 2].map((k) => s.positions[3 * i + k] / cell[k][k]));
    const [number, symbol] = runPython<[number, string]>(
      'import json, sys, spglib; d = json.load(sys.stdin); ds = spglib.get_symmetry_dataset((d["cell"], d["frac"], d["z"]), symprec=1e-3); print(json.dumps([ds["number"], ds["international"]]))',
      JSON.stringify({ cell, frac, z: Array.from(s.species) }),
    );
    expect([number, symbol]).toEqual([197, 'I23']);
  });
});
