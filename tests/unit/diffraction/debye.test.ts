import { describe, expect, it } from 'vitest';
import type { Structure } from '../../../lib/structure/types';
import { debyeExact, debyeFromHistogram, pairHistogram } from '../../../lib/diffraction/debye';
import { balancedRowRanges } from '../../../lib/diffraction/pair-histogram';
import { xrayFormFactor } from '../../../lib/diffraction/form-factors';
import { debyePowder } from '../../../lib/diffraction/debye-powder';
import { runPython } from '../../helpers/python';

const mk = (pos: number[], z: number[]): Structure => ({
  positions: Float64Array.from(pos),
  species: Uint16Array.from(z),
  provenance: { params: null, engine: 'test' },
});

describe('Debye scattering equation', () => {
  it('dimer: I = 2f²(1 + sin(Qd)/(Qd)) (closed form of the Debye sum, Warren ch. 6)', () => {
    const d = 2.5;
    const s = mk([0, 0, 0, d, 0, 0], [26, 26]);
    const q = Float64Array.from({ length: 50 }, (_, k) => 0.1 + 0.2 * k);
    const exact = debyeExact(s, q, 'xray');
    // Bin centre placed exactly at d: with Δ = 0.001, d = 2.5 lies in bin 2500 whose centre is 2.5005 — so use the binned result with a loose bound and the exact with a tight one.
    const binned = debyeFromHistogram(pairHistogram(s, 0.001), q, 'xray');
    for (let k = 0; k < q.length; k++) {
      const f = xrayFormFactor(26, (q[k] / (4 * Math.PI)) ** 2);
      const ref = 2 * f * f * (1 + Math.sin(q[k] * d) / (q[k] * d));
      expect(exact[k]).toBeCloseTo(ref, 9);
      expect(Math.abs(binned[k] - ref) / ref).toBeLessThan(2e-3);
    }
  });

  it('histogram route matches the exact sum on a random two-species cluster (uniform and non-uniform Q)', () => {
    let seed = 7;
    const rnd = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
    const pos: number[] = [];
    const z: number[] = [];
    for (let i = 0; i < 300; i++) {
      pos.push(rnd() * 15, rnd() * 15, rnd() * 15);
      z.push(i % 3 === 0 ? 29 : 13);
    }
    const s = mk(pos, z);
    const q = Float64Array.from({ length: 200 }, (_, k) => 0.05 * k);
    const exact = debyeExact(s, q);
    const binned = debyeFromHistogram(pairHistogram(s, 0.0005), q);
    const qn = Float64Array.from([0.3, 1.1, 2.9, 4.4]);
    const binnedN = debyeFromHistogram(pairHistogram(s, 0.0005), qn);
    const exactN = debyeExact(s, qn);
    // The exact sum itself against an independent one: numpy over scipy's pair distances with gemmi's IT92
    // form factors, I(Q) = Σ f_i² + 2 Σ_{i<j} f_i f_j sin(Q r_ij)/(Q r_ij) (Debye 1915; Warren ch. 6).
    const ref = runPython<number[]>(
      `import sys, json, numpy as np, gemmi
from scipy.spatial.distance import pdist
d = json.load(sys.stdin)
p = np.array(d["pos"]).reshape(-1, 3); z = d["z"]
i, j = np.triu_indices(len(z), 1); r = pdist(p)
out = []
for q in d["q"]:
    s2 = (q / (4 * np.pi)) ** 2
    f = np.array([gemmi.Element(x).it92.calculate_sf(s2) for x in z])
    out.append(float((f * f).sum() + 2 * (f[i] * f[j] * np.sinc(q * r / np.pi)).sum()))
print(json.dumps(out))`,
      JSON.stringify({ pos, z, q: Array.from(qn) }),
    );
    qn.forEach((_, k) => expect(Math.abs(exactN[k] - ref[k]) / ref[k]).toBeLessThan(1e-9));
    let max = 0;
    for (const v of exact) max = Math.max(max, Math.abs(v));
    for (let k = 0; k < q.length; k++) expect(Math.abs(binned[k] - exact[k]) / max).toBeLessThan(1e-3);
    for (let k = 0; k < qn.length; k++) expect(Math.abs(binnedN[k] - exactN[k]) / max).toBeLessThan(1e-3);
    // Q = 0: (Σ f)² = forward scattering.
    const ftot = 100 * xrayFormFactor(29, 0) + 200 * xrayFormFactor(13, 0);
    expect(exact[0] / (ftot * ftot)).toBeCloseTo(1, 10);
    expect(binned[0] / (ftot * ftot)).toBeCloseTo(1, 10);
  });

  it('single-species fast path (four-lane histogram) matches the exact sum on a 225-atom fcc ball', () => {
    const pos: number[] = [];
    const a = 3.615;
    for (let i = -4; i <= 4; i++)
      for (let j = -4; j <= 4; j++)
        for (let k = -4; k <= 4; k++)
          for (const b of [[0, 0, 0], [0, 0.5, 0.5], [0.5, 0, 0.5], [0.5, 0.5, 0]]) {
            const p = [(i + b[0]) * a, (j + b[1]) * a, (k + b[2]) * a];
            if (Math.hypot(p[0], p[1], p[2]) <= 8.5) pos.push(...p);
          }
    const s = mk(pos, pos.filter((_, i) => i % 3 === 0).map(() => 29));
    expect(s.species.length).toBeGreaterThan(200);
    const q = Float64Array.from({ length: 100 }, (_, k) => 0.5 + 0.05 * k);
    const exact = debyeExact(s, q);
    // Lattice distances sit at one point inside their bin, so the binning error is coherent: ≈ Q·Δ/2 relative.
    const binned = debyeFromHistogram(pairHistogram(s, 0.0001), q);
    let max = 0;
    for (const v of exact) max = Math.max(max, Math.abs(v));
    for (let k = 0; k < q.length; k++) expect(Math.abs(binned[k] - exact[k]) / max).toBeLessThan(1e-3);
  });

  it('with B: dimer I = 2f²(1 + e^{−2Bs²} sin(Qd)/(Qd)) — pair term damped, self term not (Warren §6)', () => {
    const d = 2.2;
    const s = mk([0, 0, 0, 0, 0, d], [13, 13]);
    s.site = new Uint16Array(2);
    s.siteClasses = [{ name: 'Al', species: 13, biso: 1.2 }];
    const q = Float64Array.from([0.7, 2.1, 4.4]);
    const exact = debyeExact(s, q);
    const binned = debyeFromHistogram(pairHistogram(s, 0.0001), q);
    q.forEach((qq, k) => {
      const s2 = (qq / (4 * Math.PI)) ** 2;
      const f = xrayFormFactor(13, s2);
      const ref = 2 * f * f * (1 + Math.exp(-2 * 1.2 * s2) * (Math.sin(qq * d) / (qq * d)));
      expect(exact[k]).toBeCloseTo(ref, 9);
      expect(Math.abs(binned[k] - ref) / ref).toBeLessThan(1e-4);
    });
  });

  it('single species with partial occupancies (weighted lanes) matches the exact sum', () => {
    let seed = 11;
    const rnd = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
    const pos: number[] = [];
    for (let i = 0; i < 150; i++) pos.push(rnd() * 12, rnd() * 12, rnd() * 12);
    const s = mk(pos, pos.filter((_, i) => i % 3 === 0).map(() => 26));
    s.occupancy = Float64Array.from({ length: 150 }, (_, i) => (i % 4 === 0 ? 0.5 : 1));
    const q = Float64Array.from({ length: 60 }, (_, k) => 0.1 * k);
    const exact = debyeExact(s, q);
    const binned = debyeFromHistogram(pairHistogram(s, 0.0002), q);
    let max = 0;
    for (const v of exact) max = Math.max(max, Math.abs(v));
    for (let k = 0; k < q.length; k++) expect(Math.abs(binned[k] - exact[k]) / max).toBeLessThan(1e-3);
    // forward scattering: pairs give (Σ w f)² − Σ w² f², the self terms Σ w f² (Warren ch. 12), so
    // I(0) = (Σ w f)² + Σ (w − w²) f² with 38 half-occupied Fe sites: (131 f)² + 38·0.25 f²
    const f0 = xrayFormFactor(26, 0);
    expect(exact[0] / ((131 * f0) ** 2 + 38 * 0.25 * f0 * f0)).toBeCloseTo(1, 9);
  });

  it('vacancies and mixed sites: the self term is w·Σ x_z f_z² (Warren ch. 12) — against numpy averaging the plain Debye sum over every occupation of the sites', () => {
    // Five sites; each state is (species or vacancy) with its probability. Site classes give the mix and the occupancy.
    const pos = [0, 0, 0, 2.6, 0.3, 0, 0.4, 2.5, 0.2, 1.9, 1.7, 2.2, -1.5, 0.8, 2.9];
    const s = mk(pos, [13, 13, 26, 13, 46]);
    s.site = Uint16Array.from([0, 1, 2, 3, 4]);
    s.siteClasses = [
      { name: 'Al', species: 13 },
      { name: 'AlPd', species: 13, mix: { 13: 0.6, 46: 0.4 } },
      { name: 'Fe half', species: 26, occupancy: 0.5 },
      { name: 'AlMn + vacancy', species: 13, mix: { 13: 0.5, 25: 0.3 } },
      { name: 'Pd 0.7', species: 46, occupancy: 0.7 },
    ];
    const states = [
      [['Al', 1]],
      [['Al', 0.6], ['Pd', 0.4]],
      [['Fe', 0.5], [null, 0.5]],
      [['Al', 0.5], ['Mn', 0.3], [null, 0.2]],
      [['Pd', 0.7], [null, 0.3]],
    ];
    const q = Float64Array.from([0.01, 0.7, 1.5, 2.8, 4.1, 6.0]);
    const ref = runPython<number[]>(
      `import sys, json, itertools, numpy as np, gemmi
d = json.load(sys.stdin)
p = np.array(d["pos"]).reshape(-1, 3)
out = []
for q in d["q"]:
    s2 = (q / (4 * np.pi)) ** 2
    total = 0.0
    for conf in itertools.product(*d["states"]):
        prob = np.prod([c[1] for c in conf])
        idx = [i for i, c in enumerate(conf) if c[0] is not None]
        f = np.array([gemmi.Element(conf[i][0]).it92.calculate_sf(s2) for i in idx])
        P = p[idx]
        r = np.linalg.norm(P[:, None, :] - P[None, :, :], axis=-1)
        total += prob * float((np.outer(f, f) * np.sinc(q * r / np.pi)).sum())
    out.append(total)
print(json.dumps(out))`,
      JSON.stringify({ pos, states, q: Array.from(q) }),
    );
    const exact = debyeExact(s, q);
    const binned = debyeFromHistogram(pairHistogram(s, 0.0001), q);
    q.forEach((_, k) => {
      expect(Math.abs(exact[k] - ref[k]) / ref[k]).toBeLessThan(1e-9);
      expect(Math.abs(binned[k] - ref[k]) / ref[k]).toBeLessThan(1e-4);
    });
  });

  it('balanced row ranges cover all pairs with about equal counts', () => {
    const n = 1001;
    const parts = balancedRowRanges(n, 3);
    expect(parts[0][0]).toBe(0);
    expect(parts[2][1]).toBe(n);
    const counts = parts.map(([a, b]) => {
      let c = 0;
      for (let i = a; i < b; i++) c += n - 1 - i;
      return c;
    });
    expect(counts.reduce((a, b) => a + b)).toBe((n * (n - 1)) / 2);
    for (const c of counts) expect(Math.abs(c - (n * (n - 1)) / 6)).toBeLessThan(n);
  });

  it('Debye powder of a 20 Å fcc Cu ball peaks at the Bragg angles of fcc Cu (111, 200, 220, 311 at Cu Kα1; finite-size shifts < 0.3°)', () => {
    const pos: number[] = [];
    const a = 3.615;
    const R = 20;
    const m = Math.ceil(R / a);
    for (let i = -m; i <= m; i++)
      for (let j = -m; j <= m; j++)
        for (let k = -m; k <= m; k++)
          for (const b of [[0, 0, 0], [0, 0.5, 0.5], [0.5, 0, 0.5], [0.5, 0.5, 0]]) {
            const p = [(i + b[0]) * a, (j + b[1]) * a, (k + b[2]) * a];
            if (Math.hypot(p[0], p[1], p[2]) <= R) pos.push(...p);
          }
    const s = mk(pos, pos.filter((_, i) => i % 3 === 0).map(() => 29));
    const r = debyePowder(s, { wavelength: 1.540593, radiation: 'xray', twoThetaMin: 35, twoThetaMax: 95, step: 0.02 });
    const strong = r.maxima.filter((p) => p.intensity > 10).map((p) => p.twoTheta);
    for (const hkl of [[1, 1, 1], [2, 0, 0], [2, 2, 0], [3, 1, 1]]) {
      const d = a / Math.hypot(hkl[0], hkl[1], hkl[2]);
      const tt = (360 / Math.PI) * Math.asin(1.540593 / (2 * d));
      expect(Math.min(...strong.map((x) => Math.abs(x - tt))), `${hkl}`).toBeLessThan(0.3);
    }
  });
});
