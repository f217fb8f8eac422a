/**
 * Space groups of periodic structures through a general-purpose symmetry finder: moyo (the successor
 * library of spglib by the same group), compiled to WebAssembly as @spglib/moyo-wasm. lib/ stays pure and
 * isomorphic: the caller loads the .wasm bytes (Node: lib/server/symmetry-wasm.ts or a test reads the
 * file; browser: fetch) and hands them to `initSymmetry` once; every function here is synchronous after
 * that. Atoms are told apart by species, mixed-site composition and occupancy, so a symmetry found maps
 * like sites onto like sites.
 */
import initMoyo, { analyze_cell, initSync, operations_from_number, space_group_type } from '@spglib/moyo-wasm';
import type { Cell, Structure } from './types';
import { toCartesian, toFractional } from '../math/frac';

let ready = false;

/** Initialise the WebAssembly module from its bytes or a compiled module (idempotent). */
export function initSymmetry(wasm: BufferSource | WebAssembly.Module): void {
  if (ready) return;
  initSync({ module: wasm });
  ready = true;
}

let pending: Promise<void> | null = null;

/**
 * Browser (and worker) initialisation: without an argument moyo fetches its .wasm next to its JS module
 * (`new URL('moyo_wasm_bg.wasm', import.meta.url)`, which bundlers emit as an asset); or pass a URL,
 * Response or bytes. Idempotent; concurrent calls share one load.
 */
export function initSymmetryAsync(input?: RequestInfo | URL | Response | BufferSource | WebAssembly.Module): Promise<void> {
  if (ready) return Promise.resolve();
  pending ??= initMoyo(input === undefined ? undefined : { module_or_path: input }).then(() => {
    ready = true;
  });
  return pending;
}

export function symmetryReady(): boolean {
  return ready;
}

/**
 * How many atoms the finder is asked to handle where, because its time grows steeply with the cell. Measured
 * (CPU seconds, Node 20, load average 1–6 on 2 cores): 0.05–0.16 s for the 576-, 1 152- and 2 530-atom 3/2 and 5/3
 * cells, 2.0 s for the 4 880-atom 5/3 (I) cell (3.5 s with every atom jittered, P 1), 21 s for the 10 336-atom
 * 8/5 cell. The page runs it on its own thread, so it stays at 3 000 atoms; uploads too (the parse task has a
 * 10 s limit); exports and the API check at 5 000; the command line, where a user waits for one answer, at
 * 12 000. Above the limit the space group is reported as not computed, and a CIF is written in P 1 with every
 * atom, saying so in a comment line.
 */
export const SYMMETRY_ATOM_LIMITS = { page: 3_000, upload: 3_000, server: 5_000, cli: 12_000 } as const;

/** One symmetry operation on fractional coordinates: x' = R·x + t (R row-major, integer entries). */
export interface SymmetryOperation {
  rotation: number[];
  translation: [number, number, number];
}

export interface SpaceGroup {
  /** International Tables number 1–230. */
  number: number;
  /** Hermann–Mauguin symbol (short, with spaces as the tables print it, e.g. "P a -3"). */
  hmSymbol: string;
  hallNumber: number;
  /** Geometric crystal class (point group), e.g. "m-3". */
  pointGroup: string;
  crystalSystem: string;
  /** Operations in the frame of the input cell. */
  operations: SymmetryOperation[];
  /** Per atom: index of the representative of its orbit (symmetry-equivalent atoms share it). */
  orbits: number[];
  /** Per atom: Wyckoff letter. */
  wyckoffs: string[];
  symprec: number;
  /** moyo's map to the standard setting: x_std = stdLinear·x + stdOriginShift (row-major). */
  stdLinear: number[];
  stdOriginShift: [number, number, number];
}

export interface SpaceGroupOptions {
  /** Distance tolerance in Å (default 1e-3, spglib's and moyo's usual setting for ideal models). */
  symprec?: number;
}

function needReady(): void {
  if (!ready) throw new Error('symmetry: the space-group finder is not initialised; call initSymmetry(wasmBytes) first');
}

/** Integer type per atom: species, mixed-site composition and occupancy together. */
export function siteTypes(s: Structure): number[] {
  const keys = new Map<string, number>();
  const out: number[] = [];
  for (let i = 0; i < s.species.length; i++) {
    const cls = s.site && s.siteClasses ? s.siteClasses[s.site[i]] : undefined;
    const mix = cls?.mix ? JSON.stringify(Object.entries(cls.mix).sort()) : '';
    const occ = s.occupancy ? Math.round(s.occupancy[i] * 1e6) : 1e6;
    const key = `${s.species[i]}|${mix}|${occ}`;
    let t = keys.get(key);
    if (t === undefined) {
      t = keys.size + 1;
      keys.set(key, t);
    }
    out.push(t);
  }
  return out;
}

function moyoCell(cell: Cell, frac: Float64Array, types: number[]): string {
  const positions: number[][] = [];
  for (let i = 0; i < types.length; i++) positions.push([frac[3 * i], frac[3 * i + 1], frac[3 * i + 2]]);
  // moyo's lattice basis is a 3×3 matrix with the cell vectors as columns, serialised column by column:
  // the flat list is a₁, a₂, a₃ — our row-major Cell flattened.
  return JSON.stringify({ lattice: { basis: [...cell[0], ...cell[1], ...cell[2]] }, positions, numbers: types });
}

/** Column-major 3×3 (moyo's serialisation) → row-major. */
function rowMajor(m: ArrayLike<number>): number[] {
  return [m[0], m[3], m[6], m[1], m[4], m[7], m[2], m[5], m[8]];
}

/** The space group of a periodic structure (3D cell). Throws for non-periodic input or when moyo fails. */
export function findSpaceGroup(s: Structure, opts: SpaceGroupOptions = {}): SpaceGroup {
  needReady();
  if (!s.cell) throw new Error('symmetry: a space group needs a periodic cell; this structure has none');
  const symprec = opts.symprec ?? 1e-3;
  if (!(symprec > 0) || !Number.isFinite(symprec)) throw new RangeError(`symprec: must be a positive length in Å, got ${symprec}`);
  if (s.species.length === 0) throw new Error('symmetry: the structure has no atoms');
  const frac = toFractional(s.cell, s.positions);
  let ds;
  try {
    ds = analyze_cell(moyoCell(s.cell, frac, siteTypes(s)), symprec, 'Spglib');
  } catch (e) {
    throw new Error(`symmetry: the space-group finder failed (${e instanceof Error ? e.message : String(e)}); try a larger or smaller symprec`);
  }
  const type = space_group_type(ds.number);
  return {
    number: ds.number,
    hmSymbol: type.hm_short,
    hallNumber: ds.hall_number,
    pointGroup: type.geometric_crystal_class,
    crystalSystem: type.crystal_system,
    operations: ds.operations.map((o) => ({ rotation: rowMajor(o.rotation), translation: [o.translation[0], o.translation[1], o.translation[2]] })),
    orbits: Array.from(ds.orbits),
    wyckoffs: Array.from(ds.wyckoffs),
    symprec,
    stdLinear: rowMajor(ds.std_linear),
    stdOriginShift: [ds.std_origin_shift[0], ds.std_origin_shift[1], ds.std_origin_shift[2]],
  };
}

/**
 * The provider the Check step takes: number and symbol, or null when the structure is not periodic, the
 * finder is not initialised or fails (a check must not throw for that).
 */
export function spaceGroupOf(s: Structure): { number: number; symbol: string } | null {
  if (!ready || !s.cell || s.species.length === 0) return null;
  try {
    const g = findSpaceGroup(s);
    return { number: g.number, symbol: g.hmSymbol };
  } catch {
    return null;
  }
}

/** x' = R·x + t for one fractional point. */
export function applyOperation(op: SymmetryOperation, x: number, y: number, z: number): [number, number, number] {
  const R = op.rotation;
  const t = op.translation;
  return [R[0] * x + R[1] * y + R[2] * z + t[0], R[3] * x + R[4] * y + R[5] * z + t[1], R[6] * x + R[7] * y + R[8] * z + t[2]];
}

/**
 * Snap a nearly symmetric cell onto its ideal positions: each atom moves to the average of the images
 * of its partners under every operation (the Reynolds average over the group, common practice in
 * symmetrisation tools), so the result is exactly invariant. The cell itself is kept as given. Returns a
 * new Structure and the space group found (with `symprec`).
 */
export function symmetrise(s: Structure, opts: SpaceGroupOptions = {}): { structure: Structure; spaceGroup: SpaceGroup; maxShift: number } {
  const g = findSpaceGroup(s, opts);
  const cell = s.cell!;
  const n = s.species.length;
  const frac = toFractional(cell, s.positions);
  const types = siteTypes(s);
  const tol = (opts.symprec ?? 1e-3) * 4;
  // Images of every atom under every op; partner j of image g·x_i: nearest atom of the same type.
  const acc = new Float64Array(3 * n);
  const out = new Float64Array(3 * n);
  const cellLen = [0, 1, 2].map((k) => Math.hypot(...cell[k]));
  // Spatial hash on fractional coordinates (about one atom per bin): partners are searched in the 27
  // neighbouring bins only, so the work is O(N·|G|).
  const nb = Math.max(1, Math.min(64, Math.floor(Math.cbrt(n))));
  const binOf = (x: number) => ((Math.floor((x - Math.floor(x)) * nb) % nb) + nb) % nb;
  const bins = new Map<number, number[]>();
  for (let j = 0; j < n; j++) {
    const k = (binOf(frac[3 * j]) * nb + binOf(frac[3 * j + 1])) * nb + binOf(frac[3 * j + 2]);
    const list = bins.get(k);
    if (list) list.push(j);
    else bins.set(k, [j]);
  }
  for (const op of g.operations) {
    // Inverse op maps x_j back near x_i: accumulate R⁻¹(x_j − t) for the partner j of g·x_i.
    for (let i = 0; i < n; i++) {
      const [u, v, w] = applyOperation(op, frac[3 * i], frac[3 * i + 1], frac[3 * i + 2]);
      let best = -1;
      let bestD = Infinity;
      let shift = [0, 0, 0];
      const bu = binOf(u);
      const bv = binOf(v);
      const bw = binOf(w);
      const seen = new Set<number>();
      for (let du = -1; du <= 1; du++)
        for (let dv = -1; dv <= 1; dv++)
          for (let dw = -1; dw <= 1; dw++) {
            const k = ((((bu + du) % nb) + nb) % nb * nb + ((((bv + dv) % nb) + nb) % nb)) * nb + ((((bw + dw) % nb) + nb) % nb);
            if (seen.has(k)) continue;
            seen.add(k);
            for (const j of bins.get(k) ?? []) {
              if (types[j] !== types[i]) continue;
              const d = [u - frac[3 * j], v - frac[3 * j + 1], w - frac[3 * j + 2]];
              const sh = d.map((x) => Math.round(x));
              const dd = Math.hypot((d[0] - sh[0]) * cellLen[0], (d[1] - sh[1]) * cellLen[1], (d[2] - sh[2]) * cellLen[2]);
              if (dd < bestD) {
                bestD = dd;
                best = j;
                shift = sh;
              }
            }
          }
      if (best < 0 || bestD > tol * 10 + 1e-6) throw new Error(`symmetrise: atom ${i + 1} has no partner under an operation of ${g.hmSymbol}; raise symprec`);
      // The partner's ideal image: x_j + shift, pulled back by the op onto atom i: R⁻¹(x_j + shift − t).
      const target = [frac[3 * best] + shift[0] - op.translation[0], frac[3 * best + 1] + shift[1] - op.translation[1], frac[3 * best + 2] + shift[2] - op.translation[2]];
      const inv = invertInt(op.rotation);
      for (let r = 0; r < 3; r++) acc[3 * i + r] += inv[3 * r] * target[0] + inv[3 * r + 1] * target[1] + inv[3 * r + 2] * target[2];
    }
  }
  const m = g.operations.length;
  for (let k = 0; k < 3 * n; k++) out[k] = acc[k] / m;
  const positions = toCartesian(cell, out);
  let maxShift = 0;
  for (let i = 0; i < n; i++) maxShift = Math.max(maxShift, Math.hypot(positions[3 * i] - s.positions[3 * i], positions[3 * i + 1] - s.positions[3 * i + 1], positions[3 * i + 2] - s.positions[3 * i + 2]));
  const notes = [...(s.notes ?? []), `symmetrised to ${g.hmSymbol} (No. ${g.number}) with symprec ${g.symprec} Å: largest move ${maxShift.toExponential(2)} Å`];
  return { structure: { ...s, positions, notes }, spaceGroup: g, maxShift };
}

/** Inverse of an integer 3×3 matrix of determinant ±1 (row-major), by the adjugate. */
function invertInt(a: number[]): number[] {
  const [a0, a1, a2, a3, a4, a5, a6, a7, a8] = a;
  const det = a0 * (a4 * a8 - a5 * a7) - a1 * (a3 * a8 - a5 * a6) + a2 * (a3 * a7 - a4 * a6);
  return [
    (a4 * a8 - a5 * a7) / det, (a2 * a7 - a1 * a8) / det, (a1 * a5 - a2 * a4) / det,
    (a5 * a6 - a3 * a8) / det, (a0 * a8 - a2 * a6) / det, (a2 * a3 - a0 * a5) / det,
    (a3 * a7 - a4 * a6) / det, (a1 * a6 - a0 * a7) / det, (a0 * a4 - a1 * a3) / det,
  ];
}

function nearInteger(x: number, tol = 1e-6): boolean {
  return Math.abs(x - Math.round(x)) < tol;
}

/**
 * The structure moved so that its space group appears in the standard setting of the International
 * Tables (only the origin moves; the cell is kept, so this needs a standard-oriented cell, as every cubic
 * approximant is): its operations are then the tabulated ones and a CIF reader can match them to the
 * H-M symbol. Returns null when the cell itself is not in a standard orientation.
 */
export function inStandardOrigin(s: Structure, opts: SpaceGroupOptions = {}): { structure: Structure; spaceGroup: SpaceGroup } | null {
  const g = findSpaceGroup(s, opts);
  if (matchesTables(g)) return { structure: s, spaceGroup: g };
  const cell = s.cell!;
  const L = g.stdLinear;
  // The linear part may be a change of axes; allowed only when it maps the cell metric onto itself
  // (G' = Lᵀ·G·L = G, e.g. a signed permutation of a cubic cell), so keeping the cell is an isometry.
  if (!L.every((x) => nearInteger(x, 1e-9))) return null;
  const G = [0, 1, 2].map((i) => [0, 1, 2].map((j) => cell[i][0] * cell[j][0] + cell[i][1] * cell[j][1] + cell[i][2] * cell[j][2]));
  const scale = Math.max(G[0][0], G[1][1], G[2][2]);
  for (let i = 0; i < 3; i++)
    for (let j = 0; j < 3; j++) {
      let v = 0;
      for (let k = 0; k < 3; k++) for (let l = 0; l < 3; l++) v += L[3 * k + i] * G[k][l] * L[3 * l + j];
      if (Math.abs(v - G[i][j]) > 1e-9 * scale) return null;
    }
  const frac0 = toFractional(cell, s.positions);
  const o = g.stdOriginShift;
  // moyo's convention for (L, o) is tried both ways round: x' = L·x ± o and x' = L·(x ± o).
  for (const [sign, after] of [[1, true], [-1, true], [1, false], [-1, false]] as [number, boolean][]) {
    const frac = new Float64Array(frac0.length);
    for (let i = 0; i < frac0.length; i += 3) {
      const x = after ? [frac0[i], frac0[i + 1], frac0[i + 2]] : [0, 1, 2].map((k) => frac0[i + k] + sign * o[k]);
      for (let r = 0; r < 3; r++) {
        let v = L[3 * r] * x[0] + L[3 * r + 1] * x[1] + L[3 * r + 2] * x[2] + (after ? sign * o[r] : 0);
        v -= Math.floor(v);
        frac[i + r] = v >= 1 - 1e-12 ? 0 : v;
      }
    }
    const moved: Structure = { ...s, positions: toCartesian(cell, frac) };
    const g2 = findSpaceGroup(moved, opts);
    if (g2.number === g.number && matchesTables(g2)) return { structure: moved, spaceGroup: g2 };
  }
  return null;
}

/** Are the operations exactly the tabulated ones of this Hall setting (translations modulo 1)? */
export function matchesTables(g: SpaceGroup): boolean {
  const table = operations_from_number(g.number, { type: 'HallNumber', value: g.hallNumber }, false);
  if (table.length !== g.operations.length) return false;
  const key = (rot: ArrayLike<number>, t: ArrayLike<number>) =>
    `${Array.from(rot).join(',')}|${[0, 1, 2].map((k) => {
      const x = t[k] - Math.floor(t[k] + 1e-6);
      if (Math.abs(x - Math.round(x * 24) / 24) > 1e-5) return `?${x.toFixed(6)}`;
      return Math.round(x * 24) % 24;
    }).join(',')}`;
  const want = new Set(table.map((o) => key(rowMajor(o.rotation), o.translation)));
  return g.operations.every((o) => want.has(key(o.rotation, o.translation)));
}

/** Default tolerance of the snap offered in the workspace: 0.01 Å, ten times the finder's strict 1e-3 Å. */
export const SNAP_SYMPREC = 0.01;

/** A group in brief: number, symbol and its order in the given cell (operations incl. centring translations). */
export interface GroupBrief {
  number: number;
  symbol: string;
  order: number;
}

/**
 * Is the cell nearly but not exactly symmetric? The group at the strict tolerance and at a looser one; `higher`
 * when the looser tolerance finds more operations (a snap would raise the symmetry). Null for a cell-less or empty
 * structure or when the finder is not ready or fails.
 */
export function nearSymmetry(s: Structure, loose = SNAP_SYMPREC, strict = 1e-3): { strict: GroupBrief; loose: GroupBrief; higher: boolean } | null {
  if (!ready || !s.cell || s.species.length === 0) return null;
  try {
    const a = findSpaceGroup(s, { symprec: strict });
    const b = findSpaceGroup(s, { symprec: loose });
    const brief = (g: SpaceGroup): GroupBrief => ({ number: g.number, symbol: g.hmSymbol, order: g.operations.length });
    return { strict: brief(a), loose: brief(b), higher: b.operations.length > a.operations.length };
  } catch {
    return null;
  }
}
