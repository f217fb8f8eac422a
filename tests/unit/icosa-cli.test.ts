import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { TAU } from '../../lib/math/golden';

const cli = (args: string[]) => spawnSync('npx', ['tsx', 'scripts/cli/index.ts', ...args], { encoding: 'utf8' });

describe('CLI: approximant and patch', () => {
  it('approximant 1/1 as JSON: exact key order, 32 vertices as X, Elser–Henley cell (PRL 55 (1985) 2883)', () => {
    const r = cli(['approximant', '--family', 'icosahedral', '--order', '1/1', '--aR', '4.6', '--format', 'json']);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.stdout) as Record<string, unknown>;
    expect(Object.keys(j).slice(0, 6)).toEqual(['cell', 'positions', 'species', 'site', 'perp', 'provenance']);
    expect((j.positions as unknown[]).length).toBe(32);
    expect(new Set(j.species as string[])).toEqual(new Set(['X']));
    expect((j.cell as number[][])[0][0]).toBeCloseTo((2 * (TAU + 1) * 4.6) / Math.sqrt(2 + TAU), 6);
  });

  it('bad flags exit with code 2 and name the field', () => {
    const r = cli(['patch', '--family', 'icosahedral', '--radius', '5', '--aR', 'abc', '--format', 'xyz']);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/--aR/);
    const d = cli(['approximant', '--family', 'icosahedral', '--order', '2/2', '--aR', '4.6']);
    expect(d.status).toBe(2);
    expect(d.stderr).toMatch(/order/);
  });

  it('approximant --family decagonal delegates to the decagonal generator (cell present, element applied)', () => {
    const r = cli(['approximant', '--family', 'decagonal', '--order', '2/1', '--aR', '2.45', '--species', 'Al', '--format', 'json']);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.stdout) as { cell: number[][] | null; species: string[] };
    expect(j.cell).not.toBeNull();
    expect(new Set(j.species)).toEqual(new Set(['Al']));
  });
});
