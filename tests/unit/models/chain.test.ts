import { describe, expect, it } from 'vitest';
import {
  convergents,
  partialQuotients,
  GOLDEN_MEAN,
  SILVER_MEAN,
} from '../../../lib/math/convergents';
import { fibonacci, fibonacciWord } from '../../../lib/models/chain/generate';
import { TAU } from '../../../lib/math/golden';
import { chainParamsSchema } from '../../../lib/models/chain/schema';
import { convergentsParamsSchema } from '../../../lib/math/convergents-params';
import { generate } from '../../../lib/models';
import { runPython } from '../../helpers/python';

// OEIS A000045 (Fibonacci numbers), typed from the OEIS data section.
const A000045 = [0, 1, 1, 2, 3, 5, 8, 13, 21, 34, 55, 89, 144, 233, 377, 610, 987, 1597, 2584, 4181, 6765, 10946];
// OEIS A000129 (Pell numbers), typed from the OEIS data section.
const A000129 = [0, 1, 2, 5, 12, 29, 70, 169, 408, 985, 2378, 5741, 13860, 33461, 80782, 195025];
// OEIS A005614, the infinite Fibonacci word 1,0,1,1,0,1,0,1,1,0,… (typed from OEIS; 1 = L, 0 = S).
const A005614 = [
  1, 0, 1, 1, 0, 1, 0, 1, 1, 0, 1, 1, 0, 1, 0, 1, 1, 0, 1, 0, 1, 1, 0, 1, 1, 0, 1, 0, 1, 1, 0, 1, 1, 0,
];

const word = (s: { tiles?: { kind: Uint8Array } }) => Array.from(s.tiles!.kind, (k) => 1 - k);

describe('continued fractions', () => {
  it('convergents of τ are F(k+2)/F(k+1) (OEIS A000045)', () => {
    const c = convergents(GOLDEN_MEAN, 20);
    c.forEach((cv, k) => {
      expect(cv.p).toBe(A000045[k + 2]);
      expect(cv.q).toBe(A000045[k + 1]);
      expect(cv.a).toBe(1);
    });
  });

  it('convergents of 1+√2 are Pell(k+2)/Pell(k+1) (OEIS A000129)', () => {
    const c = convergents(SILVER_MEAN, 14);
    c.forEach((cv, k) => {
      expect(cv.p).toBe(A000129[k + 2]);
      expect(cv.q).toBe(A000129[k + 1]);
    });
    expect(c.slice(1).every((cv) => cv.a === 2)).toBe(true);
  });

  it('√7 = [2; 1,1,1,4] periodic (classic example, e.g. Hardy & Wright §10.12 tables)', () => {
    expect(partialQuotients({ a: 0, b: 1, c: 1, d: 7 }, 9).map(Number)).toEqual([2, 1, 1, 1, 4, 1, 1, 1, 4]);
    // (1 − √2)/3 ≈ −0.138: a0 = −1 (floor of a negative number)
    expect(Number(partialQuotients({ a: 1, b: -1, c: 3, d: 2 }, 1)[0])).toBe(-1);
  });

  it('every convergent satisfies |x − p/q| < 1/q² (Legendre/Dirichlet theorem) and the bound test is exact', () => {
    for (const x of [GOLDEN_MEAN, SILVER_MEAN, { a: 3, b: -2, c: 7, d: 11 }]) {
      const c = convergents(x, 25);
      for (const cv of c) {
        expect(cv.boundOk).toBe(true);
        expect(cv.error).toBeLessThan(1 / (cv.q * cv.q));
      }
    }
    // Hurwitz: for τ the error behaves like 1/(√5 q²) — q²·error → 1/√5 (Hurwitz 1891).
    const last = convergents(GOLDEN_MEAN, 40).at(-1)!;
    expect(last.error * last.q * last.q).toBeCloseTo(1 / Math.sqrt(5), 6);
  });

  it('errors agree with 60-digit decimal arithmetic (Python decimal module)', () => {
    const c = convergents(GOLDEN_MEAN, 60);
    const pairs = c.map((cv) => `${cv.p},${cv.q}`).join(';');
    const ref = runPython<number[]>(
      `import json\nfrom decimal import Decimal as D, getcontext\ngetcontext().prec=60\nx=(1+D(5).sqrt())/2\n` +
        `print(json.dumps([float(abs(x-D(p)/D(q))) for p,q in (s.split(',') for s in '${pairs}'.split(';'))]))`,
    );
    c.forEach((cv, i) => expect(Math.abs(cv.error - ref[i]) / ref[i]).toBeLessThan(1e-12));
  });

  it('guards the safe-integer limit and rejects bad numbers naming the field', () => {
    expect(() => convergents(GOLDEN_MEAN, 80)).toThrow(/count: convergent 77 exceeds 2\^53/);
    expect(() => convergents({ a: 1, b: 1, c: 1, d: 4 }, 3)).toThrow(/^d: must not be a perfect square/);
    expect(() => convergents({ a: 1, b: 0, c: 1, d: 5 }, 3)).toThrow(/^b:/);
    const r = convergentsParamsSchema.safeParse({ of: 'gold', count: 3 });
    expect(r.success).toBe(false);
    expect(r.error!.issues[0].path).toEqual(['of']);
    const r2 = convergentsParamsSchema.safeParse({ of: 'tau', count: 0 });
    expect(r2.error!.issues[0].path).toEqual(['count']);
  });
});

describe('Fibonacci chain', () => {
  it('substitution word matches OEIS A005614 and the Sturmian formula a(n) = ⌊(n+2)/τ⌋ − ⌊(n+1)/τ⌋ (OEIS A005614 formula)', () => {
    const w = Array.from(fibonacciWord(8));
    expect(w.slice(0, A005614.length)).toEqual(A005614);
    // Typo guard on the typed list itself, from the formula section of the same OEIS entry.
    A005614.forEach((v, n) => expect(v).toBe(Math.floor((n + 2) / TAU) - Math.floor((n + 1) / TAU)));
  });

  it('σⁿ(L) has F(n+1) L and F(n) S (OEIS A000045)', () => {
    for (let n = 0; n <= 18; n++) {
      const w = fibonacciWord(n);
      const L = w.reduce((a, b) => a + b, 0);
      expect(L).toBe(A000045[n + 1]);
      expect(w.length - L).toBe(A000045[n]);
      expect(fibonacci(n)).toBe(A000045[n]);
    }
  });

  it('cut-and-project with window [−1, 1/τ) and offset 0 gives the substitution word', () => {
    for (const n of [0, 1, 5, 12, 20]) {
      expect(word(generate({ family: 'fibonacci', order: n }))).toEqual(Array.from(fibonacciWord(n)));
    }
  });

  it('a phason offset changes the sequence but keeps it Sturmian: long/short ratio → τ, every vertex perp in the window', () => {
    const c = generate({ family: 'fibonacci', order: 20, offset: 0.37 });
    const w = word(c);
    expect(w).not.toEqual(Array.from(fibonacciWord(20)));
    const L = w.reduce((a, b) => a + b, 0);
    expect(L / (w.length - L)).toBeCloseTo(TAU, 4);
    const s = 1 / TAU;
    for (let i = 0; i < c.perp!.length; i++) {
      const y = c.perp![i] / s;
      expect(y >= -1 + 0.37 - 1e-12 && y < 1 / TAU + 0.37 + 1e-12).toBe(true);
    }
    // No "SS" and no "LLL": the balanced-word property of Sturmian sequences (Lothaire 2002, Ch. 2).
    const str = w.join('');
    expect(str.includes('00')).toBe(false);
    expect(str.includes('111')).toBe(false);
  });

  it('point density equals window length / hyperlattice covolume = τ/√5 (model-set density, Baake & Grimm 2013, Thm 7.2)', () => {
    // ℓ = τ, s = 1: embedding {(n_L τ + n_S, n_S − n_L/τ)} has covolume τ + 1/τ = √5; the window has length τ.
    const c = generate({ family: 'fibonacci', order: 24, long: TAU, ratio: TAU });
    const n = c.species.length - 1;
    const X = c.positions[3 * n];
    expect(n / X).toBeCloseTo(TAU / Math.sqrt(5), 5);
  });

  it('approximant of order n: one cell with F(n+1) L and F(n) S, period F(n+1)ℓ + F(n)s, a cyclic rotation of σⁿ(L)', () => {
    for (let n = 0; n <= 14; n++) {
      const c = generate({ family: 'fibonacci', order: n, approximant: true, long: 2.5 });
      const w = word(c);
      const L = w.reduce((a, b) => a + b, 0);
      expect(L).toBe(A000045[n + 1]);
      expect(w.length - L).toBe(A000045[n]);
      expect(c.cell![0][0]).toBeCloseTo(A000045[n + 1] * 2.5 + (A000045[n] * 2.5) / TAU, 12);
      // The periodic cut word is conjugate to the standard word (Christoffel words are conjugates of
      // standard words: Lothaire, Algebraic Combinatorics on Words, 2002, Ch. 2).
      const sigma = Array.from(fibonacciWord(n)).join('');
      expect((sigma + sigma).includes(w.join(''))).toBe(true);
      // Segment lengths close the period: the last segment ends at x = a.
      const last = c.positions[3 * (w.length - 1)] + (w[w.length - 1] ? 2.5 : 2.5 / TAU);
      expect(last).toBeCloseTo(c.cell![0][0], 9);
    }
  });

  it('rejects bad input naming the field, and caps the point count before allocating', () => {
    expect(() => generate({ family: 'fibonacci', order: -1 })).toThrow(/order:/);
    expect(() => generate({ family: 'fibonacci', order: 3, long: 0 })).toThrow(/long: must be positive/);
    expect(() => generate({ family: 'fibonacci', order: 3, ratio: -1 })).toThrow(/ratio:/);
    expect(() => generate({ family: 'fibonacci', order: 3, offset: Number.NaN })).toThrow(/offset:/);
    expect(() => generate({ family: 'fibonacci', order: 3, extra: 1 } as never)).toThrow(/extra|Unrecognized/);
    expect(() => generate({ family: 'fibonacci', order: 40 })).toThrow(/maxPoints: .* about 267,914,297 points/);
    expect(() => generate({ family: 'fibonacci', order: 10, maxPoints: 100 })).toThrow(/about 145 points/);
    expect(chainParamsSchema.safeParse({ order: 5, maxPoints: 0 }).error!.issues[0].path).toEqual(['maxPoints']);
  });
});
