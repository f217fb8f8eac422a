import { ENGINE_VERSION } from '../version';
import { cellFromParameters, cellParameters, cellVolume } from '../math/cell';
import { toCartesian, toFractional } from '../math/frac';
import { identity } from '../math/mat3';
import { forEachPairWithin } from '../math/cell-list';
import { symbolOf, tryAtomicNumber } from '../structure/elements';
import type { Cell, Structure } from '../structure/types';
import { validateStructure } from '../structure/validate';
import { cifNumber, findLoop, parseCif, type CifBlock, type CifValue } from './cif-syntax';
import { FormatError } from './errors';
import { canonicalJson } from './canonical-json';
import { fixed } from './number';
import { applySymop, parseSymop, type SymOp } from './symop';

export interface CifWriteOptions {
  /** Name after data_ (letters, digits, _ - . only; default "tauforge"). */
  blockName?: string;
  /**
   * Non-periodic structures have no cell, and a CIF needs one. By default writeCif refuses them.
   * Give a padding in Å to wrap a finite patch in an orthorhombic box: the box spans the bounding
   * box of the atoms plus this padding on every side, and the atoms are shifted so the bounding
   * box's low corner sits at (padding, padding, padding). The box is a container, not a lattice.
   */
  boxPadding?: number;
  /**
   * Unassigned vertices (species 0). 'dummy' (default) writes them with type symbol X and labels X1, X2…,
   * the common convention for dummy atoms, which ase reads as element X (Z = 0); 'omit' leaves them out;
   * 'error' refuses.
   */
  unassigned?: 'dummy' | 'omit' | 'error';
  /** Write B_iso (Å²) instead of U_iso = B/(8π²). Default false (U_iso_or_equiv). */
  biso?: boolean;
  /**
   * The space group to write (lib/structure/symmetry.ts `inStandardOrigin` gives one whose operations
   * act on this structure's fractional coordinates): H-M symbol and number, the operation list and one
   * atom per orbit (the asymmetric unit). Absent: P 1 with every atom.
   */
  symmetry?: CifSymmetry;
}

/** What writeCif needs of a space group. */
export interface CifSymmetry {
  number: number;
  hmSymbol: string;
  /** x' = R·x + t on fractional coordinates, R row-major. */
  operations: { rotation: number[]; translation: [number, number, number] }[];
  /** Per atom: index of its orbit's representative. */
  orbits: number[];
}

/** A fraction with denominator ≤ 12 ('1/2', '-1/3'), else a decimal. */
function fractionText(t: number): string {
  for (const d of [1, 2, 3, 4, 6, 8, 12]) {
    const n = Math.round(t * d);
    if (Math.abs(t * d - n) < 1e-6) return n === 0 ? '' : d === 1 ? String(n) : `${n}/${d}`;
  }
  return fixed(t, 6);
}

/** 'x,y,z' text of one operation (International Tables notation), translations reduced into [0, 1). */
export function symopText(rotation: number[], translation: ArrayLike<number>): string {
  const parts: string[] = [];
  for (let r = 0; r < 3; r++) {
    let term = '';
    for (let c = 0; c < 3; c++) {
      const v = Math.round(rotation[3 * r + c]);
      if (v === 0) continue;
      const sign = v < 0 ? '-' : term ? '+' : '';
      term += `${sign}${Math.abs(v) === 1 ? '' : Math.abs(v)}${'xyz'[c]}`;
    }
    let t = translation[r] - Math.floor(translation[r]);
    if (t > 1 - 1e-9) t = 0;
    const ft = fractionText(t);
    parts.push(ft ? `${term}+${ft}` : term || '0');
  }
  return parts.join(',');
}

/** Quote a CIF value when it needs it (whitespace, leading special characters, empty). */
function cifText(v: string): string {
  if (v !== '' && !/[\s'"]/.test(v) && !/^[_#$;[\]]/.test(v) && !/^(data_|loop_|save_|global_|stop_)/i.test(v) && v !== '?' && v !== '.') {
    return v;
  }
  if (!v.includes("'") && !/\n/.test(v)) return `'${v}'`;
  return `\n;${v}\n;`;
}

/**
 * CIF 1.1 in space group P 1: cell lengths and angles from the cell vectors, the identity symop,
 * and a full _atom_site_ loop (label, type_symbol, fract_x/y/z, occupancy, U_iso_or_equiv or B_iso).
 * Fractional coordinates are not wrapped into [0, 1), so the file keeps the positions as they are.
 * A CIF carries no orientation: a reader rebuilds the cell with a along x and b in the xy plane.
 * Provenance goes into _audit_creation_method and a _tauforge_params text field (compact JSON).
 */
export function writeCif(s: Structure, opts: CifWriteOptions = {}): string {
  validateStructure(s);
  const n = s.species.length;
  let cell: Cell;
  let positions = s.positions;
  if (s.cell) {
    cell = s.cell;
  } else if (opts.boxPadding !== undefined) {
    const pad = opts.boxPadding;
    if (!(pad >= 0) || !Number.isFinite(pad)) throw new Error(`CIF: boxPadding must be a non-negative number of Å, got ${pad}`);
    const lo = [Infinity, Infinity, Infinity];
    const hi = [-Infinity, -Infinity, -Infinity];
    for (let i = 0; i < n; i++) {
      for (let k = 0; k < 3; k++) {
        lo[k] = Math.min(lo[k], s.positions[3 * i + k]);
        hi[k] = Math.max(hi[k], s.positions[3 * i + k]);
      }
    }
    if (n === 0) {
      lo.fill(0);
      hi.fill(0);
    }
    const len = lo.map((l, k) => hi[k] - l + 2 * pad);
    if (len.some((l) => !(l > 0))) throw new Error('CIF: the wrapping box has zero size; give a positive boxPadding');
    cell = [
      [len[0], 0, 0],
      [0, len[1], 0],
      [0, 0, len[2]],
    ];
    positions = new Float64Array(s.positions.length);
    for (let i = 0; i < n; i++) for (let k = 0; k < 3; k++) positions[3 * i + k] = s.positions[3 * i + k] - lo[k] + pad;
  } else {
    throw new Error(
      'CIF: this structure is not periodic (no cell). Export it as XYZ or extended XYZ, or pass boxPadding to wrap the patch in a box.',
    );
  }
  if (Math.abs(cellVolume(cell)) < 1e-9) throw new Error('CIF: the cell has zero volume');
  const mode = opts.unassigned ?? 'dummy';
  if (mode === 'error' && s.species.some((z) => z === 0)) {
    throw new Error('CIF: the structure has unassigned vertices (species 0); decorate it first or choose unassigned: "dummy" | "omit"');
  }
  const name = (opts.blockName ?? 'tauforge').replace(/[^A-Za-z0-9_.-]/g, '_') || 'tauforge';
  const p = cellParameters(cell);
  const frac = toFractional(cell, positions);
  const out: string[] = [
    `# Written by Tauforge (${s.provenance.engine || ENGINE_VERSION})`,
    `data_${name}`,
    `_audit_creation_method ${cifText(`Tauforge ${s.provenance.engine || ENGINE_VERSION}`)}`,
    `_tauforge_params`,
    ';',
    canonicalJson(s.provenance.params ?? null).replace(/\n;/g, '\n ;'),
    ';',
    `_cell_length_a ${fixed(p.a)}`,
    `_cell_length_b ${fixed(p.b)}`,
    `_cell_length_c ${fixed(p.c)}`,
    `_cell_angle_alpha ${fixed(p.alpha)}`,
    `_cell_angle_beta ${fixed(p.beta)}`,
    `_cell_angle_gamma ${fixed(p.gamma)}`,
    `_cell_volume ${fixed(Math.abs(cellVolume(cell)), 4)}`,
    ...symmetryLines(opts.symmetry),
    'loop_',
    '_atom_site_label',
    '_atom_site_type_symbol',
    '_atom_site_fract_x',
    '_atom_site_fract_y',
    '_atom_site_fract_z',
    '_atom_site_occupancy',
    opts.biso ? '_atom_site_B_iso_or_equiv' : '_atom_site_U_iso_or_equiv',
    '_atom_site_adp_type',
  ];
  if (opts.symmetry && opts.symmetry.orbits.length !== n) throw new Error(`CIF: the space group's orbits list ${opts.symmetry.orbits.length} atoms, the structure has ${n}`);
  const counter = new Map<number, number>();
  const label = (z: number) => {
    const k = (counter.get(z) ?? 0) + 1;
    counter.set(z, k);
    return `${symbolOf(z)}${k}`;
  };
  const sym = opts.symmetry;
  for (let i = 0; i < n; i++) {
    if (sym && sym.orbits[i] !== i) continue; // asymmetric unit: one atom per orbit
    const z = s.species[i];
    if (z === 0 && mode === 'omit') continue;
    const cls = s.site && s.siteClasses ? s.siteClasses[s.site[i]] : undefined;
    const occ = s.occupancy ? s.occupancy[i] : (cls?.occupancy ?? 1);
    const b = cls?.biso ?? 0;
    // U = B / (8π²): International Tables Vol. C §8.7 (Trueblood et al., Acta Cryst. A52 (1996) 770).
    const adp = opts.biso ? fixed(b, 6) : fixed(b / (8 * Math.PI * Math.PI), 6);
    const xyz = [0, 1, 2].map((c) => {
      const f = frac[3 * i + c];
      if (!sym) return fixed(f);
      const w = f - Math.floor(f);
      return fixed(w >= 1 - 1e-12 ? 0 : w);
    });
    // Mixed site: one row per element at the same position, occupancy = fraction × site occupancy
    // (IUCr CIF core dictionary, _atom_site_occupancy). Fractions of a mix sum to ≤ 1 (SiteClass.mix).
    const mix = cls?.mix ? Object.entries(cls.mix).map(([zz, x]) => [Number(zz), x] as [number, number]).filter(([, x]) => x > 0) : null;
    const rows: [number, number][] = mix && mix.length > 0 ? mix.sort((a, c) => c[1] - a[1] || a[0] - c[0]) : [[z, 1]];
    for (const [el, x] of rows) {
      const symbol = symbolOf(el);
      out.push(`${label(el)} ${symbol} ${xyz[0]} ${xyz[1]} ${xyz[2]} ${fixed(occ * x, 6)} ${adp} ${opts.biso ? 'Biso' : 'Uiso'}`);
    }
  }
  return out.join('\n') + '\n';
}

/** Space-group header and symop loop: P 1 with the identity, or the given group. */
function symmetryLines(sym: CifSymmetry | undefined): string[] {
  const hm = sym ? sym.hmSymbol : 'P 1';
  const num = sym ? sym.number : 1;
  const ops = sym ? sym.operations.map((o) => symopText(o.rotation, o.translation)) : ['x,y,z'];
  return [
    `_symmetry_space_group_name_H-M ${cifText(hm)}`,
    `_space_group_name_H-M_alt ${cifText(hm)}`,
    `_symmetry_Int_Tables_number ${num}`,
    `_space_group_IT_number ${num}`,
    'loop_',
    '_space_group_symop_id',
    '_space_group_symop_operation_xyz',
    ...ops.map((t, k) => `${k + 1} '${t}'`),
  ];
}

export interface CifReadOptions {
  /** Which data block to read (name after data_); default the first block with atom sites. */
  block?: string;
  /** Two images of the same atom site closer than this (Å) are one atom on a special position. Default 0.01 Å. */
  mergeTolerance?: number;
}

const F = 'CIF';

/** Element from _atom_site_type_symbol or the label: leading letters, charge and digits dropped ("Fe3+" → Fe, "O2-" → O, "Al1" → Al). */
function elementOf(v: CifValue): number {
  const m = /^([A-Za-z]{1,2})/.exec(v.text);
  if (m) {
    const two = m[1].length === 2 ? tryAtomicNumber(m[1]) : undefined;
    if (two !== undefined) return two;
    const one = tryAtomicNumber(m[1][0]);
    if (one !== undefined) return one;
  }
  throw new FormatError(F, `atom site type "${v.text}" is not a known element`, v.line);
}

/**
 * Read one data block of a CIF 1.1 file. Symmetry operations come from
 * _space_group_symop_operation_xyz or _symmetry_equiv_pos_as_xyz; every atom site is expanded by
 * them, images are wrapped into [0, 1) and images closer than mergeTolerance are dropped (special
 * positions). With only the identity (P 1) the coordinates are kept as written. Cell vectors are
 * rebuilt from lengths and angles (a along x, b in the xy plane).
 */
export function readCif(text: string, opts: CifReadOptions = {}): Structure {
  const blocks = parseCif(text);
  if (blocks.length === 0) throw new FormatError(F, 'no data_ block found');
  let block: CifBlock | undefined;
  if (opts.block !== undefined) {
    block = blocks.find((b) => b.name.toLowerCase() === opts.block!.toLowerCase());
    if (!block) throw new FormatError(F, `no data block named "${opts.block}" (have: ${blocks.map((b) => b.name).join(', ')})`);
  } else {
    block = blocks.find((b) => findLoop(b, '_atom_site_fract_x')) ?? blocks[0];
  }
  const cellTags = ['a', 'b', 'c'].map((x) => `_cell_length_${x}`).concat(['alpha', 'beta', 'gamma'].map((x) => `_cell_angle_${x}`));
  const cp = cellTags.map((t) => {
    const v = block!.items.get(t);
    const x = cifNumber(v);
    if (v === undefined) throw new FormatError(F, `missing cell data: ${t} (data_${block!.name})`, block!.line);
    if (!(x > 0)) throw new FormatError(F, `${t} "${v.text}" is not a positive number`, v.line);
    return x;
  });
  let cell: Cell;
  try {
    cell = cellFromParameters({ a: cp[0], b: cp[1], c: cp[2], alpha: cp[3], beta: cp[4], gamma: cp[5] });
  } catch (e) {
    throw new FormatError(F, (e as Error).message, block.items.get('_cell_angle_alpha')?.line);
  }

  const ops = readSymops(block);
  const fx = findLoop(block, '_atom_site_fract_x');
  if (!fx) throw new FormatError(F, `no _atom_site_fract_x loop in data_${block.name}`, block.line);
  const loop = fx.loop;
  const col = (t: string) => loop.tags.indexOf(t);
  const cx = fx.col;
  const cy = col('_atom_site_fract_y');
  const cz = col('_atom_site_fract_z');
  if (cy < 0 || cz < 0) throw new FormatError(F, 'the atom site loop needs _atom_site_fract_y and _atom_site_fract_z', loop.line);
  const cType = col('_atom_site_type_symbol');
  const cLabel = col('_atom_site_label');
  if (cType < 0 && cLabel < 0) throw new FormatError(F, 'the atom site loop needs _atom_site_type_symbol or _atom_site_label', loop.line);
  const cOcc = col('_atom_site_occupancy');
  const cU = col('_atom_site_u_iso_or_equiv');
  const cB = col('_atom_site_b_iso_or_equiv');

  const tol = opts.mergeTolerance ?? 0.01;
  const identityOnly = ops.length === 1 && isIdentity(ops[0]);
  const fr: number[] = [];
  const species: number[] = [];
  const occ: number[] = [];
  const site: number[] = [];
  const classes: Structure['siteClasses'] = [];
  let anyPartial = false;
  for (const row of loop.rows) {
    const typeOk = cType >= 0 && !(row[cType].text === '?' || row[cType].text === '.');
    if (!typeOk && cLabel < 0) throw new FormatError(F, 'atom site has no type symbol and no label', row[cx].line);
    const typeV = row[typeOk ? cType : cLabel];
    const z = elementOf(typeV);
    const f = [cx, cy, cz].map((c, k) => {
      const x = cifNumber(row[c]);
      if (!Number.isFinite(x)) throw new FormatError(F, `fract_${'xyz'[k]} "${row[c].text}" is not a number`, row[c].line);
      return x;
    });
    const o = cOcc >= 0 && Number.isFinite(cifNumber(row[cOcc])) ? cifNumber(row[cOcc]) : 1;
    if (o < 0 || o > 1 + 1e-6) throw new FormatError(F, `occupancy "${row[cOcc].text}" is outside 0..1`, row[cOcc].line);
    if (o < 1) anyPartial = true;
    let biso = 0;
    if (cU >= 0 && Number.isFinite(cifNumber(row[cU]))) biso = cifNumber(row[cU]) * 8 * Math.PI * Math.PI;
    else if (cB >= 0 && Number.isFinite(cifNumber(row[cB]))) biso = cifNumber(row[cB]);
    const label = cLabel >= 0 ? row[cLabel].text : `${symbolOf(z)}${classes.length + 1}`;
    const cls = classes.length;
    classes.push({ name: label, species: z, ...(o !== 1 ? { occupancy: o } : {}), ...(biso !== 0 ? { biso } : {}) });
    const images = siteImages(ops, f, cell, tol, identityOnly);
    for (const g of images) {
      fr.push(g[0], g[1], g[2]);
      species.push(z);
      occ.push(o);
      site.push(cls);
    }
  }
  const positions = toCartesian(cell, Float64Array.from(fr));
  const s: Structure = {
    positions,
    species: Uint16Array.from(species),
    site: Uint16Array.from(site),
    siteClasses: classes,
    cell,
    provenance: { engine: ENGINE_VERSION, params: { source: 'cif', block: block.name } },
  };
  if (anyPartial) s.occupancy = Float64Array.from(occ);
  const audit = block.items.get('_audit_creation_method');
  const params = block.items.get('_tauforge_params');
  if (audit && params && /^Tauforge /.test(audit.text)) {
    try {
      s.provenance = { engine: audit.text.slice('Tauforge '.length), params: JSON.parse(params.text) };
    } catch {
      // keep the file description
    }
  }
  if (classes.length > 65535) throw new FormatError(F, 'more than 65535 atom sites', loop.line);
  return s;
}

function isIdentity(op: SymOp): boolean {
  const I = identity();
  return op.rot.every((row, i) => row.every((x, k) => x === I[i][k])) && op.trans.every((t) => t === 0);
}

/**
 * Every image of one atom site under the operations, wrapped into [0, 1), with images closer than tol
 * (special positions) kept once: the first in operation order. Linear in the number of operations: the
 * close pairs come from the periodic cell list (lib/math/cell-list.ts), not from comparing every pair.
 */
function siteImages(ops: SymOp[], f: number[], cell: Cell, tol: number, identityOnly: boolean): number[][] {
  const all: number[][] = ops.map((op) => {
    const g = applySymop(op, f[0], f[1], f[2]);
    return identityOnly ? g : g.map((x) => x - Math.floor(x)).map((x) => (x >= 1 - 1e-12 ? 0 : x));
  });
  if (all.length === 1) return all;
  const frac = Float64Array.from(all.flat());
  const neighbours: number[][] = all.map(() => []);
  forEachPairWithin(toCartesian(cell, frac), cell, tol, (i, j) => {
    if (i !== j) neighbours[Math.max(i, j)].push(Math.min(i, j));
  });
  const kept = new Uint8Array(all.length);
  const out: number[][] = [];
  for (let j = 0; j < all.length; j++) {
    if (neighbours[j].some((i) => kept[i])) continue;
    kept[j] = 1;
    out.push(all[j]);
  }
  return out;
}

function readSymops(block: CifBlock): SymOp[] {
  for (const tag of ['_space_group_symop_operation_xyz', '_symmetry_equiv_pos_as_xyz']) {
    const found = findLoop(block, tag);
    const values: CifValue[] = found ? found.loop.rows.map((r) => r[found.col]) : block.items.has(tag) ? [block.items.get(tag)!] : [];
    if (values.length === 0) continue;
    return values.map((v) => {
      try {
        return parseSymop(v.text);
      } catch (e) {
        throw new FormatError(F, (e as Error).message, v.line);
      }
    });
  }
  const hm = block.items.get('_symmetry_space_group_name_h-m') ?? block.items.get('_space_group_name_h-m_alt');
  if (hm && hm.text.replace(/\s+/g, '').toUpperCase() !== 'P1') {
    throw new FormatError(
      F,
      `space group '${hm.text}' is given without its symmetry operations (_space_group_symop_operation_xyz); add them to expand the atoms`,
      hm.line,
    );
  }
  return [parseSymop('x,y,z')];
}
