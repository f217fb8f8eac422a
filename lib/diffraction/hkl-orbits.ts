/**
 * Reflections of a powder pattern up to the structure's axis-sign symmetry: one index per orbit, with the orbit's
 * size as multiplicity.
 *
 * If x → S x + t (S = diag(±1, ±1, ±1)) maps the structure onto itself, F(h) = e^{2πi h·t} F(S h), so F(S h) has
 * the modulus of F(h) (International Tables Vol. B §1.4: reflections related by the point group are equivalent),
 * provided S also keeps |G| (S g S = g for the reciprocal metric g, i.e. g_ij = 0 where the signs differ), so the
 * form factors agree too. With real scattering factors Friedel's law adds −S. The orbit of h under this sign
 * group P is listed once, by its lexicographically largest member, with multiplicity |P h|; reflections that
 * the pure translations of the structure extinguish (Σ_t e^{2πi h·t} = 0, e.g. h + k + l odd of an I cell)
 * are left out, as a merge would drop them (|F|² = 0).
 */
import { hklBox, reciprocalMetric } from './hkl-box';
import type { Structure } from '../structure/types';
import type { AxisSymmetry } from './sf-symmetry';

export interface HklOrbits {
  /** Packed h k l, one per orbit, sorted by h, k, l. */
  hkl: Int32Array;
  /** Orbit size per entry. */
  multiplicity: Int32Array;
  /** The sign patterns of P (packed ±1 triples): every member of an orbit is S·h for S in P. */
  signs: Int8Array;
}

/** Sign patterns of P: the point parts of the symmetry that keep the metric, and with `friedel` their negatives. */
export function hklSignGroup(s: Structure, sym: AxisSymmetry, friedel: boolean): Int8Array {
  const g = reciprocalMetric(s.cell!);
  const keeps = (sg: ArrayLike<number>) => {
    for (let i = 0; i < 3; i++)
      for (let j = i + 1; j < 3; j++) if (sg[i] !== sg[j] && Math.abs(g[i][j]) > 1e-12 * Math.sqrt(g[i][i] * g[j][j])) return false;
    return true;
  };
  const out: number[] = [];
  const add = (a: number, b: number, c: number) => {
    for (let t = 0; t < out.length; t += 3) if (out[t] === a && out[t + 1] === b && out[t + 2] === c) return;
    out.push(a, b, c);
  };
  add(1, 1, 1);
  if (friedel) add(-1, -1, -1);
  for (let o = 0; o < sym.cosetSign.length; o += 3) {
    const sg = sym.cosetSign.subarray(o, o + 3);
    if (!keeps(sg)) continue;
    add(sg[0], sg[1], sg[2]);
    if (friedel) add(-sg[0], -sg[1], -sg[2]);
  }
  // Closure under products (the accepted S form a group with the identity; products of two stay diagonal).
  for (let t = 0; t < out.length; t += 3)
    for (let u = 0; u < out.length; u += 3) add(out[t] * out[u], out[t + 1] * out[u + 1], out[t + 2] * out[u + 2]);
  return Int8Array.from(out);
}

/** One reflection per orbit under `signs` with d ≥ dMin, skipping those extinguished by the translations. */
export function hklOrbits(s: Structure, dMin: number, signs: Int8Array, transHalf: Int8Array): HklOrbits {
  const { hMax, kMax, lMax, g, g2max } = hklBox(s, dMin);
  const np = signs.length / 3;
  // All eight patterns (orthogonal axes, full mmm with Friedel): the orbit's largest member is (|h|, |k|, |l|).
  const all = np === 8;
  const nt = transHalf.length / 3;
  const hs: number[] = [];
  const ms: number[] = [];
  for (let h = all ? 0 : -hMax; h <= hMax; h++) {
    for (let k = all ? 0 : -kMax; k <= kMax; k++) {
      const base = g[0][0] * h * h + 2 * g[0][1] * h * k + g[1][1] * k * k;
      const lin = 2 * (g[0][2] * h + g[1][2] * k);
      for (let l = all ? 0 : -lMax; l <= lMax; l++) {
        if (h === 0 && k === 0 && l === 0) continue;
        if (base + l * (lin + g[2][2] * l) > g2max) continue;
        let tf = 0;
        for (let t = 0; t < nt; t++) tf += ((h * transHalf[3 * t] + k * transHalf[3 * t + 1] + l * transHalf[3 * t + 2]) & 1) === 0 ? 1 : -1;
        if (tf === 0) continue;
        let mult: number;
        if (all) {
          mult = (h ? 2 : 1) * (k ? 2 : 1) * (l ? 2 : 1);
        } else {
          // Canonical: no image is lexicographically larger; multiplicity: distinct images.
          let canonical = true;
          mult = 0;
          for (let p = 0; p < np && canonical; p++) {
            const a = signs[3 * p] * h;
            const b = signs[3 * p + 1] * k;
            const c = signs[3 * p + 2] * l;
            if (a > h || (a === h && (b > k || (b === k && c > l)))) canonical = false;
            let seen = false;
            for (let q = 0; q < p && !seen; q++) seen = signs[3 * q] * h === a && signs[3 * q + 1] * k === b && signs[3 * q + 2] * l === c;
            if (!seen) mult++;
          }
          if (!canonical) continue;
        }
        hs.push(h, k, l);
        ms.push(mult);
      }
    }
  }
  return { hkl: Int32Array.from(hs), multiplicity: Int32Array.from(ms), signs };
}
