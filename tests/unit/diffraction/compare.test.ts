import { describe, expect, it } from 'vitest';
import { comparePatterns, fitScale, rFactors } from '../../../lib/diffraction/compare';
import { braggPowder } from '../../../lib/diffraction/powder';
import { readMeasured } from '../../../lib/formats/measured';
import { crystal, cubic, FCC } from './helpers';
import { runPython } from '../../helpers/python';

describe('comparison with measured data', () => {
  it('R_p and R_wp follow the Rietveld definitions (hand-worked example: Rp = 3/60, Rwp = √(0.3/60))', () => {
    const { rp, rwp } = rFactors([10, 20, 30], [11, 18, 30], [1 / 10, 1 / 20, 1 / 30]);
    expect(rp).toBeCloseTo(0.05, 12);
    expect(rwp).toBeCloseTo(Math.sqrt(0.3 / 60), 12);
  });

  it('weighted scale + background equals numpy.linalg.lstsq on √w-scaled equations', () => {
    let seed = 3;
    const rnd = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
    const x = Array.from({ length: 40 }, () => rnd() * 10);
    const y = x.map((v) => 2.5 * v + 4 + rnd());
    const w = y.map((v) => 1 / v);
    const ours = fitScale(y, x, w, true);
    const ref = runPython<number[]>(
      `import numpy as np, json, sys
d=json.load(sys.stdin); x=np.array(d['x']); y=np.array(d['y']); w=np.array(d['w'])
A=np.vstack([x,np.ones_like(x)]).T*np.sqrt(w)[:,None]
print(json.dumps(list(np.linalg.lstsq(A,y*np.sqrt(w),rcond=None)[0])))`,
      JSON.stringify({ x, y, w }),
    );
    expect(ours.scale).toBeCloseTo(ref[0], 10);
    expect(ours.background).toBeCloseTo(ref[1], 10);
  });

  it('a measured file that is 3.7 × simulation + 12 gives scale 3.7, background 12, R = 0, and every peak matched to its hkl', () => {
    const cu = crystal(cubic(3.615), FCC.map(([x, y, z]) => [29, x, y, z]));
    const sim = braggPowder(cu, {
      wavelength: 1.540593,
      radiation: 'xray',
      twoThetaMin: 30,
      twoThetaMax: 100,
      profile: { U: 0.01, V: -0.005, W: 0.005, eta: 0.5, step: 0.01 },
    });
    const lines = ['# synthetic', '2theta intensity'];
    for (let i = 0; i < sim.profile!.twoTheta.length; i += 2) {
      lines.push(`${sim.profile!.twoTheta[i].toFixed(4)} ${(3.7 * sim.profile!.intensity[i] + 12).toFixed(6)}`);
    }
    const m = readMeasured(lines.join('\n'));
    // fcc Cu, 30° < 2θ < 100° at Cu Kα1: 111, 200, 220, 311, 222 (F-lattice extinctions; 2θ(400) = 116.9°).
    expect(sim.peaks.map((p) => p.hkl.join(''))).toEqual(['111', '200', '220', '311', '222']);
    const refl = sim.peaks.map((p) => ({ twoTheta: p.twoTheta, d: p.d, hkl: p.hkl, intensity: p.intensity }));
    const r = comparePatterns(m, sim.profile!, refl, { wavelength: 1.540593 });
    expect(r.scale).toBeCloseTo(3.7, 4);
    expect(r.background).toBeCloseTo(12, 2);
    expect(r.rp).toBeLessThan(1e-5);
    expect(r.rwp).toBeLessThan(1e-5);
    expect(r.peaks.map((p) => p.nearest!.hkl!.join(''))).toEqual(sim.peaks.map((p) => p.hkl.join('')));
    for (const p of r.peaks) expect(Math.abs(p.misfit!)).toBeLessThan(0.011);
    // Same data on the d axis (d = λ / 2 sinθ) gives the same fit.
    const dLines = ['d I'];
    for (let i = 0; i < sim.profile!.twoTheta.length; i += 2) {
      const d = 1.540593 / (2 * Math.sin((sim.profile!.twoTheta[i] * Math.PI) / 360));
      dLines.push(`${d.toFixed(8)} ${(3.7 * sim.profile!.intensity[i] + 12).toFixed(6)}`);
    }
    const rd = comparePatterns(readMeasured(dLines.join('\n')), sim.profile!, refl, { wavelength: 1.540593 });
    expect(rd.scale).toBeCloseTo(3.7, 3);
    expect(() => comparePatterns(readMeasured(dLines.join('\n')), sim.profile!, refl)).toThrow(/wavelength/);
  });

  it('coincident reflections make one peak-table line: the strongest hkl and the summed intensity', () => {
    // Cubic d-spacing d = a/√(h²+k²+l²) and Bragg's law λ = 2d sinθ: (1 9 4) and (8 5 3) both have
    // h²+k²+l² = 98, so a P1 list gives them at one 2θ; (8 5 3) is the strong one here.
    const a = 20.4887;
    const lambda = 1.540593;
    const line = (hkl: number[], intensity: number) => {
      const d = a / Math.hypot(hkl[0], hkl[1], hkl[2]);
      return { twoTheta: (360 / Math.PI) * Math.asin(lambda / (2 * d)), d, hkl, intensity };
    };
    const refl = [line([1, -9, -4], 0.1), line([8, 5, 3], 49), line([-8, 5, 3], 48), line([7, 7, 1], 3)];
    const tt = refl[0].twoTheta;
    expect(Math.abs(refl[1].twoTheta - tt)).toBeLessThan(1e-9);
    // A Gaussian peak at that 2θ on a flat background, sampled every 0.02°.
    const xs: number[] = [];
    const ys: number[] = [];
    for (let x = tt - 1; x <= tt + 1; x += 0.02) {
      xs.push(x);
      ys.push(10 + 1000 * Math.exp(-(((x - tt) / 0.06) ** 2)));
    }
    const m = readMeasured(xs.map((x, i) => `${x.toFixed(4)} ${ys[i].toFixed(3)}`).join('\n'));
    const sim = { twoTheta: Float64Array.from(xs), intensity: Float64Array.from(ys) };
    const r = comparePatterns(m, sim, refl, { wavelength: lambda });
    expect(r.peaks).toHaveLength(1);
    expect(r.peaks[0].nearest!.hkl).toEqual([8, 5, 3]);
    expect(r.peaks[0].nearest!.intensity).toBeCloseTo(0.1 + 49 + 48, 9);
    expect(Math.abs(r.peaks[0].misfit!)).toBeLessThan(0.011);
  });
});
