/**
 * Contacts for the Check step, in one pass of the cell list (lib/math/cell-list.ts): the shortest distance per
 * species pair, the pairs closer than the radii-table threshold (counted, and the shortest few listed), and the
 * coordination number of every atom.
 *
 * Coordination: neighbours within 1.2·(r₁ + r₂) with CN-12 contact radii — common practice (from memory) for
 * intermetallics, whose first shell ends about 10–20 % beyond the radius sum and whose second shell starts
 * further out (fcc: 12 neighbours at 1.0·2r, next at 1.41·2r; bcc: 8 + 6 = 14 within 1.15·2r). Elements without a
 * radius (X, unassigned vertices) use half the mean spacing (V/N)^(1/3) as their radius.
 */
import { cellVolume } from '../../math/cell';
import { forEachPairWithin } from '../../math/cell-list';
import { symbolOf } from '../elements';
import { contactRadius, TOO_CLOSE_FRACTION } from '../radii';
import type { Structure } from '../types';
import { validateStructure } from '../validate';

/** Neighbours within this multiple of r₁ + r₂ count towards the coordination number (see the file comment). */
export const COORDINATION_FACTOR = 1.2;

export interface SpeciesPairDistance {
  a: string;
  b: string;
  za: number;
  zb: number;
  /** Shortest distance found in Å (minimum image and beyond when periodic); null when none within the search radius. */
  shortest: number | null;
  /** TOO_CLOSE_FRACTION·(r₁ + r₂), Å; null without radii. */
  threshold: number | null;
  /** shortest / (r₁ + r₂); null without radii or without a pair. */
  ratio: number | null;
  /** Pairs of this kind below the threshold. */
  tooClose: number;
}

export interface CloseContact {
  i: number;
  j: number;
  a: string;
  b: string;
  distance: number;
  threshold: number;
}

export interface Contacts {
  /** Search radius used, Å: pairs further apart than this are not seen. */
  searchRadius: number;
  /** The search stopped short of the first shell (grossly overlapping model): counts are lower bounds. */
  truncated: boolean;
  pairs: SpeciesPairDistance[];
  /** Shortest pairs below their threshold, shortest first, at most maxListed. */
  tooClose: CloseContact[];
  /** All pairs below their threshold. */
  tooCloseCount: number;
  /** Distinct atoms in at least one too-close pair. */
  atomsInTooClose: number;
  /** Coordination number per atom (neighbours within COORDINATION_FACTOR·(r₁ + r₂)). */
  coordination: Uint16Array;
  /** Shortest distance in the structure (Å), Infinity when no pair is within the search radius. */
  shortest: number;
}

export interface ContactOptions {
  /** Most too-close pairs listed (default 50). */
  maxListed?: number;
}

/** Mean spacing (V/N)^(1/3), or per dimension spanned for finite sets — the scale of the search. */
function spacing(s: Structure): number {
  const n = s.species.length;
  if (s.cell && (s.dim ?? 3) === 3) return Math.cbrt(Math.abs(cellVolume(s.cell)) / Math.max(n, 1));
  const lo = [Infinity, Infinity, Infinity];
  const hi = [-Infinity, -Infinity, -Infinity];
  for (let i = 0; i < n; i++)
    for (let k = 0; k < 3; k++) {
      lo[k] = Math.min(lo[k], s.positions[3 * i + k]);
      hi[k] = Math.max(hi[k], s.positions[3 * i + k]);
    }
  const ext = lo.map((l, k) => hi[k] - l).filter((e) => e > 1e-9);
  if (ext.length === 0) return 1;
  return Math.max(Math.pow(ext.reduce((a, b) => a * b, 1) / n, 1 / ext.length), 1e-3);
}

export function contacts(s: Structure, opts: ContactOptions = {}): Contacts {
  validateStructure(s);
  const n = s.species.length;
  const maxListed = opts.maxListed ?? 50;
  const zs = [...new Set(s.species)].sort((a, b) => a - b);
  const radius = new Map<number, number>(zs.map((z) => [z, contactRadius(z)]));
  const known = zs.map((z) => radius.get(z)!).filter(Number.isFinite);
  const h = spacing(s);
  // Far enough to see the first shell of every pair of known elements, and at least 1.5 mean spacings so that
  // unassigned vertices (no radius) find their neighbours. Never more than 4 mean spacings (≈ 130 pairs per atom):
  // a grossly overlapping model (mean spacing far below the radii) is then searched only that far, and its counts
  // are lower bounds (`truncated`) — its density is flagged anyway.
  const rMaxKnown = known.length ? 2 * COORDINATION_FACTOR * Math.max(...known) : 0;
  const searchRadius = Math.min(Math.max(rMaxKnown, 1.5 * h), 4 * h);
  const truncated = searchRadius < rMaxKnown;
  const index = new Map<number, number>(zs.map((z, k) => [z, k]));
  const m = zs.length;
  // Per-atom type index and radius (NaN for X), so the pair visitor does array reads only.
  const type = new Int32Array(n);
  const rad = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    type[i] = index.get(s.species[i])!;
    rad[i] = radius.get(s.species[i])!;
  }
  const best = new Float64Array(m * m).fill(Infinity);
  const below = new Uint32Array(m * m);
  // Too-close pairs kept as [i, j, d] triples; trimmed to the shortest maxListed whenever the list grows past
  // 4·maxListed, after which only pairs shorter than the last kept one are taken (bounded memory and work).
  let kept: [number, number, number][] = [];
  let worstKept = Infinity;
  const trim = () => {
    kept.sort((x, y) => x[2] - y[2] || x[0] - y[0] || x[1] - y[1]);
    kept = kept.slice(0, maxListed);
    if (kept.length === maxListed) worstKept = kept[maxListed - 1][2];
  };
  const coordination = new Uint16Array(n);
  const inClose = new Uint8Array(n);
  let tooCloseCount = 0;
  let shortest = Infinity;
  const pending: [number, number, number][] = [];
  const half = h / 2;
  if (n > 0) {
    forEachPairWithin(s.positions, s.cell, searchRadius, (i, j, d) => {
      const a = type[i];
      const b = type[j];
      const k = a <= b ? a * m + b : b * m + a;
      if (d < best[k]) best[k] = d;
      if (d < shortest) shortest = d;
      const sum = rad[i] + rad[j];
      if (sum === sum) {
        if (d < TOO_CLOSE_FRACTION * sum) {
          below[k]++;
          tooCloseCount++;
          inClose[i] = 1;
          inClose[j] = 1;
          if (d < worstKept || (d === worstKept && kept.length < maxListed)) {
            kept.push([i, j, d]);
            if (kept.length > 4 * maxListed + 64) trim();
          }
        }
        if (d < COORDINATION_FACTOR * sum) {
          if (i !== j) {
            coordination[i]++;
            coordination[j]++;
          } else coordination[i] += 2; // an atom and its own periodic image: a neighbour on each side
        }
      } else pending.push([i, j, d]);
    });
  }
  // Pairs involving an element without a radius: half the mean spacing stands in for it.
  for (const [i, j, d] of pending) {
    const sum = (rad[i] === rad[i] ? rad[i] : half) + (rad[j] === rad[j] ? rad[j] : half);
    if (d < COORDINATION_FACTOR * sum) {
      if (i !== j) {
        coordination[i]++;
        coordination[j]++;
      } else coordination[i] += 2;
    }
  }
  trim();
  const listed: CloseContact[] = kept.map(([i, j, d]) => ({
    i,
    j,
    a: symbolOf(s.species[i]),
    b: symbolOf(s.species[j]),
    distance: d,
    threshold: TOO_CLOSE_FRACTION * (rad[i] + rad[j]),
  }));
  const pairs: SpeciesPairDistance[] = [];
  for (let a = 0; a < m; a++)
    for (let b = a; b < m; b++) {
      const za = zs[a];
      const zb = zs[b];
      const k = a * m + b;
      const sum = radius.get(za)! + radius.get(zb)!;
      const d = Number.isFinite(best[k]) ? best[k] : null;
      pairs.push({
        a: symbolOf(za),
        b: symbolOf(zb),
        za,
        zb,
        shortest: d,
        threshold: Number.isFinite(sum) ? TOO_CLOSE_FRACTION * sum : null,
        ratio: Number.isFinite(sum) && d !== null ? d / sum : null,
        tooClose: below[k],
      });
    }
  let atomsInTooClose = 0;
  for (let i = 0; i < n; i++) atomsInTooClose += inClose[i];
  return { searchRadius, truncated, pairs, tooClose: listed, tooCloseCount, atomsInTooClose, coordination, shortest };
}
