import { describe, expect, it } from 'vitest';
import { cli } from '../../helpers/cli';
import { TAU } from '../../../lib/math/golden';

describe('CLI: approximant and patch', () => {
  it('approximant 1/1 as JSON: exact key order, 32 vertices as X, Elser–Henley cell (PRL 55 (1985) 2883)', async () => {
    const r = await cli(['approximant', '--family', 'icosahedral', '--order', '1/1', '--aR', '4.6', '--format', 'json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out) as Record<string, unknown>;
    expect(Object.keys(j).slice(0, 6)).toEqual(['cell', 'positions', 'species', 'site', 'perp', 'provenance']);
    expect((j.positions as unknown[]).length).toBe(32);
    expect(new Set(j.species as string[])).toEqual(new Set(['X']));
    expect((j.cell as number[][])[0][0]).toBeCloseTo((2 * (TAU + 1) * 4.6) / Math.sqrt(2 + TAU), 6);
  });

  it('bad flags exit with code 2 and name the field', async () => {
    const r = await cli(['patch', '--family', 'icosahedral', '--radius', '5', '--aR', 'abc', '--format', 'xyz']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/--aR/);
    const d = await cli(['approximant', '--family', 'icosahedral', '--order', '2/2', '--aR', '4.6']);
    expect(d.code).toBe(2);
    expect(d.err).toMatch(/order/);
  });

  it('approximant --family decagonal delegates to the decagonal generator (cell present, element applied)', async () => {
    const r = await cli(['approximant', '--family', 'decagonal', '--order', '2/1', '--aR', '2.45', '--species', 'Al', '--format', 'json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out) as { cell: number[][] | null; species: string[] };
    expect(j.cell).not.toBeNull();
    expect(new Set(j.species)).toEqual(new Set(['Al']));
  });
});
