/**
 * TEMPORARY zone-axis spots for periodic structures (approximants), until lib/diffraction/zone-axis.ts lands.
 * Zero Laue zone of [uvw]: reflections with h·u + k·v + l·w = 0, |G| = 2π/d ≤ qmax, I = |F|² (kinematic).
 * Icosahedral axes ("5", "3", "2") are taken to the approximant's rational pseudo-axis by τ → p/q
 * (the same substitution that makes the p/q cell, lib/tiling/approximant.ts).
 */
import type { Structure, Vec3 } from '../structure/types';
import { enumerateHkl, structureFactorsHkl } from '../diffraction/structure-factor';
import { axesOfFold, reciprocalCell } from '../view/axes';
import { TAU } from '../tiling/hyperlattice';
import type { ZoneResult, ZoneSpot } from './protocol';

function gcd(a: number, b: number): number {
  a = Math.abs(a);
  b = Math.abs(b);
  while (b) [a, b] = [b, a % b];
  return a;
}

/** Integer [uvw] for an icosahedral axis with τ replaced by p/q. */
export function rationalAxis(n: Vec3, p: number, q: number): Vec3 {
  const nz = n.filter((c) => Math.abs(c) > 1e-9).map(Math.abs);
  const unit = Math.min(...nz);
  const out: number[] = n.map((c) => {
    const v = c / unit;
    for (let b = -3; b <= 3; b++) {
      for (let a = -3; a <= 3; a++) {
        if (Math.abs(a + b * TAU - v) < 1e-6) return a * q + b * p;
      }
    }
    throw new RangeError(`axis: component ${v} is not of the form a + bτ`);
  });
  const g = out.reduce((acc, x) => gcd(acc, x), 0) || 1;
  return out.map((x) => x / g) as Vec3;
}

function orderOf(s: Structure): { p: number; q: number } | null {
  const pr = s.provenance.params as { p?: number; q?: number; order?: { p?: number; q?: number } | string } | null;
  if (!pr || typeof pr !== 'object') return null;
  if (typeof pr.p === 'number' && typeof pr.q === 'number') return { p: pr.p, q: pr.q };
  if (pr.order && typeof pr.order === 'object' && typeof pr.order.p === 'number' && typeof pr.order.q === 'number') return { p: pr.order.p, q: pr.order.q };
  if (typeof pr.order === 'string' && /^\d+\/\d+$/.test(pr.order)) {
    const [p, q] = pr.order.split('/').map(Number);
    return { p, q };
  }
  return null;
}

export function zoneSpots(s: Structure, axis: string, qmax: number, radiation: 'xray' | 'neutron' | 'electron'): ZoneResult {
  if (!s.cell) throw new Error('axis: zone-axis patterns of finite patches need the diffraction engine; generate an approximant');
  if (!(qmax > 0)) throw new Error('qmax: must be positive (Å⁻¹)');
  let uvw: Vec3;
  let axisLabel: string;
  if (/^(5|3|2)$/.test(axis)) {
    const ord = orderOf(s) ?? { p: 1, q: 1 };
    uvw = rationalAxis(axesOfFold(Number(axis) as 2 | 3 | 5)[0], ord.p, ord.q);
    axisLabel = `${axis}-fold (pseudo-axis [${uvw.join(' ')}] of ${ord.p}/${ord.q})`;
  } else {
    const parts = axis.split(',').map((t) => Number(t.trim()));
    if (parts.length !== 3 || parts.some((x) => !Number.isInteger(x)) || parts.every((x) => x === 0)) throw new Error('axis: must be 5, 3, 2 or three integers u,v,w');
    uvw = parts as Vec3;
    axisLabel = `[${uvw.join(' ')}]`;
  }
  const dMin = (2 * Math.PI) / qmax;
  const all = enumerateHkl(s, dMin);
  const keep: number[] = [];
  for (let i = 0; i < all.length; i += 3) if (all[i] * uvw[0] + all[i + 1] * uvw[1] + all[i + 2] * uvw[2] === 0) keep.push(all[i], all[i + 1], all[i + 2]);
  const hkl = Int32Array.from(keep);
  const f = structureFactorsHkl(s, hkl, radiation);
  const rec = reciprocalCell(s.cell);
  // In-plane frame: e1 ⟂ axis, e2 = axis × e1 (Cartesian axis = uvw in the cell basis).
  const [a, b, c] = s.cell;
  const ax: Vec3 = [0, 1, 2].map((k) => uvw[0] * a[k] + uvw[1] * b[k] + uvw[2] * c[k]) as Vec3;
  const an = Math.hypot(...ax);
  const n: Vec3 = [ax[0] / an, ax[1] / an, ax[2] / an];
  const ref: Vec3 = Math.abs(n[2]) < 0.9 ? [0, 0, 1] : [1, 0, 0];
  const d = ref[0] * n[0] + ref[1] * n[1] + ref[2] * n[2];
  let e1: Vec3 = [ref[0] - d * n[0], ref[1] - d * n[1], ref[2] - d * n[2]];
  const e1n = Math.hypot(...e1);
  e1 = [e1[0] / e1n, e1[1] / e1n, e1[2] / e1n];
  const e2: Vec3 = [n[1] * e1[2] - n[2] * e1[1], n[2] * e1[0] - n[0] * e1[2], n[0] * e1[1] - n[1] * e1[0]];
  let max = 0;
  for (let i = 0; i < f.f2.length; i++) max = Math.max(max, f.f2[i]);
  const spots: ZoneSpot[] = [];
  for (let i = 0; i < f.f2.length; i++) {
    const h = f.hkl[3 * i];
    const k = f.hkl[3 * i + 1];
    const l = f.hkl[3 * i + 2];
    const g: Vec3 = [0, 1, 2].map((m) => 2 * Math.PI * (h * rec[0][m] + k * rec[1][m] + l * rec[2][m])) as Vec3;
    const I = max > 0 ? f.f2[i] / max : 0;
    if (I < 1e-4) continue;
    spots.push({
      x: g[0] * e1[0] + g[1] * e1[1] + g[2] * e1[2],
      y: g[0] * e2[0] + g[1] * e2[1] + g[2] * e2[2],
      intensity: I,
      label: `${h} ${k} ${l}`,
      qPar: Math.hypot(...g),
    });
  }
  return { spots, axisLabel, qmax };
}
