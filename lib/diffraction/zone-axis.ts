/**
 * Zone-axis patterns: the reciprocal plane perpendicular to a beam direction.
 *
 * Axes: "5", "3", "2" are the icosahedral axes in the lib/models/icosahedral/hyperlattice.ts frame — 5-fold along
 * u1 ∝ (1, τ, 0) (a vertex of the icosahedron), 3-fold along (1, 1, 1) (centre of the face spanned by
 * the mutually adjacent vertices (1,τ,0), (0,1,τ), (τ,0,1)), 2-fold along (0, 0, 1) (the coordinate axes
 * bisect edges, e.g. (1,τ,0)+(−1,τ,0) ∥ y). [u, v, w] is the lattice direction u·a + v·b + w·c of a
 * crystal (or Cartesian when there is no cell).
 *
 * Crystals: reflections with h·[uvw] = n, |n| ≤ laueZones (n = 0 the zero-order Laue zone), |Q| ≤ qmax,
 * intensity |F|² (kinematic, no Lp — a transmission electron pattern), largest in-zone = 100; down an
 * icosahedral axis of an approximant, the reflections within ±slab of the plane.
 * Patches: |F(Q)|²/N by direct summation on a square grid of the plane through the origin (or averaged
 * over layers spanning ±slab Å⁻¹ along the axis, a thick Laue zone), with phase recurrences along
 * grid rows (cartesian-sum.ts). The finite patch gives every spot its natural width ≈ 2π/D.
 * In-plane coordinates (qx, qy) are along e1, e2: e1 = unit(axis × c), c the coordinate axis least
 * parallel to the beam, e2 = axis × e1 (deterministic).
 */
import { reciprocal, vecMat } from '../math/mat3';
import { cross, dot, normalize, norm, scale, type Vec3 } from '../math/vec3';
import type { Structure } from '../structure/types';
import { TAU } from '../math/golden';
import type { Radiation } from './form-factors';
import { groupAtoms, groupFactor } from './scatterers';
import { gridPartialSums, type PlaneGrid } from './cartesian-sum';
import { enumerateHkl, structureFactorsHkl } from './structure-factor';

export type ZoneAxisSpec = '5' | '3' | '2' | [number, number, number];

export function parseAxis(text: string): ZoneAxisSpec {
  const t = text.trim();
  if (t === '5' || t === '3' || t === '2') return t;
  const m = /^\[?\s*(-?\d+)\s*[, ]\s*(-?\d+)\s*[, ]\s*(-?\d+)\s*\]?$/.exec(t);
  if (!m) throw new Error(`axis: "${text}" is not 5, 3, 2 or u,v,w`);
  const v: [number, number, number] = [Number(m[1]), Number(m[2]), Number(m[3])];
  if (v.every((x) => x === 0)) throw new Error('axis: [0,0,0] is not a direction');
  return v;
}

/** Beam direction and in-plane frame for an axis spec. */
export function zoneFrame(axis: ZoneAxisSpec, s?: Structure): { axis: Vec3; e1: Vec3; e2: Vec3 } {
  let a: Vec3;
  if (axis === '5') a = [1, TAU, 0];
  else if (axis === '3') a = [1, 1, 1];
  else if (axis === '2') a = [0, 0, 1];
  else if (s?.cell) a = vecMat(axis, s.cell);
  else a = [axis[0], axis[1], axis[2]];
  a = normalize(a);
  const absd = a.map(Math.abs);
  const pick: Vec3 = absd[2] <= absd[0] && absd[2] <= absd[1] ? [0, 0, 1] : absd[1] <= absd[0] ? [0, 1, 0] : [1, 0, 0];
  const e1 = normalize(cross(a, pick));
  const e2 = cross(a, e1);
  return { axis: a, e1, e2 };
}

export interface ZoneSpot {
  /** In-plane Q components along e1, e2 (Å⁻¹) and the out-of-plane component. */
  qx: number;
  qy: number;
  qz: number;
  q: number;
  /** |F|²/N (patch) or |F|² (crystal). */
  intensity: number;
  /** Relative to the strongest spot other than the origin (= 100). */
  relative: number;
  hkl?: [number, number, number];
  laueZone?: number;
}

export interface ZoneOptions {
  axis: ZoneAxisSpec;
  qmax: number;
  radiation?: Radiation;
  laueZones?: number;
  slab?: number;
  grid?: number;
  threshold?: number;
}

export interface ZoneMap {
  frame: { axis: Vec3; e1: Vec3; e2: Vec3 };
  n: number;
  step: number;
  /** Row-major n×n, (a, b) → Q = −qmax(e1 + e2) + step(a e1 + b e2); |F|²/N. */
  intensity: Float64Array;
}

export interface ZoneLayers {
  frame: { axis: Vec3; e1: Vec3; e2: Vec3 };
  n: number;
  step: number;
  /** One plane grid per layer (offset t along the beam). */
  layers: { t: number; grid: PlaneGrid }[];
}

/** The grids a zone map sums over: one plane through the origin, or 5 layers spanning ±slab. */
export function zoneLayers(s: Structure, o: ZoneOptions): ZoneLayers {
  if (!(o.qmax > 0)) throw new Error(`qmax: must be positive (Å⁻¹), got ${o.qmax}`);
  const n = o.grid ?? 201;
  if (!Number.isInteger(n) || n < 3 || n > 2048) throw new Error(`grid: must be an integer 3..2048, got ${n}`);
  const frame = zoneFrame(o.axis, s);
  const { e1, e2, axis } = frame;
  const step = (2 * o.qmax) / (n - 1);
  const slab = o.slab ?? 0;
  const count = slab > 0 ? 5 : 1;
  const layers: ZoneLayers['layers'] = [];
  for (let layer = 0; layer < count; layer++) {
    const t = count === 1 ? 0 : -slab + (2 * slab * layer) / (count - 1);
    const q0: Vec3 = [0, 1, 2].map((c) => -o.qmax * (e1[c] + e2[c]) + t * axis[c]) as Vec3;
    layers.push({ t, grid: { q0, du: scale(e1, step), dv: scale(e2, step), na: n, nb: n } });
  }
  return { frame, n, step, layers };
}

/** Combine per-group grid sums of each layer into |F(Q)|²/N, averaged over layers. */
export function zoneMapFromSums(s: Structure, o: ZoneOptions, z: ZoneLayers, sums: { re: Float64Array; im: Float64Array }[]): ZoneMap {
  const { groups } = groupAtoms(s);
  const { n, step } = z;
  const cells = n * n;
  const out = new Float64Array(cells);
  const atoms = Math.max(1, s.species.length);
  z.layers.forEach(({ t }, li) => {
    const { re, im } = sums[li];
    for (let b = 0; b < n; b++) {
      for (let a = 0; a < n; a++) {
        const i = b * n + a;
        const qx = -o.qmax + a * step;
        const qy = -o.qmax + b * step;
        const s2 = (qx * qx + qy * qy + t * t) / (16 * Math.PI * Math.PI);
        let r = 0;
        let c = 0;
        for (let g = 0; g < groups.length; g++) {
          const f = groupFactor(groups[g], o.radiation ?? 'xray', s2);
          r += f * re[g * cells + i];
          c += f * im[g * cells + i];
        }
        out[i] += (r * r + c * c) / atoms / z.layers.length;
      }
    }
  });
  return { frame: z.frame, n, step, intensity: out };
}

/** |F(Q)|²/N on a square grid of the zone plane (averaged over layers when slab > 0). */
export function zoneMap(s: Structure, o: ZoneOptions): ZoneMap {
  const z = zoneLayers(s, o);
  const { groups, groupOf, weight } = groupAtoms(s);
  const cells = z.n * z.n;
  const sums = z.layers.map(({ grid }) => {
    const re = new Float64Array(groups.length * cells);
    const im = new Float64Array(groups.length * cells);
    gridPartialSums(s.positions, groupOf, weight, grid, re, im);
    return { re, im };
  });
  return zoneMapFromSums(s, o, z, sums);
}

/** Local maxima (8 neighbours) of a zone map above threshold × the strongest off-centre maximum. */
export function mapSpots(map: ZoneMap, qmax: number, threshold = 1e-3): ZoneSpot[] {
  const { n, step, intensity: I } = map;
  const spots: ZoneSpot[] = [];
  for (let b = 1; b < n - 1; b++) {
    for (let a = 1; a < n - 1; a++) {
      const v = I[b * n + a];
      let peak = true;
      for (let db = -1; db <= 1 && peak; db++)
        for (let da = -1; da <= 1; da++) {
          if (da === 0 && db === 0) continue;
          const w = I[(b + db) * n + a + da];
          // ties broken towards the lower index so a flat top yields one spot
          if (w > v || (w === v && (db < 0 || (db === 0 && da < 0)))) {
            peak = false;
            break;
          }
        }
      if (!peak) continue;
      // Parabolic refinement of the position along each grid direction.
      const fx = I[b * n + a - 1], gx = I[b * n + a + 1];
      const fy = I[(b - 1) * n + a], gy = I[(b + 1) * n + a];
      const dxa = fx - 2 * v + gx !== 0 ? (0.5 * (fx - gx)) / (fx - 2 * v + gx) : 0;
      const dya = fy - 2 * v + gy !== 0 ? (0.5 * (fy - gy)) / (fy - 2 * v + gy) : 0;
      const qx = -qmax + (a + dxa) * step;
      const qy = -qmax + (b + dya) * step;
      if (Math.hypot(qx, qy) > qmax) continue; // the square grid's corners reach √2·qmax
      spots.push({ qx, qy, qz: 0, q: Math.hypot(qx, qy), intensity: v, relative: 0 });
    }
  }
  return rank(spots, threshold, step);
}

function rank(spots: ZoneSpot[], threshold: number, originTol: number): ZoneSpot[] {
  let top = 0;
  for (const p of spots) if (p.q > originTol) top = Math.max(top, p.intensity);
  for (const p of spots) p.relative = top > 0 ? (100 * p.intensity) / top : 0;
  return spots
    .filter((p) => p.relative >= threshold * 100 || p.q <= originTol)
    .sort((x, y) => y.intensity - x.intensity || x.q - y.q || x.qx - y.qx || x.qy - y.qy);
}

/**
 * Crystal zone pattern. For a lattice direction [uvw]: reflections with h·[uvw] = n, |n| ≤ laueZones.
 * For an icosahedral axis of a periodic approximant ("5", "3", "2" — generally not a lattice row):
 * reflections with |Q·beam| ≤ slab (default 0.05 Å⁻¹), the approximant's pseudo-zone.
 */
export function crystalZone(s: Structure, o: ZoneOptions): ZoneSpot[] {
  if (!s.cell) throw new Error('cell: crystalZone needs a periodic structure');
  const frame = zoneFrame(o.axis, s);
  const recip = reciprocal(s.cell);
  const all = enumerateHkl(s, (2 * Math.PI) / o.qmax);
  const lattice = typeof o.axis !== 'string';
  const nmax = o.laueZones ?? 0;
  const slab = o.slab && o.slab > 0 ? o.slab : 0.05;
  const keep: number[] = [];
  for (let i = 0; i < all.length / 3; i++) {
    const [h, k, l] = [all[3 * i], all[3 * i + 1], all[3 * i + 2]];
    if (lattice) {
      const [u, v, w] = o.axis as [number, number, number];
      if (Math.abs(h * u + k * v + l * w) > nmax) continue;
    } else {
      const g = vecMat([h, k, l], recip);
      if (Math.abs(2 * Math.PI * dot(g, frame.axis)) > slab) continue;
    }
    keep.push(h, k, l);
  }
  const hkl = Int32Array.from(keep);
  const f = structureFactorsHkl(s, hkl, o.radiation ?? 'xray');
  const spots: ZoneSpot[] = [];
  for (let i = 0; i < hkl.length / 3; i++) {
    const g = scale(vecMat(hkl.subarray(3 * i, 3 * i + 3), recip), 2 * Math.PI);
    const spot: ZoneSpot = {
      qx: dot(g, frame.e1),
      qy: dot(g, frame.e2),
      qz: dot(g, frame.axis),
      q: norm(g),
      intensity: f.f2[i],
      relative: 0,
      hkl: [hkl[3 * i], hkl[3 * i + 1], hkl[3 * i + 2]],
    };
    if (lattice) {
      const [u, v, w] = o.axis as [number, number, number];
      spot.laueZone = hkl[3 * i] * u + hkl[3 * i + 1] * v + hkl[3 * i + 2] * w;
    }
    spots.push(spot);
  }
  return rank(spots, o.threshold ?? 1e-3, 0);
}

/** Periodic structures → crystalZone; anything else → zoneMap + mapSpots. */
export function zonePattern(s: Structure, o: ZoneOptions): { spots: ZoneSpot[]; map?: ZoneMap } {
  if (s.cell) return { spots: crystalZone(s, o) };
  const map = zoneMap(s, o);
  return { spots: mapSpots(map, o.qmax, o.threshold ?? 1e-3), map };
}
