import { forEachPairWithin } from '../math/cell-list';
import { toCartesian, toFractional } from '../math/frac';
import type { Structure } from './types';
import { perpDimension, validateStructure } from './validate';

export interface MergeRecord {
  /** Index (in the input) of the atom that stays. */
  kept: number;
  /** Index (in the input) of the atom that goes. */
  removed: number;
  /** Their distance, Å (minimum image when periodic). */
  distance: number;
  /** Present when the two disagreed on species or site class: what each had before the merge. */
  conflict?: { keptSpecies: number; keptSite?: number; removedSpecies: number; removedSite?: number; result: 'kept' | 'removed' };
}

export interface MergeResult {
  structure: Structure;
  /** One record per removed atom, by increasing removed index. */
  merged: MergeRecord[];
  /** Number of atoms removed. */
  count: number;
  /** Number of merges where species or site class differed. */
  conflicts: number;
}

export interface MergeOptions {
  /**
   * Where the merged atom sits: 'kept' (default) keeps the kept atom's position; 'mean' puts it at the mean of
   * the atoms merged into it (minimum image), which is what a symmetric model needs: two atoms that are images of
   * each other under a symmetry operation merge onto the symmetry element, so the result keeps the group, while
   * keeping one of the two would break it (the 1/1 Bergman and Tsai decorations came out R3 and P23).
   */
  position?: 'kept' | 'mean';
}

/**
 * Merge atoms closer than tol (Å), periodic images included (cell-list search, O(N)).
 * Deterministic: atoms are visited by increasing index; atom j is removed when some lower-index atom
 * that is itself kept lies within tol, and it merges into the lowest such index. The kept atom keeps
 * its position by default (option `position: 'mean'` moves it to the mean of its group instead). When the two disagree on
 * site class (or species), the one with the earlier site class wins — in placeClusters output the
 * inner shells and the input's own classes come first — ties going to the kept atom; the record
 * reports the conflict. Tiles are remapped onto the kept atoms.
 */
export function mergeClose(s: Structure, tol: number, opts: MergeOptions = {}): MergeResult {
  validateStructure(s);
  const n = s.species.length;
  const partners: { i: number; j: number; d: number }[] = [];
  if (tol > 0 && n > 1) forEachPairWithin(s.positions, s.cell, tol, (i, j, d) => {
    if (i !== j) partners.push({ i, j, d });
  });
  // For each j, candidates i < j by increasing i (then distance for several images of one pair).
  partners.sort((a, b) => a.j - b.j || a.i - b.i || a.d - b.d);
  const into = new Int32Array(n).fill(-1);
  const species = Uint16Array.from(s.species);
  const site = s.site ? Uint16Array.from(s.site) : undefined;
  const merged: MergeRecord[] = [];
  let conflicts = 0;
  let k = 0;
  while (k < partners.length) {
    const j = partners[k].j;
    let chosen: { i: number; d: number } | undefined;
    while (k < partners.length && partners[k].j === j) {
      const p = partners[k++];
      if (!chosen && into[p.i] < 0) chosen = { i: p.i, d: p.d };
    }
    if (!chosen) continue;
    const i = chosen.i;
    into[j] = i;
    const rec: MergeRecord = { kept: i, removed: j, distance: chosen.d };
    const siteDiffers = site !== undefined && site[i] !== site[j];
    if (siteDiffers || species[i] !== species[j]) {
      conflicts++;
      const removedWins = site !== undefined && site[j] < site[i];
      rec.conflict = {
        keptSpecies: species[i],
        removedSpecies: species[j],
        ...(site ? { keptSite: site[i], removedSite: site[j] } : {}),
        result: removedWins ? 'removed' : 'kept',
      };
      if (removedWins) {
        species[i] = species[j];
        site![i] = site![j];
      }
    }
    merged.push(rec);
  }
  merged.sort((a, b) => a.removed - b.removed);
  const newIndex = new Int32Array(n);
  let m = 0;
  for (let i = 0; i < n; i++) newIndex[i] = into[i] < 0 ? m++ : -1;
  for (let i = 0; i < n; i++) if (into[i] >= 0) newIndex[i] = newIndex[into[i]];
  const keep = (i: number) => into[i] < 0;
  const out: Structure = {
    ...s,
    positions: new Float64Array(3 * m),
    species: new Uint16Array(m),
  };
  const d = perpDimension(s);
  if (site) out.site = new Uint16Array(m);
  if (s.occupancy) out.occupancy = new Float64Array(m);
  if (s.perp) out.perp = new Float64Array(d * m);
  const pos = opts.position === 'mean' && merged.length > 0 ? meanPositions(s, into) : s.positions;
  for (let i = 0; i < n; i++) {
    if (!keep(i)) continue;
    const q = newIndex[i];
    out.positions[3 * q] = pos[3 * i];
    out.positions[3 * q + 1] = pos[3 * i + 1];
    out.positions[3 * q + 2] = pos[3 * i + 2];
    out.species[q] = species[i];
    if (site) out.site![q] = site[i];
    if (s.occupancy) out.occupancy![q] = s.occupancy[i];
    if (s.perp) for (let c = 0; c < d; c++) out.perp![d * q + c] = s.perp[d * i + c];
  }
  if (s.tiles) out.tiles = { ...s.tiles, corners: Uint32Array.from(s.tiles.corners, (c) => newIndex[c]) };
  return { structure: out, merged, count: merged.length, conflicts };
}

/**
 * Positions with each kept atom moved to the mean of itself and the atoms merged into it. Periodic: each
 * partner enters by its minimum image relative to the kept atom (fractional difference rounded to the nearest
 * lattice vector — exact for the short merge distances in cells much longer than the tolerance).
 */
function meanPositions(s: Structure, into: Int32Array): Float64Array {
  const n = s.species.length;
  const sum = new Float64Array(3 * n);
  const cnt = new Uint32Array(n);
  const frac = s.cell ? toFractional(s.cell, s.positions) : undefined;
  for (let j = 0; j < n; j++) {
    const i = into[j] < 0 ? j : into[j];
    cnt[i]++;
    if (!frac || i === j) {
      for (let c = 0; c < 3; c++) sum[3 * i + c] += s.positions[3 * j + c] - (frac ? s.positions[3 * i + c] : 0);
      continue;
    }
    const df = [0, 1, 2].map((c) => {
      const d = frac[3 * j + c] - frac[3 * i + c];
      return d - Math.round(d);
    });
    const cart = toCartesian(s.cell!, df);
    for (let c = 0; c < 3; c++) sum[3 * i + c] += cart[c];
  }
  const out = Float64Array.from(s.positions);
  for (let i = 0; i < n; i++) {
    if (into[i] >= 0 || cnt[i] < 2) continue;
    // Periodic: sum holds displacements from atom i (its own is 0); finite: absolute positions.
    for (let c = 0; c < 3; c++) out[3 * i + c] = frac ? s.positions[3 * i + c] + sum[3 * i + c] / cnt[i] : sum[3 * i + c] / cnt[i];
  }
  return out;
}

/**
 * Every atom of a periodic structure moved into its cell: fractional coordinates reduced into [0, 1)
 * (x − ⌊x⌋, a value that rounds to 1 becomes 0; a coordinate within 1e-9 below an integer is taken as that
 * integer, so float noise on a cell face does not send an atom to the far face). Returns the structure and how
 * many atoms moved; a structure without a cell is returned as it is.
 */
export function wrapCounting(s: Structure): { structure: Structure; count: number } {
  if (!s.cell) return { structure: s, count: 0 };
  const f = toFractional(s.cell, s.positions);
  const moved = new Uint8Array(f.length / 3);
  let count = 0;
  for (let i = 0; i < f.length; i += 3) {
    for (let q = 0; q < 3; q++) {
      const x = f[i + q];
      const k = Math.floor(x + 1e-9);
      if (k === 0) {
        // Within 1e-9 below 0 (float noise, e.g. the mean of ±x): that is 0 itself.
        if (x < 0) {
          f[i + q] = 0;
          moved[i / 3] = 1;
        }
        continue;
      }
      let w = x - k;
      if (w < 0 || w >= 1) w = 0;
      f[i + q] = w;
      moved[i / 3] = 1;
    }
    count += moved[i / 3];
  }
  if (count === 0) return { structure: s, count: 0 };
  const wrapped = toCartesian(s.cell, f);
  // Atoms that did not move keep their exact coordinates (no round trip through fractions).
  const positions = Float64Array.from(s.positions);
  for (let a = 0; a < moved.length; a++) if (moved[a]) positions.set(wrapped.subarray(3 * a, 3 * a + 3), 3 * a);
  return { structure: { ...s, positions }, count };
}
