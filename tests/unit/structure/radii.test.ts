import { describe, expect, it } from 'vitest';
import { contactRadius, metallicRadius, radiusSource, TOO_CLOSE_FRACTION, tooCloseThreshold } from '@/lib/structure';
import { runPython } from '../../helpers/python';

describe('metallic radii (CN 12)', () => {
  it('has the textbook CN-12 metallic radii (Greenwood & Earnshaw, Chemistry of the Elements — from memory)', () => {
    // Typed here from memory as an independent check of the generated table: Al 143 pm, Mg 160 pm, Cu 128 pm, Zn 134 pm.
    expect(metallicRadius(13)).toBeCloseTo(1.43, 2);
    expect(metallicRadius(12)).toBeCloseTo(1.6, 2);
    expect(metallicRadius(29)).toBeCloseTo(1.28, 2);
    expect(metallicRadius(30)).toBeCloseTo(1.34, 2);
  });

  it('agrees with pymatgen Element.metallic_radius for every element it has (reference library)', () => {
    const ref = runPython<(number | null)[]>(
      [
        'import json',
        'from pymatgen.core.periodic_table import Element',
        'out = [None]',
        'for z in range(1, 99):',
        '    v = Element.from_Z(z).data.get("Metallic radius")',
        '    try: out.append(float(v))',
        '    except (TypeError, ValueError): out.append(None)',
        'print(json.dumps(out))',
      ].join('\n'),
    );
    for (let z = 1; z <= 98; z++) {
      const r = ref[z];
      if (r === null) expect(Number.isNaN(metallicRadius(z))).toBe(true);
      else expect(metallicRadius(z)).toBe(r);
    }
  });

  it('falls back to the covalent radius for non-metals and to NaN for X', () => {
    expect(radiusSource(13)).toBe('metallic');
    expect(radiusSource(14)).toBe('covalent');
    expect(contactRadius(14)).toBeCloseTo(1.11, 6); // Cordero 2008 Si
    expect(radiusSource(0)).toBe('none');
    expect(Number.isNaN(tooCloseThreshold(0, 13))).toBe(true);
  });

  it('puts the too-close threshold below real nearest neighbours and above overlaps', () => {
    expect(TOO_CLOSE_FRACTION).toBe(0.8);
    // fcc Al nearest neighbour a/√2 with a = 4.0495 Å (handbook lattice constant at 25 °C, from memory): 2.863 Å.
    const alNN = 4.0495 / Math.SQRT2;
    expect(tooCloseThreshold(13, 13)).toBeCloseTo(0.8 * 2.86, 6);
    expect(alNN).toBeGreaterThan(tooCloseThreshold(13, 13));
    // Short Al–Co contact in Al13Co4 ≈ 2.35 Å (from memory) must not be flagged.
    expect(2.35).toBeGreaterThan(tooCloseThreshold(13, 27));
    expect(() => tooCloseThreshold(99, 13)).toThrow(/out of range/);
  });
});
