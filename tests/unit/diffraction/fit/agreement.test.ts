/**
 * R_p, R_wp, R_exp and χ² (Young, The Rietveld Method, 1993, ch. 1) on a worked numeric example computed
 * independently with numpy: 12 points, σ given, P = 3 parameters.
 */
import { describe, expect, it } from 'vitest';
import { runPython } from '../../../helpers/python';
import { agreement, powderWeights } from '../../../../lib/diffraction/fit/agreement';

const YO = [120, 95, 310, 1480, 2210, 900, 240, 130, 0, -4, 88, 101];
const YC = [118, 99, 290, 1510, 2170, 935, 232, 127, 3, 2, 90, 97];
const SIG = [11, 10, 18, 38, 47, 30, 15.5, 11.4, 1, 2, 9.4, 10];

describe('agreement indices', () => {
  it('match numpy on a worked example (σ column as weights)', () => {
    const ref = runPython<{ rp: number; rwp: number; rexp: number; chi2: number }>(`
import json, numpy as np
yo = np.array(${JSON.stringify(YO)}, float); yc = np.array(${JSON.stringify(YC)}, float)
w = 1 / np.array(${JSON.stringify(SIG)}, float) ** 2
N, P = len(yo), 3
rp = np.abs(yo - yc).sum() / np.abs(yo).sum()
rwp = np.sqrt((w * (yo - yc) ** 2).sum() / (w * yo ** 2).sum())
rexp = np.sqrt((N - P) / (w * yo ** 2).sum())
chi2 = (w * (yo - yc) ** 2).sum() / (N - P)
print(json.dumps(dict(rp=rp, rwp=rwp, rexp=rexp, chi2=chi2)))`);
    const { w, source } = powderWeights(YO, SIG);
    expect(source).toBe('sigma');
    const a = agreement(YO, YC, w, 3);
    expect(a.rp).toBeCloseTo(ref.rp, 12);
    expect(a.rwp).toBeCloseTo(ref.rwp, 12);
    expect(a.rexp).toBeCloseTo(ref.rexp, 12);
    expect(a.chi2).toBeCloseTo(ref.chi2, 10);
    // χ² = (R_wp / R_exp)² (Young 1993 ch. 1)
    expect(a.chi2).toBeCloseTo((a.rwp / a.rexp) ** 2, 10);
  });

  it('counting statistics: w = 1/y; a point with y ≤ 0 weighs like its neighbours (mean of the positive counts within ±5), never the most', () => {
    const { w, source } = powderWeights(YO);
    expect(source).toBe('counts');
    expect(w[0]).toBeCloseTo(1 / 120, 15);
    // point 8 (y = 0): neighbours 3..11 with y > 0 are 1480, 2210, 900, 240, 130, 88, 101 → mean 735.57
    expect(w[8]).toBeCloseTo(1 / ((1480 + 2210 + 900 + 240 + 130 + 88 + 101) / 7), 12);
    // point 9 (y = −4): neighbours 4..11 with y > 0: 2210, 900, 240, 130, 88, 101 → mean 611.5
    expect(w[9]).toBeCloseTo(1 / 611.5, 12);
    const max = Math.max(...w);
    expect(max).toBeCloseTo(1 / 88, 15);
    expect(w[8]).toBeLessThan(max);
    expect(w[9]).toBeLessThan(max);
    const small = powderWeights([0.1, 0.5, 0.9]);
    expect(small.warnings.join(' ')).toMatch(/does not look like counts/);
  });

  it('rejects a non-positive σ and too few points, naming the field', () => {
    expect(() => powderWeights([1, 2], [1, 0])).toThrow(/^sigma: point 2/);
    expect(() => agreement([1, 2], [1, 2], [1, 1], 2)).toThrow(/^range:/);
  });
});
