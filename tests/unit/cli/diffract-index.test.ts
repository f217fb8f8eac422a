/** `diffract index` end to end on a numpy-made synthetic icosahedral pattern (tests/unit/diffraction/quasicrystal/synthetic.ts). */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { cli } from '../../helpers/cli';
import { syntheticPattern } from '../diffraction/quasicrystal/synthetic';

const dir = mkdtempSync(join(tmpdir(), 'tf-index-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('diffract index', () => {
  it('indexes a P pattern and refines aR and the zero shift', async () => {
    const s = syntheticPattern({ aR: 4.56, lattice: 'P', zero: 0.037, lambda: 1.5405929, fwhm: 0.08, seed: 11 });
    const f = join(dir, 'p.xy');
    writeFileSync(f, '2theta intensity\n' + s.x.map((x, i) => `${x.toFixed(3)} ${s.y[i]}`).join('\n') + '\n');
    const r = await cli(['diffract', 'index', '--input', f, '--family', 'icosahedral', '--lattice', 'P', '--wavelength', 'CuKa1', '--format', 'json']);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const o = JSON.parse(r.out);
    expect(Math.abs(o.aR / 4.56 - 1)).toBeLessThan(5e-4);
    expect(Math.abs(o.zeroShift - 0.037)).toBeLessThan(0.01);
    expect(o.aRSigma).toBeGreaterThan(0);
    expect(o.peaks[0]).toHaveProperty('indices');
    expect(o.peaks[0]).toHaveProperty('N');
    expect(o.peaks[0]).toHaveProperty('residual');
    expect(o.phasonStrain.width).toHaveProperty('slopeSigma');
  }, 60_000);

  it('fails with a clear message on a file without peaks and stores nothing', async () => {
    const f = join(dir, 'flat.xy');
    writeFileSync(f, Array.from({ length: 100 }, (_, i) => `${20 + i * 0.5} 100`).join('\n'));
    const r = await cli(['diffract', 'index', '--input', f, '--lattice', 'P']);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toMatch(/peaks found/);
  });
});
