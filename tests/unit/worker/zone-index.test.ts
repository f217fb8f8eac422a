/**
 * Zone-spot indices respect the hyperlattice type. The reciprocal lattice of the face-centred 6D lattice
 * D6 = {n ∈ Z⁶: Σn even} is D6* = Z⁶ ∪ (Z⁶ + ½(1,…,1)), and that of the body-centred Z⁶ ∪ (Z⁶ + ½·1) is D6
 * (Conway & Sloane, Sphere Packings, Lattices and Groups, ch. 4 §7.1 — D_n* and its dual). In the doubled
 * (conventional) cell the F reflections are "all even or all odd".
 */
import { describe, expect, it } from 'vitest';
import { indexIcosahedralSpot, indexScale } from '../../../lib/worker/zone-index';
import { csgFromHyper } from '../../../lib/diffraction/indexing';
import { TAU } from '../../../lib/math/golden';

const aR = 4.6;
const c = indexScale(aR);
const qOf = (h: number[]): [number, number, number] => {
  const { hh } = csgFromHyper(h);
  return [c * (hh[0] + hh[1] * TAU), c * (hh[2] + hh[3] * TAU), c * (hh[4] + hh[5] * TAU)];
};

describe('icosahedral spot indices by hyperlattice type', () => {
  it('F: the superstructure spot h = ½(1,…,1) is indexed as conventional (1 1 1 1 1 1), all odd; P parity cannot give it', () => {
    const h = [0.5, 0.5, 0.5, 0.5, 0.5, 0.5];
    const f = indexIcosahedralSpot(qOf(h), aR, 1e-4, 12, 'F')!;
    expect(f.hyper).toEqual([1, 1, 1, 1, 1, 1]);
    expect(f.label).toBe('0/1 0/1 0/1');
    const p = indexIcosahedralSpot(qOf(h), aR, 1e-4, 12, 'P');
    // With P parity the same position either has no index or one with a larger |Q⊥|.
    if (p) expect(p.qPerp).toBeGreaterThan(f.qPerp);
    // F main reflections: integer primitive h → all even in the conventional cell
    const main = indexIcosahedralSpot(qOf([1, 0, 0, 0, 0, 0]), aR, 1e-4, 12, 'F')!;
    expect(main.hyper.every((v) => v % 2 === 0)).toBe(true);
  });

  it('I: reflections with Σh odd are extinct, so (1 0 0 0 0 0) is not a label of an I pattern', () => {
    const odd = indexIcosahedralSpot(qOf([1, 0, 0, 0, 0, 0]), aR, 1e-4, 12, 'I');
    if (odd) {
      expect(odd.hyper.reduce((a, b) => a + b, 0) % 2).toBe(0);
      expect(odd.hyper).not.toEqual([1, 0, 0, 0, 0, 0]);
    }
    const even = indexIcosahedralSpot(qOf([1, 1, 0, 0, 0, 0]), aR, 1e-4, 12, 'I')!;
    expect(even.hyper).toEqual([1, 1, 0, 0, 0, 0]);
  });
});
