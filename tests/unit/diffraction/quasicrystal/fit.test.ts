/**
 * Scale, zero shift and background fit against a pattern numpy makes from the same line list with known values
 * (Gaussian peaks of FWHM 0.1°, scale 3.2, zero shift +0.045°, background 40 + 0.1·2θ, Poisson noise): the fit
 * must find them within their uncertainties, and χ² must be near 1 (counting statistics, Young, The Rietveld
 * Method, ch. 1).
 */
import { describe, expect, it } from 'vitest';
import { runPython } from '../../../helpers/python';
import { fitLinesToPattern } from '../../../../lib/diffraction/quasicrystal/fit';

const LINES = [
  { twoTheta: 23.27, intensity: 100 },
  { twoTheta: 26.93, intensity: 62 },
  { twoTheta: 35.86, intensity: 41 },
  { twoTheta: 44.23, intensity: 48 },
  { twoTheta: 50.55, intensity: 33 },
  { twoTheta: 62.55, intensity: 20 },
];

describe('fit of scale, zero shift and background', () => {
  it('recovers the values numpy put in', () => {
    const d = runPython<{ x: number[]; y: number[] }>(
      String.raw`
import json, sys
import numpy as np
lines = json.loads(sys.stdin.read())
x = np.arange(20, 70, 0.01)
sig = 0.1 / (2 * np.sqrt(2 * np.log(2)))
y = 40 + 0.1 * x
for l in lines:
    y += 3.2 * l['intensity'] * np.exp(-0.5 * ((x - l['twoTheta'] - 0.045) / sig) ** 2) / (sig * np.sqrt(2 * np.pi))
y = np.random.default_rng(7).poisson(y).astype(float)
print(json.dumps({'x': x.tolist(), 'y': y.tolist()}))
`,
      JSON.stringify(LINES),
    );
    const f = fitLinesToPattern(Float64Array.from(d.x), Float64Array.from(d.y), LINES, { U: 0, V: 0, W: 0.01, eta: 0 });
    expect(Math.abs(f.zeroShift - 0.045)).toBeLessThan(Math.max(3 * f.zeroShiftSigma, 0.002));
    expect(Math.abs(f.scale / 3.2 - 1)).toBeLessThan(0.02);
    expect(f.background[0]).toBeCloseTo(40, -1);
    expect(f.chi2).toBeGreaterThan(0.8);
    expect(f.chi2).toBeLessThan(1.3);
    expect(f.rwp).toBeGreaterThan(0);
  }, 60_000);

  it('refuses non-positive σ', () => {
    const x = Float64Array.from({ length: 20 }, (_, i) => 20 + i);
    expect(() => fitLinesToPattern(x, x, LINES, { U: 0, V: 0, W: 0.01, eta: 0 }, { sigma: new Float64Array(20) })).toThrow(/σ/);
  });
});
