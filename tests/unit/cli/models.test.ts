import { describe, expect, it } from 'vitest';
import { cli, cliProcess } from '../../helpers/cli';

describe('tiling CLI', () => {
  it('convergents --format json lists Fibonacci ratios (OEIS A000045)', async () => {
    const r = await cli(['convergents', '--of', 'tau', '--count', '8', '--format', 'json']);
    expect(r.code).toBe(0);
    const rows = JSON.parse(r.out) as { p: number; q: number; boundOk: boolean }[];
    expect(rows.map((x) => x.p)).toEqual([1, 2, 3, 5, 8, 13, 21, 34]);
    expect(rows.every((x) => x.boundOk)).toBe(true);
  });

  // The one end-to-end run through `npm run -s cli` (entry point, stdout, exit codes); the rest run in-process.
  it('npm run -s cli -- chain --format xyz: standard XYZ with F(n+2)+1 vertices (OEIS A000045), element X, provenance in the comment; a bad flag exits with 2', () => {
    const r = cliProcess(['chain', '--order', '5', '--format', 'xyz']);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const lines = r.out.trimEnd().split('\n');
    expect(Number(lines[0])).toBe(14); // F(7) + 1 = 13 + 1
    expect(lines[1]).toMatch(/tauforge-engine\/.* params=\{.*"order":5/);
    expect(lines.length).toBe(2 + 14);
    expect(lines[2]).toMatch(/^X\s+0\.0+\s+0\.0+\s+0\.0+$/);
    const bad = cliProcess(['chain', '--order', 'x']);
    expect(bad.out).toBe('');
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/--order/);
  });

  it('tiling --format json has exactly the documented keys and an approximant cell', async () => {
    const r = await cli(['tiling', '--family', 'octagonal', '--approximant', '5/2', '--edge', '2', '--format', 'json']);
    expect(r.code).toBe(0);
    const doc = JSON.parse(r.out);
    expect(Object.keys(doc).slice(0, 6)).toEqual(['cell', 'positions', 'species', 'site', 'perp', 'provenance']);
    // Worked by hand: the square cell of side (1+√2)² edges has area (3 + 2√2)² = 17 + 12√2 = 17·1 + 24·sin 45°
    // edge², so 17 squares and 24 rhombi (√2 is irrational: the split is unique), and a rhombus tiling of a
    // torus has as many vertices as tiles (V − E + F = 0, E = 2F): 41.
    expect(doc.positions.length).toBe(41);
    expect(doc.species.every((s: string) => s === 'X')).toBe(true);
    expect(doc.cell[0][0]).toBeCloseTo(2 * (3 + 2 * Math.SQRT2), 6); // side (1+√2)²·edge
  });

  it('bad flags exit with code 2 and name the field', async () => {
    const a = await cli(['chain', '--order', 'x', '--format', 'xyz']);
    expect(a.code).toBe(2);
    expect(a.err).toMatch(/--order/);
    const b = await cli(['tiling', '--family', 'penrose', '--approximant', '4/3']);
    expect(b.code).toBe(2);
    expect(b.err).toMatch(/approximant: 4\/3 is not a convergent/);
    const c = await cli(['convergents', '--of', 'gold', '--count', '3']);
    expect(c.code).toBe(2);
    expect(c.err).toMatch(/--of/);
  });
});
