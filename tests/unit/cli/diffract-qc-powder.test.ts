/**
 * `diffract qc-powder` end to end: the decorated model's lines carry the orbit sizes of the icosahedron's axes
 * (12 five-fold, 20 three-fold, 30 two-fold directions: its 12 vertices, 20 faces and 30 edges — handbook geometry),
 * and a bad model file is refused with the field named.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { cli } from '../../helpers/cli';

const dir = mkdtempSync(join(tmpdir(), 'tf-qcpowder-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('diffract qc-powder', () => {
  it('gives icosahedral stars with the axis multiplicities', async () => {
    const f = join(dir, 'm.json');
    writeFileSync(f, JSON.stringify({ aR: 4.6, lattice: 'P', decoration: { classes: [{ name: 'v', position: 'node', window: { kind: 'hypercube', scale: 1 }, species: 'Al' }, { name: 'b', position: 'body', window: { kind: 'sphere', radius: 3 }, species: 'Mn' }] } }));
    const r = await cli(['diffract', 'qc-powder', '--model', f, '--range', '5:60']);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const o = JSON.parse(r.out);
    const byIndices = new Map<string, number>(o.stars.map((s: { indices: number[]; multiplicity: number }) => [s.indices.join(','), s.multiplicity]));
    expect(byIndices.get('1,0,0,0,0,0')).toBe(12); // five-fold
    expect(byIndices.get('1,1,1,0,0,0')).toBe(20); // three-fold
    expect(byIndices.get('1,1,0,0,0,0')).toBe(30); // two-fold
    expect(Math.max(...o.stars.map((s: { intensity: number }) => s.intensity))).toBe(100);
  }, 60_000);

  it('refuses a model without aR', async () => {
    const f = join(dir, 'bad.json');
    writeFileSync(f, JSON.stringify({ lattice: 'P' }));
    const r = await cli(['diffract', 'qc-powder', '--model', f]);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toMatch(/aR/);
  });
});
