/**
 * Resolution and range limits of powder runs, the Kα2 line, complex neutron lengths and the merged peak
 * table — each against a source outside this code (named per check).
 */
import { describe, expect, it } from 'vitest';
import { runPython } from '../../helpers/python';
import { braggPowder, ELECTRON_DEFAULT_DMIN } from '../../../lib/diffraction/powder';
import { formFactorRangeWarning, neutronScatteringLengthComplex } from '../../../lib/diffraction/form-factors';
import { kalpha2Of, XRAY_LINES } from '../../../lib/diffraction/wavelengths';
import { peakTableCsv } from '../../../lib/diffraction/peak-table';
import { crystal, cubic, FCC } from './helpers';
import type { Cell } from '../../../lib/structure/types';

describe('Kα doublet', () => {
  it('I(Kα2)/I(Kα1) per element equals xraylib RadRate(KL2)/RadRate(KL3) to 5e-4; Kα2 goes with Kα1 names only', () => {
    const ref = runPython<Record<string, number>>(`
import json, xraylib as x
Z = dict(Cr=24, Co=27, Cu=29, Mo=42, Ag=47)
print(json.dumps({k: x.RadRate(z, x.KL2_LINE) / x.RadRate(z, x.KL3_LINE) for k, z in Z.items()}))`);
    for (const [el, r] of Object.entries(ref)) expect(Math.abs(XRAY_LINES[el as keyof typeof XRAY_LINES].ratio - r)).toBeLessThan(5e-4);
    expect(kalpha2Of('CuKa1')).toEqual({ wavelength: 1.544414, ratio: 0.5132 });
    expect(kalpha2Of('CuKa')).toBeUndefined(); // the weighted mean already contains Kα2
    expect(kalpha2Of(1.54)).toBeUndefined();
  });
});

describe('resolution limits', () => {
  // The 2/1-sized cubic cell (a = 20.49 Å) of issue 11 with 200 kV electrons asked for ~2e11 reflections.
  const big = crystal(cubic(20.4887), FCC.map(([x, y, z]) => [13, x, y, z] as [number, number, number, number]));
  const lambda200kV = 0.0250793; // Williams & Carter Table 1.1: 0.02508 Å at 200 kV

  it('electrons stop at d = 0.5 Å unless dMin is set, with a warning; a too-fine dMin is refused with the finest allowed (neutrons: no form-factor cap)', () => {
    const r = braggPowder(big, { wavelength: lambda200kV, radiation: 'electron', twoThetaMin: 0.1, twoThetaMax: 120 });
    expect(r.dMin).toBe(ELECTRON_DEFAULT_DMIN);
    expect(r.warnings.join(' ')).toMatch(/electron powder stops at d = 0.5 Å/);
    expect(Math.min(...r.peaks.map((p) => p.d))).toBeGreaterThanOrEqual(0.5 - 1e-9);
    // 4πV/(3 dMin³) reflections: V = 8601 Å³ at dMin = 0.05 Å → 2.9e8 > 2e7
    // 0.05 Å neutrons to 2θ = 120°: d down to λ/(2 sin 60°) = 0.0289 Å → (4π/3)·8601/0.0289³ ≈ 1.50e9
    expect(() => braggPowder(big, { wavelength: 0.05, radiation: 'neutron', twoThetaMin: 1, twoThetaMax: 120 })).toThrow(
      /^dMin: d down to 0\.0289 Å asks for about 1\.50e\+9 reflections .* set dMin to at least 0\.12\d* Å/,
    );
  });

  it('form-factor fit ranges: X-rays warn beyond sinθ/λ = 2 Å⁻¹ (ITC 6.1.1.4); electrons stop at 2 Å⁻¹ (Peng et al. 1996 0–2 set)', () => {
    expect(formFactorRangeWarning('xray', 1.9)).toBeNull();
    expect(formFactorRangeWarning('xray', 2.5)).toMatch(/beyond the 2 Å⁻¹ range of the International Tables C 6.1.1.4/);
    expect(formFactorRangeWarning('neutron', 10)).toBeNull();
    const cell: Cell = cubic(4.05);
    const al = crystal(cell, FCC.map(([x, y, z]) => [13, x, y, z] as [number, number, number, number]));
    // Ag Kα to 170°: d down to 0.281 Å, s = 1.78 — inside; an electron run with dMin 0.1 Å (s = 5) is capped at 0.25 Å
    expect(braggPowder(al, { wavelength: 0.5594075, radiation: 'xray', twoThetaMin: 5, twoThetaMax: 170 }).warnings).toEqual([]);
    const e = braggPowder(al, { wavelength: lambda200kV, radiation: 'electron', twoThetaMin: 0.1, twoThetaMax: 20, dMin: 0.1 });
    expect(e.dMin).toBe(0.25);
    expect(e.warnings.join(' ')).toMatch(/Peng et al\. \(1996\).*d < 0.25 Å are left out/);
  });
});

describe('complex neutron scattering lengths', () => {
  it('imaginary parts of B, Cd, Sm, Eu, Gd, Dy agree with periodictable at 1.798 Å within 5 % (Sears 1992 vs Rauch & Waschkowski 2003)', () => {
    const ref = runPython<Record<string, number>>(`
import json, periodictable as pt
out = {}
for s in ['B', 'Cd', 'Sm', 'Eu', 'Gd', 'Dy']:
    b = getattr(pt, s).neutron.scattering_by_wavelength(1.798)[0]
    out[s] = -b.imag
print(json.dumps(out))`);
    const Z: Record<string, number> = { B: 5, Cd: 48, Sm: 62, Eu: 63, Gd: 64, Dy: 66 };
    for (const [el, bi] of Object.entries(ref)) {
      const [, im] = neutronScatteringLengthComplex(Z[el]);
      expect(Math.abs(im - bi) / bi, el).toBeLessThan(0.05);
    }
    expect(neutronScatteringLengthComplex(13)[1]).toBe(0);
  });

  it('zinc-blende CdTe: |F|² with complex b_Cd equals numpy complex arithmetic on the same lengths (gemmi Sears real parts, b″_Cd = 0.70 fm); the run warns about absorption', () => {
    const a = 6.481;
    const sites: [number, number, number, number][] = [];
    for (const [x, y, z] of FCC) sites.push([48, x, y, z], [52, x + 0.25, y + 0.25, z + 0.25]);
    const s = crystal(cubic(a), sites);
    const r = braggPowder(s, { wavelength: 1.798, radiation: 'neutron', twoThetaMin: 10, twoThetaMax: 60 });
    expect(r.warnings.join(' ')).toMatch(/neutron absorption: Cd \(σ_a = 2520 b\)/);
    const byHkl = new Map(r.peaks.map((p) => [p.hkl.join(''), p]));
    const ratio = byHkl.get('200')!.f2 / byHkl.get('111')!.f2;
    const ref = runPython<number>(`
import json, numpy as np, gemmi
bcd = gemmi.Element('Cd').neutron92.get_coefs()[0] - 0.70j; bte = gemmi.Element('Te').neutron92.get_coefs()[0]
fcc = np.array([[0,0,0],[0,.5,.5],[.5,0,.5],[.5,.5,0]])
def F(h):
    h = np.array(h)
    return sum(bcd*np.exp(2j*np.pi*h@x) + bte*np.exp(2j*np.pi*h@(x+.25)) for x in fcc)
# absorption breaks Friedel's law here (no centre of symmetry): average |F|² over every member of the family
fam = lambda base: {tuple(s*v for s, v in zip(sg, p)) for p in __import__('itertools').permutations(base) for sg in __import__('itertools').product([1,-1], repeat=3)}
mean = lambda base: np.mean([abs(F(h))**2 for h in fam(base)])
print(json.dumps(mean((2,0,0)) / mean((1,1,1))))`);
    expect(Math.abs(ratio - ref) / ref).toBeLessThan(1e-9);
    // without the imaginary part: (b′_Cd − b_Te)²/(b′_Cd² + b_Te²), about 40 % lower
    const [bc] = neutronScatteringLengthComplex(48);
    const [bt] = neutronScatteringLengthComplex(52);
    expect(ratio / (((bc - bt) ** 2) / (bc * bc + bt * bt))).toBeGreaterThan(1.3);
  });
});

describe('peak table export', () => {
  it('one row per powder line with its families: hexagonal {100} is one row of multiplicity 6', () => {
    const c = 5.2108;
    const a = 3.2094;
    const cell: Cell = [
      [a, 0, 0],
      [-a / 2, (a * Math.sqrt(3)) / 2, 0],
      [0, 0, c],
    ];
    const mg = crystal(cell, [
      [12, 0.333333, 0.666667, 0.25],
      [12, 0.666667, 0.333333, 0.75],
    ]);
    const csv = peakTableCsv(braggPowder(mg, { wavelength: 1.540593, radiation: 'xray', twoThetaMin: 20, twoThetaMax: 60 }).peaks, { radiation: 'xray', wavelength: 1.540593 });
    const rows = csv.trim().split('\n').filter((l) => !l.startsWith('#'));
    expect(rows[0]).toBe('twoTheta,d,q,h,k,l,multiplicity,intensity,families');
    // 100, 002, 101, 102, 110 below 60° (hand count with d(hkl) = 1/√(4(h²+hk+k²)/3a² + l²/c²))
    expect(rows.slice(1).map((r) => r.split(',').slice(3, 7).join(' '))).toEqual(['1 0 0 6', '0 0 2 2', '1 0 1 12', '1 0 2 12', '1 1 0 6']);
    expect(rows[1].endsWith(',1 0 0 x 6')).toBe(true);
  });
});
