/**
 * lib/diffraction/index.ts re-exports the quasicrystal module (issue 11): every run-time export of
 * lib/diffraction/quasicrystal is reachable from lib/diffraction as the same function, and the one name both
 * define (findPeaks) stays the comparison's simple finder, with the quasicrystal's fitted one as findFittedPeaks.
 * Import cycles are checked in tests/unit/architecture.test.ts. (Plumbing: no outside reference applies.)
 */
import { describe, expect, it } from 'vitest';
import * as diffraction from '../../../lib/diffraction';
import * as quasicrystal from '../../../lib/diffraction/quasicrystal';
import * as compare from '../../../lib/diffraction/compare';

describe('lib/diffraction index', () => {
  it('re-exports the quasicrystal module, findPeaks of both kept apart', () => {
    const all = diffraction as Record<string, unknown>;
    const names = Object.keys(quasicrystal);
    expect(names).toEqual(expect.arrayContaining(['indexIcosahedralPattern', 'qcPowder', 'fitLinesToPattern', 'qcReflections', 'progressRange']));
    for (const name of names) {
      const v = (quasicrystal as Record<string, unknown>)[name];
      if (name === 'findPeaks') expect(all.findFittedPeaks, name).toBe(v);
      else expect(all[name], name).toBe(v);
    }
    expect(diffraction.findPeaks).toBe(compare.findPeaks);
  });
});
