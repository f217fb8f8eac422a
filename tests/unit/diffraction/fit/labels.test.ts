/**
 * Labels of measured peaks: the case of issue 11 worked by hand — a measured pattern shifted by +0.08°
 * puts its strongest peak 0.01° from a weak line (relative 7.6) and 0.08° from the strong one (≈ 1200).
 * With FWHM 0.15°, pseudo-Voigt η = 0.5 (u = 2x/H; G = (2/H)√(ln2/π) e^(−ln2 u²), L = (2/πH)/(1 + u²)):
 * pV(0.08) = ½(2.846 + 1.985) = 2.416 and pV(0.01) = ½(6.186 + 4.170) = 5.178, so the contributions at the
 * peak are 1200·2.416 ≈ 2.9e3 against 7.6·5.178 ≈ 39: the strong line names the peak.
 */
import { describe, expect, it } from 'vitest';
import { labelPeaks } from '../../../../lib/diffraction/fit/labels';
import { pseudoVoigt } from '../../../../lib/diffraction/profile';

describe('peak labels', () => {
  const lines = [
    { twoTheta: 44.0, area: 1200, fwhm: 0.15, d: 2.056, hkl: [8, 5, 3] },
    { twoTheta: 44.07, area: 7.6, fwhm: 0.15, d: 2.053, hkl: [5, 7, 5] },
    { twoTheta: 47.0, area: 50, fwhm: 0.15, d: 1.93, hkl: [9, 0, 0] },
  ];
  it('names a shifted strong peak after the line that contributes most within the width, not the nearest', () => {
    // hand values of the header
    expect(pseudoVoigt(0.08, 0.15, 0.5)).toBeCloseTo(2.416, 3);
    expect(pseudoVoigt(0.01, 0.15, 0.5)).toBeCloseTo(5.178, 3);
    const [p] = labelPeaks([{ x: 44.08, y: 9000 }], lines, 0.5);
    expect(p.line!.hkl).toEqual([8, 5, 3]);
    expect(p.withinWidth).toBe(true);
    expect(p.misfit).toBeCloseTo(0.08, 12);
    expect(p.share).toBeGreaterThan(0.98);
  });
  it('a peak with no line within one width gets the nearest line, flagged', () => {
    const [p] = labelPeaks([{ x: 46.3, y: 10 }], lines, 0.5);
    expect(p.withinWidth).toBe(false);
    expect(p.line!.hkl).toEqual([9, 0, 0]);
  });
});
