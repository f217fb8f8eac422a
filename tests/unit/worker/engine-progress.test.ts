/**
 * The Web Worker's diffraction jobs report the progress of their structure-factor sums (issue 11: every
 * diffraction run over a second shows progress). The sums' accuracy is checked against gemmi in
 * tests/unit/diffraction/structure-factor.test.ts; here only the reporting through runJob.
 */
import { describe, expect, it } from 'vitest';
import { runJob, sumProgress } from '../../../lib/worker/engine';
import { generate } from '../../../lib/models';

describe('diffraction job progress', () => {
  it('a Mo Kα1 powder run of the 3/2 approximant (grid route: at Cu Kα1 its one-reflection-per-orbit list is small enough for the direct sum) reports rising "structure factors" fractions up to 0.9, then finishes', () => {
    const structure = generate({ family: 'icosahedral', mode: 'approximant', order: '3/2', aR: 4.6, species: 'Al' } as never);
    const seen: [string, number | undefined][] = [];
    const r = runJob(
      { kind: 'powder', structure, wavelength: 0.709317, radiation: 'xray', twoThetaMin: 10, twoThetaMax: 120, step: 0.05, fwhm: 0.1 },
      (stage, fraction) => seen.push([stage, fraction]),
    );
    const sums = seen.filter(([s]) => s === 'structure factors').map(([, f]) => f!);
    expect(sums.length).toBeGreaterThan(10);
    expect(sums.every((f, i) => i === 0 || f > sums[i - 1])).toBe(true);
    expect(sums[sums.length - 1]).toBeCloseTo(0.9, 12);
    expect(sums.length).toBeLessThanOrEqual(82); // throttled to about one message per 1 %
    expect(r.peaks.length).toBeGreaterThan(100);
  });

  it('sumProgress maps [0, 1] onto [from, to] and always passes the end', () => {
    const got: number[] = [];
    const p = sumProgress((_s, f) => got.push(f!), 'x', 0.2, 0.6);
    for (let i = 0; i <= 1000; i++) p(i / 1000);
    expect(got[0]).toBeCloseTo(0.2, 12);
    expect(got[got.length - 1]).toBeCloseTo(0.6, 12);
    expect(got.length).toBeLessThanOrEqual(42);
  });
});
