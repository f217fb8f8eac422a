import { describe, expect, it } from 'vitest';
import { sitePosition } from '../../../../lib/models/icosahedral/decorate';
import { generateIcosahedralApproximant, generateIcosahedralPatch } from '../../../../lib/models/icosahedral/generate';
import { icosahedralPatchSchema, icosahedralApproximantSchema, icosahedralPatchModelSchema, icosahedralApproximantModelSchema } from '../../../../lib/models/icosahedral/schema';
import { decorationSchema } from '../../../../lib/models/icosahedral/decoration-schema';
import { icosahedralBasis, toPar } from '../../../../lib/models/icosahedral/hyperlattice';
import { zodMessage } from '../../../../scripts/cli/errors';

const OFF: [number, number, number] = [0.0123, -0.0271, 0.0316];

describe('decoration by site classes', () => {
  it('each class has density vol(domain)/vol(6D cell) (model-set density, Baake & Grimm 2013) and its own species', () => {
    const aR = 1;
    const R = 12;
    const params = icosahedralPatchModelSchema.parse({
      family: 'icosahedral',
      mode: 'patch',
      aR,
      radius: R,
      offset: OFF,
      decoration: {
        classes: [
          { name: 'node', position: 'node', species: 'Al' },
          { name: 'body', position: 'body', window: { kind: 'sphere', radius: 0.9 }, species: 'Mn' },
          { name: 'edge', position: 'edge3', window: { kind: 'shell', r1: 0.5, r2: 1.2 }, mix: { Pd: 0.3, Al: 0.6 }, occupancy: 0.9 },
        ],
      },
    });
    const s = generateIcosahedralPatch(params);
    const ball = (4 / 3) * Math.PI * R ** 3;
    // Domain volumes: the rhombic triacontahedron of edge aR = 1, 4√(5+2√5) (handbook value), a ball and a shell.
    const vols = [4 * Math.sqrt(5 + 2 * Math.sqrt(5)), (4 / 3) * Math.PI * 0.9 ** 3, (4 / 3) * Math.PI * (1.2 ** 3 - 0.5 ** 3)];
    const counts = [0, 0, 0];
    for (let i = 0; i < s.species.length; i++) counts[s.site![i]]++;
    counts.forEach((c, k) => expect(Math.abs(c / ball / (vols[k] / 8) - 1)).toBeLessThan(0.04));
    expect(s.siteClasses!.map((c) => c.species)).toEqual([13, 25, 13]); // Al, Mn, majority Al of the mix (IUPAC atomic numbers)
    expect(s.siteClasses![2].mix).toEqual({ 13: 0.6, 46: 0.3 });
    expect(s.occupancy![s.species.length - 1]).toBe(0.9);
    // Every body-centre point has its perpendicular image inside the sphere about the offset.
    for (let i = 0; i < s.species.length; i++)
      if (s.site![i] === 1) expect(Math.hypot(s.perp![3 * i] - OFF[0], s.perp![3 * i + 1] - OFF[1], s.perp![3 * i + 2] - OFF[2])).toBeLessThanOrEqual(0.9 + 1e-9);
  });

  it('a class at ½e_i with the full hypercube is the vertex set moved by e_i∥/2 exactly when its window is moved by e_i⊥/2', () => {
    const aR = 4.6;
    const b = icosahedralBasis(aR);
    const half = toPar(sitePosition('edge2'), b);
    const perpHalf = [-b.perp[3] / 2, -b.perp[4] / 2, -b.perp[5] / 2];
    const edge = generateIcosahedralPatch(icosahedralPatchModelSchema.parse({ family: 'icosahedral', mode: 'patch', aR, radius: 30, offset: OFF, decoration: { classes: [{ name: 'e2', position: 'edge2', species: 'Al' }] } }));
    const vert = generateIcosahedralPatch(icosahedralPatchModelSchema.parse({ family: 'icosahedral', mode: 'patch', aR, radius: 40, offset: OFF.map((x, k) => x + perpHalf[k]) }));
    const key = (x: number, y: number, z: number) => `${Math.round(x * 1e5)},${Math.round(y * 1e5)},${Math.round(z * 1e5)}`;
    const set = new Set<string>();
    for (let i = 0; i < vert.species.length; i++) set.add(key(vert.positions[3 * i], vert.positions[3 * i + 1], vert.positions[3 * i + 2]));
    // The check below runs over the edge class: it must hold points (density 1.5388/aR³ over a 30 Å ball ≈ 1800).
    expect(edge.species.length).toBeGreaterThan(1000);
    for (let i = 0; i < edge.species.length; i++)
      expect(set.has(key(edge.positions[3 * i] - half[0], edge.positions[3 * i + 1] - half[1], edge.positions[3 * i + 2] - half[2]))).toBe(true);
  });

  it('decorated approximant: sphere class count = sphere volume / (λ³·…) per cell and centring still detected', () => {
    const params = icosahedralApproximantModelSchema.parse({
      family: 'icosahedral',
      mode: 'approximant',
      order: '5/3',
      aR: 4.6,
      decoration: { classes: [{ name: 'v', species: 'Al' }, { name: 'b', position: 'body', window: { kind: 'sphere', radius: 3 }, species: 'Mn' }] },
    });
    const s = generateIcosahedralApproximant(params);
    const nb = Array.from(s.site!).filter((x) => x === 1).length;
    // density × cell: a³·vol(sphere)/(8aR⁶) — model-set density with unit-determinant strain
    const a = s.cell![0][0];
    const expected = (a ** 3 * ((4 / 3) * Math.PI * 27)) / (8 * 4.6 ** 6);
    expect(Math.abs(nb / expected - 1)).toBeLessThan(0.05);
    expect(s.centring).toBe('I');
  });

  it('bad input: each error names its field', () => {
    const bad = (schema: { safeParse: (x: unknown) => { success: boolean; error?: unknown } }, x: unknown) => {
      const r = schema.safeParse(x);
      expect(r.success).toBe(false);
      return zodMessage(r.error as never);
    };
    expect(bad(icosahedralPatchSchema, { aR: -1, radius: 3 })).toMatch(/^aR:/);
    expect(bad(icosahedralPatchSchema, { aR: 4.6, radius: 3, lattice: 'Q' })).toMatch(/lattice/);
    expect(bad(icosahedralPatchSchema, { aR: 4.6, radius: 3, offset: [0, 0, 1e3] })).toMatch(/offset/);
    expect(bad(icosahedralPatchSchema, { aR: 4.6, radius: 3, species: 'Xx' })).toMatch(/species: unknown element/);
    expect(bad(icosahedralApproximantSchema, { aR: 4.6, order: '4/3' })).toMatch(/order: must be a ratio of consecutive Fibonacci/);
    expect(bad(icosahedralApproximantSchema, { aR: 4.6, order: '3/2', maxPoints: 0 })).toMatch(/maxPoints/);
    expect(bad(decorationSchema, { classes: [{ name: 's', window: { kind: 'shell', r1: 2, r2: 1 } }] })).toMatch(/classes\.0\.window\.r2/);
    expect(bad(decorationSchema, { classes: [{ name: 'm', mix: { Al: 0.7, Mn: 0.5 } }] })).toMatch(/classes\.0\.mix: fractions sum/);
    expect(bad(decorationSchema, { classes: [{ name: 'p', position: [0, 0, 0, 0, 0, 1] }] })).toMatch(/classes\.0\.position/);
  });
});
