import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { cli as run } from '../../helpers/cli';
import { writeJson } from '../../../lib/formats/json';
import { crystal, cubic, FCC } from '../diffraction/helpers';

const dir = mkdtempSync(join(tmpdir(), 'tf-diffract-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** stdout of a run that must succeed. */
async function cli(args: string[]): Promise<string> {
  const r = await run(args);
  expect(r.err).toBe('');
  expect(r.code).toBe(0);
  return r.out;
}

/** A run that must fail with exit code 2 (a bad flag or file); returns stderr. */
async function fails(args: string[]): Promise<string> {
  const r = await run(args);
  expect(r.out).toBe('');
  expect(r.code).toBe(2);
  return r.err;
}

const cuFile = join(dir, 'cu.json');
writeFileSync(cuFile, writeJson(crystal(cubic(3.615), FCC.map(([x, y, z]) => [29, x, y, z]))));

describe('diffract command line', () => {
  it('powder json: units, peaks {twoTheta, d, hkl, multiplicity, intensity} with largest 100, profile', async () => {
    const j = JSON.parse(await cli(['diffract', 'powder', '--input', cuFile, '--wavelength', 'CuKa1', '--range', '20:90', '--format', 'json']));
    expect(j.units.q).toMatch(/4π sinθ\/λ/);
    // fcc: h, k, l all odd or all even (extinction rule of the F lattice); 2θ(222) = 95.1° is past 90°.
    expect(j.peaks.map((p: { hkl: number[] }) => p.hkl.join(''))).toEqual(['111', '200', '220', '311']);
    expect(j.peaks.map((p: { multiplicity: number }) => p.multiplicity)).toEqual([8, 6, 12, 24]);
    expect(Math.max(...j.peaks.map((p: { intensity: number }) => p.intensity))).toBe(100);
    // Bragg's law with Cu Kα1 (International Tables value 1.540593 Å), d(111) = a/√3.
    expect(j.peaks[0].twoTheta).toBeCloseTo((360 / Math.PI) * Math.asin(1.540593 / (2 * (3.615 / Math.sqrt(3)))), 5);
    expect(j.profile.twoTheta.length).toBe(j.profile.intensity.length);
  });

  it('powder csv starts with the units comment', async () => {
    const out = await cli(['diffract', 'powder', '--input', cuFile, '--range', '20:60', '--format', 'csv']);
    expect(out.split('\n')[0]).toMatch(/^# units: .*4π sinθ\/λ = 2π\/d/);
    expect(out).toContain('twoTheta,d,q,h,k,l,multiplicity,intensity');
  });

  it('at: one |F|²/N per Q line, unit form factors for species X (a 2-point X chain: |1 + e^{iQd}|²/2 = 1 + cos Qd)', async () => {
    const xyz = join(dir, 'x2.xyz');
    writeFileSync(xyz, '2\nX pair\nX 0 0 0\nX 1.5 0 0\n');
    const qf = join(dir, 'q.txt');
    writeFileSync(qf, '0 0 0\n1.0 0 0\n# comment\n2.0 0.5 0\n');
    const out = (await cli(['diffract', 'at', '--input', xyz, '--q-file', qf])).trim().split('\n').map(Number);
    expect(out).toHaveLength(3);
    expect(out[0]).toBeCloseTo(2, 10);
    expect(out[1]).toBeCloseTo(1 + Math.cos(1.5), 10);
    expect(out[2]).toBeCloseTo(1 + Math.cos(3.0), 10);
    writeFileSync(qf, '0 0 0\n1 2\n');
    expect(await fails(['diffract', 'at', '--input', xyz, '--q-file', qf])).toMatch(/--q-file line 2/);
  });

  it('hyperspace and zone json; bad flags exit with code 2 and name the flag', async () => {
    const h = JSON.parse(await cli(['diffract', 'hyperspace', '--family', 'fibonacci', '--aR', '2.5', '--qmax', '4', '--format', 'json']));
    expect(h.peaks[0].indices).toEqual([0, 0]);
    expect(h.units.q).toBeDefined();
    const z = JSON.parse(await cli(['diffract', 'zone', '--input', cuFile, '--axis', '0,0,1', '--qmax', '5', '--format', 'json']));
    expect(z.spots.every((s: { hkl: number[] }) => s.hkl[2] === 0)).toBe(true);
    expect(await fails(['diffract', 'powder', '--input', cuFile, '--range', '90:20'])).toMatch(/--range .*end 20 must exceed start 90/);
    expect(await fails(['diffract', 'powder', '--input', cuFile, '--wavelength', 'Xx'])).toMatch(/--wavelength .*"Xx" is not a wavelength/);
    expect(await fails(['diffract', 'powder', '--input', cuFile, '--background', '1,x'])).toMatch(/--background .*"x" is not a number/);
    expect(await fails(['diffract', 'powder', '--input', cuFile, '--radiation', 'gamma'])).toMatch(/--radiation .*xray, neutron, electron/);
    expect(await fails(['diffract', 'hyperspace', '--family', 'hex', '--aR', '1', '--qmax', '2'])).toMatch(/--family .*icosahedral, penrose, octagonal, fibonacci/);
    expect(await fails(['diffract', 'zone', '--input', cuFile, '--axis', '7', '--qmax', '5'])).toMatch(/axis: must be 5, 3 or 2 \(an icosahedral axis\) or three integers u,v,w/);
    expect(await fails(['diffract', 'powder', '--input', join(dir, 'missing.cif')])).toMatch(/--input: cannot read/);
  });

  it('compare: a measured file made from the simulation ×2 + 5 fits back with R ≈ 0', async () => {
    const sim = JSON.parse(await cli(['diffract', 'powder', '--input', cuFile, '--range', '30:100', '--step', '0.01']));
    const lines = ['2theta counts'];
    sim.profile.twoTheta.forEach((t: number, i: number) => lines.push(`${t} ${2 * sim.profile.intensity[i] + 5}`));
    const mf = join(dir, 'm.xy');
    writeFileSync(mf, lines.join('\n'));
    const c = JSON.parse(await cli(['diffract', 'compare', '--input', cuFile, '--measured', mf, '--range', '30:100', '--step', '0.01']));
    expect(c.scale).toBeCloseTo(2, 3);
    expect(c.background).toBeCloseTo(5, 1);
    expect(c.rwp).toBeLessThan(1e-4);
    expect(c.peaks[0].nearest.hkl).toEqual([1, 1, 1]);
    // A bad step is the user's to fix (exit 2, the schema's message), not a crash.
    expect(await fails(['diffract', 'compare', '--input', cuFile, '--measured', mf, '--step', '-1'])).toMatch(/step must be positive/);
  });

  it('compare --fit: prints every fitted parameter with σ and R before/after; a zero shift of +0.06° comes back (plumbing check — the fit itself is tested against numpy + gemmi in tests/unit/diffraction/fit)', async () => {
    const sim = JSON.parse(await cli(['diffract', 'powder', '--input', cuFile, '--range', '30:100', '--step', '0.01', '--U', '0', '--V', '0', '--W', '0.01']));
    const lines = ['2theta counts'];
    sim.profile.twoTheta.forEach((t: number, i: number) => lines.push(`${(t + 0.06).toFixed(4)} ${200 * sim.profile.intensity[i] + 50}`));
    const mf = join(dir, 'shifted.xy');
    writeFileSync(mf, lines.join('\n'));
    const c = JSON.parse(await cli(['diffract', 'compare', '--input', cuFile, '--measured', mf, '--fit', '--U', '0', '--V', '0', '--W', '0.01', '--bg-terms', '2', '--no-lattice']));
    expect(Object.keys(c.parameters).sort()).toEqual(['U', 'V', 'W', 'background0', 'background1', 'scale', 'zero']);
    expect(c.parameters.zero.value).toBeCloseTo(0.06, 3);
    expect(c.parameters.zero.sigma).toBeGreaterThan(0);
    expect(c.before.rwp).toBeGreaterThan(0.2);
    expect(c.rwp).toBeLessThan(0.01);
    expect(c.peaks[0].label.hkl).toEqual([1, 1, 1]);
    expect(await fails(['diffract', 'compare', '--input', cuFile, '--measured', mf, '--fit', '--bg-terms', '40'])).toMatch(/background: need 0 to 12/);
  });
});
