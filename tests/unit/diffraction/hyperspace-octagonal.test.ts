import { describe, expect, it } from 'vitest';
import { cli } from '../../helpers/cli';
import { hyperspacePeaks, octagonalPeaks, octagonalWindow } from '../../../lib/diffraction/hyperspace';
import { intensityAt } from '../../../lib/diffraction/intensity-at';
import { zone } from '../../../lib/worker/engine';
import { indexOctagonalSpot } from '../../../lib/worker/zone-index';
import { generate } from '../../../lib/models';

describe('hyperspace diffraction: octagonal (Ammann–Beenker) tiling from Z⁴', () => {
  it('ideal intensities are 8-fold symmetric: rotating Q∥ by 45° maps every peak onto a peak of equal intensity (the tiling has point symmetry 8mm)', () => {
    const peaks = octagonalPeaks({ family: 'octagonal', aR: 1.7, qmax: 8, qperpMax: 7, threshold: 1e-3 }).filter((p) => p.qParNorm > 0);
    expect(peaks.length).toBeGreaterThan(40);
    const key = (x: number, y: number) => `${Math.round(x * 1e6)},${Math.round(y * 1e6)}`;
    const map = new Map(peaks.map((p) => [key(p.qPar[0], p.qPar[1]), p.intensity]));
    // Peaks near the cut-offs could slip across them by rounding; keep to the interior.
    const inner = peaks.filter((p) => p.qParNorm < 7.9 && p.qPerpNorm < 6.9 && p.intensity > 2e-3 * 1.01);
    expect(inner.length).toBeGreaterThan(30);
    let mirrored = 0;
    for (const p of inner) {
      for (let r = 1; r < 8; r++) {
        const c = Math.cos((r * Math.PI) / 4);
        const s = Math.sin((r * Math.PI) / 4);
        const rot = map.get(key(c * p.qPar[0] - s * p.qPar[1], s * p.qPar[0] + c * p.qPar[1]));
        expect(rot, `${p.indices} rotated by ${45 * r}°`).toBeDefined();
        expect(rot!).toBeCloseTo(p.intensity, 9);
      }
      // Mirror x → −x (also in 8mm).
      if (map.get(key(-p.qPar[0], p.qPar[1])) !== undefined) mirrored++;
    }
    expect(mirrored).toBe(inner.length);
    // Not all peaks equal: the check above would pass trivially on a flat list.
    const levels = new Set(inner.map((p) => p.intensity.toPrecision(6)));
    expect(levels.size).toBeGreaterThan(4);
  });

  it('direct summation over a patch from lib/models/octagonal/generate.ts (unit form factors, intensity-at.ts) matches the strongest ideal peaks within 5 % (Baake & Grimm, Aperiodic Order vol. 1, 2013, ch. 9: Bragg intensities of a regular model set)', () => {
    for (const edge of [1, 2.3]) {
      const patch = generate({ family: 'octagonal', radius: 40 * edge, edge });
      const n = patch.species.length;
      expect(n).toBeGreaterThan(5000);
      // The generator's perpendicular coordinates all lie in the octagon the diffraction uses.
      const w = octagonalWindow(edge);
      const m = w.vertices.length / 2;
      for (let i = 0; i < n; i++) {
        const x = patch.perp![2 * i];
        const y = patch.perp![2 * i + 1];
        for (let k = 0; k < m; k++) {
          const ax = w.vertices[2 * k], ay = w.vertices[2 * k + 1];
          const bx = w.vertices[(2 * k + 2) % (2 * m)], by = w.vertices[(2 * k + 3) % (2 * m)];
          expect((bx - ax) * (y - ay) - (by - ay) * (x - ax)).toBeGreaterThan(-1e-9 * edge * edge);
        }
      }
      const peaks = hyperspacePeaks({ family: 'octagonal', aR: edge, qmax: 14 / edge, threshold: 1e-3 })
        .filter((p) => p.qParNorm > 0)
        .sort((a, b) => b.intensity - a.intensity)
        .slice(0, 24);
      // The strongest list spans several symmetry classes, not one star.
      expect(new Set(peaks.map((p) => p.qParNorm.toFixed(6))).size).toBeGreaterThan(2);
      const q: number[] = [];
      for (const p of peaks) q.push(p.qPar[0], p.qPar[1], 0);
      const direct = intensityAt(patch, Float64Array.from(q));
      peaks.forEach((p, i) => expect(Math.abs(direct[i] / n - p.intensity), `edge ${edge} ${p.indices}`).toBeLessThan(0.05 * p.intensity));
      // 5 % short of the strongest peak (several peak widths 2π/2R away) the patch scatters weakly, so the
      // check above is specific to the module points.
      const off = intensityAt(patch, Float64Array.from([0.95 * peaks[0].qPar[0], 0.95 * peaks[0].qPar[1], 0]));
      expect(off[0] / n).toBeLessThan(0.1 * peaks[0].intensity);
    }
  });

  it('Q = 0: |F(0)/N|² = 1 (unit form factor) and f(0)² with carbon on the vertices; window area = 2(1+√2)s² for a regular octagon of side s (CRC Standard Mathematical Tables)', () => {
    for (const a of [1, 2.5]) {
      const p0 = octagonalPeaks({ family: 'octagonal', aR: a, qmax: 3 }).find((p) => p.qParNorm === 0)!;
      expect(p0.indices).toEqual([0, 0, 0, 0]);
      expect(p0.intensity).toBeCloseTo(1, 12);
      const w = octagonalWindow(a);
      expect(w.vertices.length).toBe(16);
      expect(w.area).toBeCloseTo(2 * (1 + Math.SQRT2) * a * a, 10);
      // Every side has length s = a (regular octagon of edge a).
      for (let k = 0; k < 8; k++) {
        const dx = w.vertices[(2 * k + 2) % 16] - w.vertices[2 * k];
        const dy = w.vertices[(2 * k + 3) % 16] - w.vertices[2 * k + 1];
        expect(Math.hypot(dx, dy)).toBeCloseTo(a, 10);
      }
    }
    // Carbon, X-ray: f(0) = Z = 6 (International Tables for Crystallography vol. C, Table 6.1.1.4).
    const c0 = octagonalPeaks({ family: 'octagonal', aR: 2, qmax: 2, species: 6 }).find((p) => p.qParNorm === 0)!;
    expect(Math.sqrt(c0.intensity)).toBeCloseTo(6, 2);
  });

  it('CLI: diffract hyperspace --family octagonal --aR gives the edge-a module; the strongest star sits at |Q∥| = (π/a)|e_0 + e_1 + e_2| = (π/a)(1 + √2) (Beenker 1982 basis)', async () => {
    const r = await cli(['diffract', 'hyperspace', '--family', 'octagonal', '--aR', '2.0', '--qmax', '4', '--format', 'json']);
    expect(r.code).toBe(0);
    const h = JSON.parse(r.out) as { family: string; aR: number; peaks: { indices: number[]; qParNorm: number; qPerpNorm: number; intensity: number; relative: number }[] };
    expect(h.family).toBe('octagonal');
    expect(h.peaks[0].indices).toEqual([0, 0, 0, 0]);
    expect(h.peaks[0].intensity).toBeCloseTo(1, 6);
    const top = h.peaks.filter((p) => p.relative === 100);
    expect(top.length).toBe(8);
    // |e_0 + e_1 + e_2|² = 3 + 2(cos 45° + cos 90° + cos 45°) = 3 + 2√2 = (1 + √2)².
    for (const p of top) expect(p.qParNorm).toBeCloseTo((Math.PI / 2) * (1 + Math.SQRT2), 5);
  });

  it('workspace zone pattern of a generated patch (beam ⊥ the tiling): the strongest spots get the four indices and |Q⊥| of the ideal module (Q∥ components m + n/√2, Q⊥ their conjugates m − n/√2)', () => {
    const edge = 1.5;
    const ideal = octagonalPeaks({ family: 'octagonal', aR: edge, qmax: 6, threshold: 1e-3 }).filter((p) => p.qParNorm > 0);
    // Every ideal peak is recovered from its Q∥ alone.
    const indexed = ideal.filter((x) => x.relative > 1);
    expect(indexed.length).toBeGreaterThan(16);
    for (const p of indexed) {
      const idx = indexOctagonalSpot([p.qPar[0], p.qPar[1]], edge, 1e-6)!;
      expect(idx.h, `${p.indices}`).toEqual(p.indices);
      expect(idx.qPerp).toBeCloseTo(p.qPerpNorm, 9);
    }
    const patch = generate({ family: 'octagonal', radius: 30 * edge, edge });
    const z = zone({ kind: 'zone', structure: patch, axis: '0,0,1', qmax: 6, slab: 0, radiation: 'xray' });
    const strong = z.spots.filter((s) => s.intensity > 0.5);
    expect(strong.length).toBeGreaterThanOrEqual(8);
    for (const sp of strong) {
      const match = ideal.find((p) => p.indices.join(' ') === sp.label);
      expect(match, `spot ${sp.label} at ${sp.qPar}`).toBeDefined();
      expect(Math.abs(sp.qPar - match!.qParNorm)).toBeLessThan(0.05);
      expect(sp.qPerp!).toBeCloseTo(match!.qPerpNorm, 6);
      expect(match!.relative).toBeGreaterThan(25);
    }
  });

  it('refuses enumerations that are far too large, naming qmax', () => {
    expect(() => octagonalPeaks({ family: 'octagonal', aR: 1, qmax: 30, qperpMax: 300 })).toThrow(/qmax/);
  });
});
