import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import type { Structure } from '../../lib/structure/types';
import { generate } from '../../lib/models';

const PY = '/usr/bin/python3';
const hasPy = existsSync(PY) && (() => {
  try {
    execFileSync(PY, ['-c', 'import spglib, numpy']);
    return true;
  } catch {
    return false;
  }
})();

/** Number of atoms in the primitive cell spglib finds (spglib.find_primitive, reference library). */
function spglibPrimitiveCount(s: Structure): number {
  const n = s.species.length;
  const frac: number[][] = [];
  const [a, b, c] = s.cell!;
  const M = [a, b, c];
  const inv = invert3(M);
  for (let i = 0; i < n; i++) {
    const x = [s.positions[3 * i], s.positions[3 * i + 1], s.positions[3 * i + 2]];
    frac.push([0, 1, 2].map((k) => x[0] * inv[0][k] + x[1] * inv[1][k] + x[2] * inv[2][k]));
  }
  const doc = JSON.stringify({ lattice: M, frac, numbers: new Array(n).fill(1) });
  const out = execFileSync(PY, [
    '-c',
    'import sys, json, spglib\nd=json.load(sys.stdin)\nr=spglib.find_primitive((d["lattice"], d["frac"], d["numbers"]), symprec=1e-4)\nprint(len(r[2]))',
  ], { input: doc }).toString();
  return Number(out.trim());
}

function invert3(m: number[][]): number[][] {
  const [[a, b, c], [d, e, f], [g, h, i]] = m;
  const A = e * i - f * h, B = -(d * i - f * g), C = d * h - e * g;
  const det = a * A + b * B + c * C;
  return [
    [A / det, -(b * i - c * h) / det, (b * f - c * e) / det],
    [B / det, (a * i - c * g) / det, -(a * f - c * d) / det],
    [C / det, -(a * h - b * g) / det, (a * e - b * d) / det],
  ];
}

describe('decagonal model', () => {
  it('stacks the layer tiling: layers × the planar vertices, z = k·spacing, shift per layer', () => {
    const planar = generate({ family: 'penrose', radius: 10, edge: 2 });
    const s = generate({ family: 'decagonal', radius: 10, edge: 2, layers: 3, spacing: 2.1, shift: [0.5, -0.25] });
    const m = planar.species.length;
    expect(s.species.length).toBe(3 * m);
    expect(s.dim).toBe(3);
    expect(s.cell).toBeUndefined();
    for (const k of [0, 1, 2]) {
      const o = k * m + 7;
      expect(s.positions[3 * o]).toBeCloseTo(planar.positions[21] + 0.5 * k, 12);
      expect(s.positions[3 * o + 1]).toBeCloseTo(planar.positions[22] - 0.25 * k, 12);
      expect(s.positions[3 * o + 2]).toBeCloseTo(2.1 * k, 12);
    }
  });

  it('approximant: orthorhombic cell a × b × (layers·spacing) for zero shift', () => {
    const s = generate({ family: 'decagonal', approximant: { p: 3, q: 2 }, layers: 2, spacing: 2 });
    const [a, b, c] = s.cell!;
    expect(a[0] * b[0] + a[1] * b[1]).toBeCloseTo(0, 9);
    expect(c).toEqual([0, 0, 4]);
    expect(s.species.length).toBe(2 * 210);
  });

  it.skipIf(!hasPy)('spglib finds the planar approximant cell primitive, and the stacked cell primitive / layers (spglib.find_primitive)', () => {
    const planar = generate({ family: 'penrose', approximant: { p: 2, q: 1 }, edge: 2.45 });
    expect(spglibPrimitiveCount(planar)).toBe(planar.species.length);
    const stacked = generate({ family: 'decagonal', approximant: { p: 2, q: 1 }, layers: 3, spacing: 2, shift: [0.7, 0.3] });
    expect(spglibPrimitiveCount(stacked)).toBe(stacked.species.length / 3);
  }, 60_000);

  it('bad input names the field; size is checked before building', () => {
    expect(() => generate({ family: 'decagonal', })).toThrow(/radius: required/);
    expect(() => generate({ family: 'decagonal', radius: 5, layers: 0 })).toThrow(/layers: must be at least 1/);
    expect(() => generate({ family: 'decagonal', radius: 5, spacing: -1 })).toThrow(/spacing:/);
    expect(() => generate({ family: 'decagonal', radius: 5, shift: [1] as never })).toThrow(/shift/);
    expect(() => generate({ family: 'decagonal', approximant: { p: 4, q: 3 } })).toThrow(/approximant: 4\/3 is not a convergent/);
    expect(() => generate({ family: 'decagonal', radius: 200, layers: 100 })).toThrow(/maxPoints: 100 decagonal layers would hold about/);
  });

  it('is deterministic', () => {
    const a = generate({ family: 'decagonal', approximant: { p: 5, q: 3 }, shift: [0.3, 0.1] });
    const b = generate({ family: 'decagonal', approximant: { p: 5, q: 3 }, shift: [0.3, 0.1] });
    expect(Buffer.from(a.positions.buffer).equals(Buffer.from(b.positions.buffer))).toBe(true);
  });
});
