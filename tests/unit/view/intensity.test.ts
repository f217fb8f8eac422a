/**
 * Intensity axes and spot weights. Expected values are worked by hand from the definitions: a decade is a
 * factor of ten (log10), the square-root axis is the one powder diffractionists use to bring weak peaks up
 * (counting statistics: σ = √N, so √I has constant noise), and the zone pattern's former log mode showed
 * four decades (floor 10⁻⁴), which spotWeight(·, 4) must reproduce.
 */
import { describe, expect, it } from 'vitest';
import { fromAxis, LOG_FLOOR, nearestReflection, spotWeight, toAxis, type IntensityScale } from '@/lib/view/intensity';

describe('toAxis / fromAxis', () => {
  it('maps by hand-worked values', () => {
    expect(toAxis(400, 'linear')).toBe(400);
    expect(toAxis(400, 'sqrt')).toBe(20);
    expect(toAxis(-9, 'sqrt')).toBe(-3);
    expect(toAxis(1000, 'log')).toBeCloseTo(3, 12);
    expect(toAxis(0, 'log')).toBeCloseTo(Math.log10(LOG_FLOOR), 12);
    expect(toAxis(-5, 'log', 1e-3)).toBeCloseTo(-3, 12);
  });

  it.each(['linear', 'sqrt', 'log'] as IntensityScale[])('fromAxis undoes toAxis on the %s axis', (s) => {
    for (const v of [0.01, 1, 37.5, 1e4]) expect(fromAxis(toAxis(v, s), s)).toBeCloseTo(v, 9);
  });
});

describe('spotWeight', () => {
  it('over four decades: 1 at the strongest, ½ at 10⁻², 0 at and below 10⁻⁴', () => {
    expect(spotWeight(1, 4)).toBe(1);
    expect(spotWeight(1e-2, 4)).toBeCloseTo(0.5, 12);
    expect(spotWeight(1e-4, 4)).toBeCloseTo(0, 12);
    expect(spotWeight(1e-6, 4)).toBe(0);
  });

  it('fewer decades hide weak spots, more decades bring them up; 0 decades is linear', () => {
    expect(spotWeight(1e-3, 2)).toBe(0);
    expect(spotWeight(1e-3, 6)).toBeCloseTo(0.5, 12);
    expect(spotWeight(0.25, 0)).toBe(0.25);
    expect(spotWeight(0, 4)).toBe(0);
  });
});

describe('nearestReflection', () => {
  const peaks = [
    { twoTheta: 20, hkl: [1, 0, 0], intensity: 50 },
    { twoTheta: 20.3, hkl: [1, 1, 0], intensity: 0.5 },
    { twoTheta: 30, hkl: [1, 1, 1], intensity: 100 },
  ];
  it('picks the nearest within the tolerance, skipping weak ones when asked', () => {
    expect(nearestReflection(peaks, 20.25, 0.5)?.hkl).toEqual([1, 1, 0]);
    expect(nearestReflection(peaks, 20.25, 0.5, 1)?.hkl).toEqual([1, 0, 0]);
    expect(nearestReflection(peaks, 25, 0.5)).toBeNull();
  });
});
