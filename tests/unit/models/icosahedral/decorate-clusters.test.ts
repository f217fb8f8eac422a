import { describe, expect, it } from 'vitest';
import { generate } from '../../../../lib/models';
import { pointGroup } from '../../../../lib/structure/checks';
import { minimumDistance } from '../../../../lib/structure/checks';

const vertexClass = { name: 'vertex', position: 'node', window: { kind: 'hypercube', scale: 1 }, species: 'Mn' };

describe('cluster templates placed by the decoration', () => {
  it('one Mackay cluster on a lone vertex gives 54 atoms with Ih symmetry (Mackay, Acta Cryst. 15 (1962) 916: 12 + 12 + 30)', () => {
    const s = generate({
      family: 'icosahedral',
      mode: 'patch',
      aR: 4.6,
      radius: 0.5, // only the vertex at the origin
      decoration: { classes: [vertexClass], clusters: [{ at: 'vertex', preset: 'mackay' }] },
    });
    expect(s.species.length).toBe(54);
    // Textbook: the Mackay icosahedron (two icosahedra and an icosidodecahedron) has point group Ih.
    expect(pointGroup(s.positions, s.species).name).toBe('Ih');
    expect(s.notes?.join(' ')).toMatch(/Mackay clusters on "vertex": 1 placed, 54 atoms added/);
  });

  it('merges atoms of neighbouring clusters across the cell boundary and reports it', () => {
    const base = { family: 'icosahedral', mode: 'approximant', order: '1/1', aR: 4.6, offset: [0.31, 0.17, 0.05] } as const; // generic offset: 32 whole vertices
    const raw = generate({ ...base, decoration: { classes: [vertexClass], clusters: [{ at: 'vertex', preset: 'mackay' }], mergeTolerance: 0 } });
    const merged = generate({
      ...base,
      decoration: { classes: [vertexClass], clusters: [{ at: 'vertex', preset: 'mackay' }], mergeTolerance: 1.5 },
    });
    expect(raw.species.length).toBe(32 * 54);
    expect(merged.species.length).toBeLessThan(raw.species.length);
    expect(merged.cell).toEqual(raw.cell);
    expect(minimumDistance(merged).distance).toBeGreaterThanOrEqual(1.5 - 1e-9);
    expect(merged.notes?.some((n) => /^merged \d+ atoms closer than 1.5 Å/.test(n))).toBe(true);
  });

  it('rejects a cluster placed on a site class that does not exist', () => {
    expect(() =>
      generate({
        family: 'icosahedral',
        mode: 'patch',
        aR: 4.6,
        radius: 5,
        decoration: { classes: [vertexClass], clusters: [{ at: 'body', preset: 'bergman' }] },
      }),
    ).toThrow(/decoration\.clusters\.0\.at: no site class is named "body"/);
  });
});
