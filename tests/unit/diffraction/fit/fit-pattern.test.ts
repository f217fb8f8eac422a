/**
 * The profile fit against a synthetic measured pattern made outside the project: numpy + gemmi
 * (Debian python3-gemmi: StructureFactorCalculatorX with the International Tables C 6.1.1.4 form factors,
 * the cell's d-spacings), a pseudo-Voigt written out in numpy (Wertheim et al. 1974 form, Caglioti
 * width), Lp = (1 + cos²2θ)/(sin²θ cosθ), numpy's Chebyshev background, a known zero shift and cell,
 * and Poisson counting noise (numpy default_rng(7)). The fit starts from the model's cell and zero 0.
 */
import { describe, expect, it } from 'vitest';
import { runPython } from '../../../helpers/python';
import { braggPowder } from '../../../../lib/diffraction/powder';
import { fitLinesFromPeaks, fitPattern } from '../../../../lib/diffraction/fit/fit-pattern';
import type { MeasuredPattern } from '../../../../lib/formats/measured';
import { crystal, cubic, FCC } from '../helpers';

const TRUE = { zero: 0.08, U: 0.02, V: -0.01, W: 0.008, eta: 0.4, k: 1.0008, bg: [300, -80, 40, -10] };
const A0 = 5.6402;
const LAMBDA = 1.540593;

function synthetic(withSigma: boolean): MeasuredPattern & { scale: number } {
  const out = runPython<{ x: number[]; y: number[] }>(`
import json, math
import numpy as np, gemmi
T = json.loads('${JSON.stringify(TRUE)}')
a = ${A0} * T['k']; lam = ${LAMBDA}
st = gemmi.SmallStructure()
st.cell = gemmi.UnitCell(a, a, a, 90, 90, 90)
st.spacegroup_hm = 'F m -3 m'
for lab, xyz in [('Na', (0, 0, 0)), ('Cl', (0.5, 0.5, 0.5))]:
    s = gemmi.SmallStructure.Site(); s.label = lab + '1'; s.type_symbol = lab; s.element = gemmi.Element(lab)
    s.fract = gemmi.Fractional(*xyz); s.occ = 1.0; s.u_iso = 0.0
    st.add_site(s)
st.setup_cell_images()
calc = gemmi.StructureFactorCalculatorX(st.cell)
x = np.arange(20.0, 100.0 + 1e-9, 0.02)
y = np.zeros_like(x)
dmin = lam / (2 * math.sin(math.radians(52)))
n = int(a / dmin) + 1
for h in range(-n, n + 1):
    for k in range(-n, n + 1):
        for l in range(-n, n + 1):
            if h == k == l == 0: continue
            d = st.cell.calculate_d([h, k, l])
            if d < dmin: continue
            f2 = abs(calc.calculate_sf_from_small_structure(st, [h, k, l])) ** 2
            if f2 < 1e-6: continue
            th = math.asin(lam / (2 * d)); tt = math.degrees(2 * th)
            lp = (1 + math.cos(2 * th) ** 2) / (math.sin(th) ** 2 * math.cos(th))
            area = 2.0e-3 * f2 * lp
            c = tt + T['zero']
            t = math.tan(th)
            H = math.sqrt(T['U'] * t * t + T['V'] * t + T['W'])
            u = 2 * (x - c) / H
            g = (2 / H) * math.sqrt(math.log(2) / math.pi) * np.exp(-math.log(2) * u * u)
            L = 2 / (math.pi * H) / (1 + u * u)
            y += area * (T['eta'] * L + (1 - T['eta']) * g)
tcheb = 2 * (x - x[0]) / (x[-1] - x[0]) - 1
y += np.polynomial.chebyshev.chebval(tcheb, T['bg'])
rng = np.random.default_rng(7)
obs = rng.poisson(y).astype(float)
print(json.dumps({'x': x.tolist(), 'y': obs.tolist()}))`);
  const y = Float64Array.from(out.y);
  return {
    axis: '2theta',
    x: Float64Array.from(out.x),
    intensity: y,
    sigma: withSigma ? Float64Array.from(y, (v) => Math.sqrt(Math.max(v, 1))) : undefined,
    comments: [],
    scale: 1,
  };
}

describe('fitting a measured pattern (synthetic NaCl, numpy + gemmi)', () => {
  const sites: [number, number, number, number][] = [];
  for (const [x, y, z] of FCC) sites.push([11, x, y, z], [17, x + 0.5, y, z]);
  const model = crystal(cubic(A0), sites);
  const lines = fitLinesFromPeaks(braggPowder(model, { wavelength: LAMBDA, radiation: 'xray', twoThetaMin: 15, twoThetaMax: 105 }).peaks);

  it('recovers zero shift, cell scale, U, V, W and the Chebyshev background within 3 σ; R_wp falls from tens of % to R_exp', () => {
    const m = synthetic(true);
    const r = fitPattern(m, lines, { wavelength: LAMBDA, radiation: 'xray', profile: { U: 0.01, V: 0, W: 0.01, eta: TRUE.eta }, nBackground: 4, refineLattice: true });
    const get = (n: string) => r.parameters.find((p) => p.name === n)!;
    const report = r.parameters.map((p) => `${p.name} ${p.value.toPrecision(6)} ± ${p.sigma.toPrecision(2)}`).join('; ');
    const within = (n: string, truth: number) => {
      const p = get(n);
      expect(p.sigma, report).toBeGreaterThan(0);
      expect(Math.abs(p.value - truth), `${n}: ${report}`).toBeLessThan(3 * p.sigma);
    };
    within('zero', TRUE.zero);
    within('lattice', TRUE.k);
    within('U', TRUE.U);
    within('V', TRUE.V);
    within('W', TRUE.W);
    TRUE.bg.forEach((b, j) => within(`background${j}`, b));
    // the zero shift is found to a few thousandths of a degree
    expect(get('zero').sigma).toBeLessThan(0.005);
    expect(r.initial.rwp).toBeGreaterThan(0.2);
    expect(r.final.rwp / r.final.rexp).toBeLessThan(1.05);
    expect(r.final.chi2).toBeGreaterThan(0.9);
    expect(r.final.chi2).toBeLessThan(1.1);
    expect(r.weights).toBe('sigma');
    // residual = observed − calculated
    expect(r.residual[100]).toBeCloseTo(r.observed[100] - r.calculated[100], 9);
    // the strongest measured peak is named 200 (NaCl's strongest line), every label within its width
    const top = [...r.peaks].sort((a, b) => b.intensity - a.intensity)[0];
    expect(top.line!.hkl!.join('')).toBe('200');
    expect(r.peaks.every((p) => p.withinWidth)).toBe(true);
  });

  it('without a σ column the weights are counting statistics (w = 1/y) and give the same fit', () => {
    const m = synthetic(false);
    const r = fitPattern(m, lines, { wavelength: LAMBDA, radiation: 'xray', profile: { U: 0.01, V: 0, W: 0.01, eta: TRUE.eta }, nBackground: 4, refineLattice: true });
    expect(r.weights).toBe('counts');
    const z = r.parameters.find((p) => p.name === 'zero')!;
    expect(Math.abs(z.value - TRUE.zero)).toBeLessThan(3 * z.sigma);
    expect(r.final.rwp / r.final.rexp).toBeLessThan(1.05);
  });
});
