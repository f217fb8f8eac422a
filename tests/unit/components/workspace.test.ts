/**
 * Workspace pieces that are pure: the form reading the shared schemas, the six-index labels of zone spots,
 * the vertex environments of a tiling, and the series.
 * References: CSG indexing |Q∥|² = c²(N + Mτ), |Q⊥|² = c²τ²(N − M/τ) (Cahn, Shechtman & Gratias 1986, via
 * lib/diffraction/indexing.ts); Penrose vertex frequencies — the star "thick 72° ×5" is the rarest
 * complete vertex (de Bruijn 1981); Elser–Henley a(p/q) = 2(pτ+q)a_R/√(2+τ).
 */
import { describe, expect, it } from 'vitest';
import { describeSchema } from '../../../components/forms/describe';
import { formMessages } from '../../../components/forms/messages';
import { validate, starterParams } from '../../../components/forms/families';
import { indexIcosahedralSpot, indexScale } from '../../../lib/worker/zone-index';
import { qSquaredFromNM, csgFromHyper } from '../../../lib/diffraction/indexing';
import { TAU } from '../../../lib/math/golden';
import { vertexConfigurations } from '../../../components/tiling2d/vertex-configs';
import { generate } from '../../../lib/models';
import { series } from '../../../lib/worker/engine';
import { icosahedralApproximantModelSchema } from '../../../lib/models/icosahedral/schema';

describe('workspace form', () => {
  it('draws the icosahedral approximant fields from the shared schema', () => {
    const info = describeSchema(icosahedralApproximantModelSchema);
    expect(info.shape.kind).toBe('object');
    const keys = info.shape.kind === 'object' ? info.shape.fields.map((f) => f.key) : [];
    expect(keys).toEqual(expect.arrayContaining(['order', 'aR', 'lattice', 'offset', 'decoration']));
  });
  it('puts the schema message beside the field that is wrong, named as the form labels it', () => {
    const p = { ...starterParams('icosahedral'), order: '3/1', aR: -1 };
    const byPath = formMessages(validate(p), describeSchema(icosahedralApproximantModelSchema), p);
    expect(byPath.get('order')).toMatch(/^Order p\/q: .*consecutive Fibonacci/);
    expect(byPath.get('aR')).toBe('Rhombohedron edge a_R: must be more than 0 Å');
    expect(validate(starterParams('icosahedral'))).toBeUndefined();
  });
});

describe('zone spot indices', () => {
  it('recovers a six-index reflection from its Q∥ and gives the CSG |Q⊥|', () => {
    const aR = 4.6;
    const c = indexScale(aR);
    for (const n of [
      [1, 0, 0, 0, 0, 0],
      [1, 1, 0, 0, 0, 0],
      [1, 1, 1, 0, 0, 0],
      [0, 0, 1, 1, 1, 0],
    ]) {
      const { hh, N, M } = csgFromHyper(n);
      const q: [number, number, number] = [c * (hh[0] + hh[1] * TAU), c * (hh[2] + hh[3] * TAU), c * (hh[4] + hh[5] * TAU)];
      const idx = indexIcosahedralSpot(q, aR, 1e-3)!;
      expect(idx.hh).toEqual(hh);
      expect(idx.qPerp ** 2).toBeCloseTo(qSquaredFromNM(N, M, aR).perp, 10);
    }
  });
});

describe('vertex environments', () => {
  it('counts every complete Penrose vertex once, the five-thick star rarest', () => {
    const s = generate({ family: 'penrose', radius: 12, edge: 1 });
    const { configs, complete } = vertexConfigurations(s);
    expect(configs.reduce((a, c) => a + c.count, 0)).toBe(complete);
    const star = configs.find((c) => c.signature === 'thick 72° ×5');
    expect(star).toBeDefined();
    expect(configs.length).toBeGreaterThanOrEqual(6);
  });
});

describe('series', () => {
  it('lists 1/1 … 21/13 with the Elser–Henley lattice constant and the 2/1 count', () => {
    const { rows } = series({ family: 'icosahedral', mode: 'approximant', order: '2/1', aR: 4.6 });
    expect(rows.map((r) => `${r.p}/${r.q}`)).toEqual(['1/1', '2/1', '3/2', '5/3', '8/5', '13/8', '21/13']);
    const r21 = rows[1];
    expect(r21.a).toBeCloseTo((2 * (2 * TAU + 1) * 4.6) / Math.sqrt(2 + TAU), 10);
    expect(r21.atoms).toBe(136);
    expect(Math.abs(rows[6].densityMisfit!)).toBeLessThan(1e-5);
  });
});
