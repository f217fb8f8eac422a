import { describe, expect, it } from 'vitest';
import { distinctSpecies, PLACEHOLDER_RADIUS, speciesColour, speciesRadius, tablePlace } from '@/lib/view/palette';

describe('tablePlace (IUPAC 18-column periodic table)', () => {
  it.each([
    [1, 1, 1], [2, 1, 18], [3, 2, 1], [5, 2, 13], [10, 2, 18], [13, 3, 13], [21, 4, 3], [26, 4, 8], [30, 4, 12],
    [46, 5, 10], [54, 5, 18], [56, 6, 2], [57, 6, 0], [71, 6, 0], [72, 6, 4], [79, 6, 11], [86, 6, 18], [89, 7, 0], [104, 7, 4], [118, 7, 18],
  ])('Z %i is in period %i, group %i (0 = f-block)', (z, period, group) => {
    expect(tablePlace(z)).toEqual({ period, group });
  });
});

describe('our species palette', () => {
  const hex = (z: number) => speciesColour(z);
  const rgb = (h: string) => [1, 3, 5].map((k) => parseInt(h.slice(k, k + 2), 16));

  it('gives a valid, distinct colour to X and every element up to Cf', () => {
    const all = Array.from({ length: 99 }, (_, z) => hex(z));
    for (const c of all) expect(c).toMatch(/^#[0-9a-f]{6}$/);
    expect(new Set(all).size).toBe(all.length);
  });

  it('keeps the common quasicrystal constituents well apart (RGB distance > 35)', () => {
    const zs = [12, 13, 20, 22, 25, 26, 27, 28, 29, 30, 46, 48, 67, 70];
    for (let i = 0; i < zs.length; i++)
      for (let j = i + 1; j < zs.length; j++) {
        const [a, b] = [rgb(hex(zs[i])), rgb(hex(zs[j]))];
        expect(Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]), `Z ${zs[i]} vs ${zs[j]}`).toBeGreaterThan(35);
      }
  });

  it('anchors on our tokens: group 13 is tide-teal (green and blue above red)', () => {
    const [r, g, b] = rgb(hex(13));
    expect(g).toBeGreaterThan(r + 60);
    expect(b).toBeGreaterThan(r + 60);
  });
});

describe('drawn radii', () => {
  it('scale the covalent radius and fall back to the placeholder for X', () => {
    // Al 1.21 Å, Cu 1.32 Å (Cordero et al., Dalton Trans. 2008, 2832, Table 2, as in elements.test.ts).
    expect(speciesRadius(13, 0.5)).toBeCloseTo(0.605, 12);
    expect(speciesRadius(29, 2)).toBeCloseTo(2.64, 12);
    expect(speciesRadius(0, 0.5)).toBe(PLACEHOLDER_RADIUS * 0.5);
    expect(distinctSpecies(new Uint16Array([29, 13, 13, 0]))).toEqual([0, 13, 29]);
  });
});
