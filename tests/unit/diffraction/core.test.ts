import { describe, expect, it } from 'vitest';
import {
  xrayFormFactor,
  electronFormFactor,
  neutronScatteringLength,
  scatteringFactor,
} from '../../../lib/diffraction/form-factors';
import { electronWavelength, parseWavelength, XRAY_LINES, HC_KEV_ANGSTROM } from '../../../lib/diffraction/wavelengths';
import { enumerateHkl, structureFactorsHkl } from '../../../lib/diffraction/structure-factor';
import { braggPowder } from '../../../lib/diffraction/powder';
import { lorentzPolarization } from '../../../lib/diffraction/lorentz-polarization';
import { cagliotiFwhm, pseudoVoigt } from '../../../lib/diffraction/profile';
import { crystal, cubic, FCC, } from './helpers';
import { runPython } from '../../helpers/python';

describe('form factors', () => {
  it('X-ray f(0) = Σa_i + c equals Z within 0.5 % for H..Cf (International Tables Vol. C Table 6.1.1.4: fits constrained to f(0) ≈ Z)', () => {
    for (let z = 1; z <= 98; z++) {
      expect(Math.abs(xrayFormFactor(z, 0) - z) / z).toBeLessThan(0.005);
    }
  });
  it('species 0 (X) scatters with unit factor for every radiation', () => {
    expect(scatteringFactor('xray', 0, 0.3)).toBe(1);
    expect(scatteringFactor('neutron', 0, 0.3)).toBe(1);
    expect(scatteringFactor('electron', 0, 0.3)).toBe(1);
  });
  it('matches gemmi IT92, Sears neutron92 and ITC 4.3.2.2 electron evaluation at several s', () => {
    const ref = runPython<number[][]>(`
import gemmi, json
out=[]
for z in [1,6,13,26,29,47,79,92,98]:
  el=gemmi.Element(z)
  for s2 in [0.0,0.05,0.3,1.2]:
    out.append([z,s2,el.it92.calculate_sf(s2),el.c4322.calculate_sf(s2),el.neutron92.get_coefs()[0]])
print(json.dumps(out))`);
    expect(ref).toHaveLength(36);
    for (const [z, s2, fx, fe, b] of ref) {
      expect(xrayFormFactor(z, s2)).toBeCloseTo(fx, 9);
      expect(electronFormFactor(z, s2)).toBeCloseTo(fe, 9);
      if (b !== 0) expect(neutronScatteringLength(z)).toBe(b);
    }
  });
  it('Sears 1992 values (from memory): H −3.739 fm, Ni 10.3 fm, V −0.3824 fm', () => {
    expect(neutronScatteringLength(1)).toBeCloseTo(-3.739, 3);
    expect(neutronScatteringLength(28)).toBeCloseTo(10.3, 1);
    expect(neutronScatteringLength(23)).toBeCloseTo(-0.3824, 3);
  });
  it('rejects an atomic number outside the tables, naming the field', () => {
    expect(() => xrayFormFactor(120, 0)).toThrow(/species/);
    expect(() => neutronScatteringLength(94)).toThrow(/neutron/);
  });
});

describe('wavelengths', () => {
  it('Cu Kα1 = 1.540593 Å, Cu Kα2 = 1.544414 Å, Mo Kα2 = 0.713607 Å (International Tables Vol. C Table 4.2.2.1; the Kα2 values from memory, xraylib checks them below)', () => {
    expect(parseWavelength('CuKa1')).toBe(1.540593);
    expect(parseWavelength('CuKa2')).toBeCloseTo(1.544414, 6);
    expect(parseWavelength('MoKa2')).toBeCloseTo(0.713607, 6);
    // Unresolved Kα: the 2:1 intensity-weighted mean of Kα1 and Kα2 (common practice),
    // (2 · 1.540593 + 1.544414)/3 = 1.5418667 Å, worked by hand.
    expect(parseWavelength('CuKa')).toBeCloseTo(1.5418667, 7);
    expect(parseWavelength('0.7')).toBe(0.7);
  });
  it('agrees with xraylib line energies to 1e-4 relative', () => {
    const ref = runPython<Record<string, [number, number]>>(`
import xraylib, json
print(json.dumps({n:[xraylib.LineEnergy(z,xraylib.KA1_LINE),xraylib.LineEnergy(z,xraylib.KA2_LINE)] for n,z in [('Cr',24),('Co',27),('Cu',29),('Mo',42),('Ag',47)]}))`);
    expect(Object.keys(ref).sort()).toEqual(['Ag', 'Co', 'Cr', 'Cu', 'Mo']);
    for (const [el, [e1, e2]] of Object.entries(ref)) {
      const line = XRAY_LINES[el as keyof typeof XRAY_LINES];
      expect(Math.abs(line.ka1 - HC_KEV_ANGSTROM / e1) / line.ka1).toBeLessThan(1e-4);
      expect(Math.abs(line.ka2 - HC_KEV_ANGSTROM / e2) / line.ka2).toBeLessThan(1e-4);
    }
  });
  it('relativistic electron wavelength: 200 kV → 0.02508 Å, 100 kV → 0.03701 Å (Williams & Carter, Transmission Electron Microscopy, Table 1.1)', () => {
    expect(electronWavelength(200e3)).toBeCloseTo(0.02508, 5);
    expect(electronWavelength(100e3)).toBeCloseTo(0.03701, 5);
    expect(parseWavelength('200kV')).toBeCloseTo(0.02508, 5);
  });
  it('names the field for nonsense', () => {
    expect(() => parseWavelength('FeKb9')).toThrow(/wavelength/);
    expect(() => parseWavelength(-1)).toThrow(/wavelength/);
  });
});

describe('structure factors and powder pattern', () => {
  const cu = crystal(cubic(3.615), FCC.map(([x, y, z]) => [29, x, y, z]));

  it('fcc: F(111) = 4 f_Cu, F(100) = 0 (extinction rule of the F lattice, any crystallography text)', () => {
    const hkl = Int32Array.from([0, 0, 1, 1, 1, 1]);
    const f = structureFactorsHkl(cu, hkl, 'xray');
    const s2 = 3 / (4 * 3.615 * 3.615);
    expect(Math.sqrt(f.f2[1])).toBeCloseTo(4 * xrayFormFactor(29, s2), 9);
    expect(f.f2[0]).toBeLessThan(1e-20);
  });

  it("Friedel's law |F(h)| = |F(−h)| and F(−h) = F(h)* for a non-centrosymmetric cell", () => {
    const s = crystal(cubic(4.1), [
      [30, 0, 0, 0],
      [16, 0.25, 0.25, 0.25],
      [8, 0.1, 0.37, 0.61],
    ]);
    const hkl = enumerateHkl(s, 1.2);
    const f = structureFactorsHkl(s, hkl, 'xray');
    const idx = new Map<string, number>();
    for (let i = 0; i < hkl.length / 3; i++) idx.set(`${hkl[3 * i]},${hkl[3 * i + 1]},${hkl[3 * i + 2]}`, i);
    let checked = 0;
    for (let i = 0; i < hkl.length / 3; i++) {
      const j = idx.get(`${-hkl[3 * i]},${-hkl[3 * i + 1]},${-hkl[3 * i + 2]}`)!;
      expect(f.re[j]).toBeCloseTo(f.re[i], 10);
      expect(f.im[j]).toBeCloseTo(-f.im[i], 10);
      checked++;
    }
    expect(checked).toBeGreaterThan(50);
  });

  it('Lp (International Tables Vol. C §6.2.5, polarization of ITC §6.2.2 / Azaroff 1955) at 2θ = 60°, worked by hand: 5/√3 plain, 8/√3 for neutrons, 6.8/√3 behind a 2θ_m = 60° monochromator', () => {
    // θ = 30°: sin²θ = 1/4, cosθ = √3/2, cos²2θ = 1/4, so the Lorentz part 1/(sin²θ cosθ) = 8/√3.
    // X-rays, no monochromator: (1 + 1/4)/2·8/√3 = 5/√3 = 2.8867513.
    expect(lorentzPolarization(60, 'xray')).toBeCloseTo(2.8867513, 7);
    // (1 + cos²2θ_m cos²2θ)/(1 + cos²2θ_m) → (1 + cos²2θ)/2 as 2θ_m → 0: a monochromator at 0° is no
    // monochromator (the old code halved here).
    expect(lorentzPolarization(60, 'xray', 1e-6)).toBeCloseTo(lorentzPolarization(60, 'xray'), 9);
    expect(lorentzPolarization(60, 'xray', 0.5)).toBeCloseTo(2.8867513, 3);
    // Neutrons and electrons carry no polarization factor: 8/√3 = 4.6188022.
    expect(lorentzPolarization(60, 'neutron')).toBeCloseTo(4.6188022, 7);
    expect(lorentzPolarization(60, 'electron')).toBeCloseTo(4.6188022, 7);
    // Monochromator at 2θ_m = 60° (cos²2θ_m = 1/4): (1 + 1/16)/(1 + 1/4)·8/√3 = 6.8/√3 = 3.9259818.
    expect(lorentzPolarization(60, 'xray', 60)).toBeCloseTo(3.9259818, 7);
    // At 2θ_m = 90° (cos²2θ_m = 0) the monochromator passes one polarization unchanged: 1·8/√3.
    expect(lorentzPolarization(60, 'xray', 90)).toBeCloseTo(4.6188022, 7);
  });

  it('fcc Cu peak positions obey Bragg: 2θ(111) = 43.30°, 2θ(200) = 50.43° at Cu Kα1, a = 3.615 Å (hand calculation)', () => {
    const r = braggPowder(cu, { wavelength: 1.540593, radiation: 'xray', twoThetaMin: 20, twoThetaMax: 140 });
    expect(r.peaks.map((p) => p.hkl.join(''))).toEqual(['111', '200', '220', '311', '222', '400', '331']);
    // 420 has 2θ = 144.8° > 140°.
    expect(r.peaks.map((p) => p.multiplicity)).toEqual([8, 6, 12, 24, 8, 6, 24]);
    for (const p of r.peaks) {
      const [h, k, l] = p.hkl;
      const d = 3.615 / Math.sqrt(h * h + k * k + l * l);
      expect(p.twoTheta).toBeCloseTo((2 * Math.asin(1.540593 / (2 * d)) * 180) / Math.PI, 9);
    }
    expect(r.peaks[0].twoTheta).toBeCloseTo(43.30, 1);
    expect(r.peaks[1].twoTheta).toBeCloseTo(50.43, 1);
    expect(r.peaks[0].intensity).toBe(100);
  });

  // Reference: gemmi StructureFactorCalculatorX (IT92 form factors, isotropic B = 8π²U) on a SmallStructure,
  // multiplicity counted by enumerating all hkl, m·|F|²·Lp applied in the Python snippet.
  const gemmiPowder = (cell: number, sg: string, sites: [string, number, number, number][], uiso: number, lambda: number, calc = 'X') =>
    runPython<[number, number][]>(`
import gemmi, json, math
st=gemmi.SmallStructure()
st.cell=gemmi.UnitCell(${cell},${cell},${cell},90,90,90)
st.spacegroup_hm='${sg}'
for lab,x,y,z in ${JSON.stringify(sites)}:
  s=gemmi.SmallStructure.Site(); s.label=lab+'1'; s.type_symbol=lab; s.element=gemmi.Element(lab)
  s.fract=gemmi.Fractional(x,y,z); s.occ=1.0; s.u_iso=${uiso}
  st.add_site(s)
st.setup_cell_images()
calc=gemmi.StructureFactorCalculator${calc}(st.cell)
lam=${lambda}; dmin=lam/(2*math.sin(math.radians(70)))
n=int(${cell}/dmin)+1
shells={}
for h in range(-n,n+1):
  for k in range(-n,n+1):
    for l in range(-n,n+1):
      if h==k==l==0: continue
      d=st.cell.calculate_d([h,k,l])
      if d<dmin: continue
      f2=abs(calc.calculate_sf_from_small_structure(st,[h,k,l]))**2
      if f2<1e-6: continue
      key=round(d,6); shells[key]=shells.get(key,0)+f2
out=[]
for d,s in shells.items():
  th=math.asin(lam/(2*d)); tt=2*th
  if math.degrees(tt)<20: continue
  pol=(1+math.cos(tt)**2) if '${calc}'=='X' else 1.0
  out.append([d, s*pol/(math.sin(th)**2*math.cos(th))])
m=max(i for _,i in out)
print(json.dumps(sorted([[d,100*i/m] for d,i in out], key=lambda t:-t[0])))`);

  const byShell = (peaks: { d: number; intensity: number }[]) => {
    const shells = new Map<number, number>();
    for (const p of peaks) {
      const key = Math.round(p.d * 1e6) / 1e6;
      shells.set(key, (shells.get(key) ?? 0) + p.intensity);
    }
    return [...shells.entries()].sort((a, b) => b[0] - a[0]);
  };

  it('fcc Cu (B = 0.6 Å²) relative intensities agree with gemmi within 2 %', () => {
    const B = 0.6;
    const s = crystal(cubic(3.615), FCC.map(([x, y, z]) => [29, x, y, z]), B);
    const ours = byShell(braggPowder(s, { wavelength: 1.540593, radiation: 'xray', twoThetaMin: 20, twoThetaMax: 140 }).peaks);
    const ref = gemmiPowder(3.615, 'F m -3 m', [['Cu', 0, 0, 0]], B / (8 * Math.PI * Math.PI), 1.540593);
    // 111 … 331 (2θ < 140°, as in the hand count above): the comparison below is not over nothing.
    expect(ref).toHaveLength(7);
    expect(ours.length).toBe(ref.length);
    ours.forEach(([d, i], n) => {
      expect(d).toBeCloseTo(ref[n][0], 5);
      expect(Math.abs(i - ref[n][1])).toBeLessThan(0.02 * ref[n][1]);
    });
  });

  it('rock salt NaCl (two species) relative intensities agree with gemmi within 2 %', () => {
    const sites: [number, number, number, number][] = [];
    for (const [x, y, z] of FCC) {
      sites.push([11, x, y, z]);
      sites.push([17, x + 0.5, y, z]);
    }
    const s = crystal(cubic(5.64), sites);
    const ours = byShell(braggPowder(s, { wavelength: 1.540593, radiation: 'xray', twoThetaMin: 20, twoThetaMax: 140 }).peaks);
    const ref = gemmiPowder(5.64, 'F m -3 m', [['Na', 0, 0, 0], ['Cl', 0.5, 0.5, 0.5]], 0, 1.540593);
    expect(ref.length).toBeGreaterThan(10);
    expect(ours.length).toBe(ref.length);
    ours.forEach(([d, i], n) => {
      expect(d).toBeCloseTo(ref[n][0], 5);
      expect(Math.abs(i - ref[n][1])).toBeLessThan(0.02 * ref[n][1] + 1e-9);
    });
  });

  it('rock salt NaCl with neutrons (Sears lengths, no polarization) and electrons (ITC 4.3.2.2) agree with gemmi StructureFactorCalculatorN/E within 2 %', () => {
    const sites: [number, number, number, number][] = [];
    for (const [x, y, z] of FCC) {
      sites.push([11, x, y, z]);
      sites.push([17, x + 0.5, y, z]);
    }
    const s = crystal(cubic(5.64), sites);
    for (const [radiation, calc, lambda] of [['neutron', 'N', 1.5], ['electron', 'E', 0.7]] as const) {
      const ours = byShell(braggPowder(s, { wavelength: lambda, radiation, twoThetaMin: 20, twoThetaMax: 140, dMin: 0.3 }).peaks);
      const ref = gemmiPowder(5.64, 'F m -3 m', [['Na', 0, 0, 0], ['Cl', 0.5, 0.5, 0.5]], 0, lambda, calc);
      expect(ref.length).toBeGreaterThan(5);
      expect(ours.length).toBe(ref.length);
      ours.forEach(([d, i], n) => {
        expect(d).toBeCloseTo(ref[n][0], 5);
        expect(Math.abs(i - ref[n][1])).toBeLessThan(0.02 * ref[n][1] + 1e-9);
      });
    }
  });

  it('Kα2 doublet: second line at 2θ from λ(Kα2), half the area, peak list stays Kα1 (common practice, ratio 0.5)', () => {
    const base = { wavelength: 1.540593, radiation: 'xray' as const, twoThetaMin: 40, twoThetaMax: 46 };
    const prof = { U: 0, V: 0, W: 0.0004, eta: 0, step: 0.002 };
    const one = braggPowder(cu, { ...base, profile: prof });
    const two = braggPowder(cu, { ...base, profile: prof, wavelength2: 1.544414, ratio2: 0.5 });
    expect(two.peaks).toEqual(one.peaks);
    const area = (y: Float64Array) => y.reduce((a, b) => a + b, 0) * 0.002;
    // ≈ 1.5; Lp is evaluated at each line's own 2θ, so not exactly
    expect(area(two.profile!.intensity) / area(one.profile!.intensity)).toBeCloseTo(1.5, 2);
    // the Kα2 maximum sits at 2 asin(λ2 / 2d(111))
    const d111 = 3.615 / Math.sqrt(3);
    const tt2 = (360 / Math.PI) * Math.asin(1.544414 / (2 * d111));
    const diff = two.profile!.intensity.map((v, i) => v - one.profile!.intensity[i]);
    let best = 0;
    for (let i = 1; i < diff.length; i++) if (diff[i] > diff[best]) best = i;
    expect(Math.abs(two.profile!.twoTheta[best] - tt2)).toBeLessThan(0.003);
  });

  it('profile: unit-area pseudo-Voigt; Caglioti width; peak areas carry the peak intensities', () => {
    let area = 0;
    for (let x = -50; x <= 50; x += 0.0005) area += pseudoVoigt(x, 0.1, 0.4) * 0.0005;
    expect(area).toBeGreaterThan(0.995); // Lorentzian tails beyond ±500 FWHM hold ~0.05 %
    expect(cagliotiFwhm(90, { U: 0.01, V: 0, W: 0.0 })).toBeCloseTo(0.1, 12); // tan 45° = 1
    const r = braggPowder(cu, {
      wavelength: 1.540593,
      radiation: 'xray',
      twoThetaMin: 30,
      twoThetaMax: 60,
      profile: { U: 0.01, V: -0.005, W: 0.005, eta: 0.5, step: 0.005, background: [2] },
    });
    const p = r.profile!;
    let sum = 0;
    for (let i = 0; i < p.intensity.length; i++) sum += (p.intensity[i] - 2) * 0.005;
    const expected = r.peaks.reduce((a, q) => a + q.intensity, 0);
    expect(Math.abs(sum - expected) / expected).toBeLessThan(0.01);
    expect(() => braggPowder(cu, { wavelength: 1.54, radiation: 'xray', twoThetaMin: 30, twoThetaMax: 60, profile: { U: 0, V: 0, W: -1, eta: 0.5, step: 0.01 } })).toThrow(/U, V, W/);
  });
});
