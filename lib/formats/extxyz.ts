import { ENGINE_VERSION } from '../version';
import { symbolOf } from '../structure/elements';
import type { Cell, Structure } from '../structure/types';
import { perpDimension, validateStructure } from '../structure/validate';
import { FormatError, splitLines } from './errors';
import { canonicalJson } from './canonical-json';
import { fixed, parseNumber } from './number';
import { atomContributions } from '../structure/checks/weights';
import { parseSpeciesToken } from './xyz';

const F = 'extended XYZ';

/** Quote a value for the extended XYZ comment line: backslash and double quote escaped. */
function quote(v: string): string {
  return `"${v.replace(/\\/g, '\\\\').replace(/"/g, '\\"')}"`;
}

/** Rows of the file: one per atom, or one per element of a mixed site (same position, its fraction as occupancy). */
interface Row {
  atom: number;
  z: number;
  occupancy: number;
}

function rows(s: Structure): { rows: Row[]; partial: boolean } {
  const out: Row[] = [];
  let partial = !!s.occupancy;
  for (let i = 0; i < s.species.length; i++) {
    const c = s.siteClasses && s.site ? atomContributions(s, i) : [[s.species[i], s.occupancy ? s.occupancy[i] : 1] as [number, number]];
    for (const [z, w] of c) {
      out.push({ atom: i, z, occupancy: w });
      if (Math.abs(w - 1) > 1e-12) partial = true;
    }
  }
  return { rows: out, partial };
}

/**
 * Extended XYZ (the key=value comment-line convention read by ase.io.extxyz):
 * `Lattice="ax ay az bx by bz cx cy cz" Properties=species:S:1:pos:R:3[:site:I:1][:occupancy:R:1][:perp:R:d]
 *  pbc="T T T" engine="…" [check="…"] params="<json>"`. Lattice and pbc="T T T" only for periodic structures
 * (pbc="F F F" otherwise). Columns follow Properties in order; 8 decimals for lengths.
 * Partial and mixed sites: an occupancy column, and a mixed site written as one row per element at the same
 * position with that element's fraction (times the site occupancy) — the way a CIF lists a mixed site
 * (IUCr CIF core, _atom_site_occupancy), so the file says what the site holds instead of its majority element.
 */
export function writeExtxyz(s: Structure, opts: { check?: string } = {}): string {
  validateStructure(s);
  const d = perpDimension(s);
  const { rows: table, partial } = rows(s);
  let props = 'species:S:1:pos:R:3';
  if (s.site) props += ':site:I:1';
  if (partial) props += ':occupancy:R:1';
  if (s.perp && d > 0) props += `:perp:R:${d}`;
  const head: string[] = [];
  if (s.cell) head.push(`Lattice="${s.cell.flatMap((v) => v.map((x) => fixed(x))).join(' ')}"`);
  head.push(`Properties=${props}`);
  head.push(s.cell ? 'pbc="T T T"' : 'pbc="F F F"');
  head.push(`engine=${quote(s.provenance.engine || ENGINE_VERSION)}`);
  if (opts.check) head.push(`check=${quote(opts.check.replace(/[\r\n]+/g, ' '))}`);
  head.push(`params=${quote(canonicalJson(s.provenance.params ?? null))}`);
  const out: string[] = [String(table.length), head.join(' ')];
  const p = s.positions;
  for (const { atom: i, z, occupancy } of table) {
    let line = `${symbolOf(z).padEnd(2)} ${fixed(p[3 * i])} ${fixed(p[3 * i + 1])} ${fixed(p[3 * i + 2])}`;
    if (s.site) line += ` ${s.site[i]}`;
    if (partial) line += ` ${fixed(occupancy, 6)}`;
    if (s.perp && d > 0) for (let k = 0; k < d; k++) line += ` ${fixed(s.perp[d * i + k])}`;
    out.push(line);
  }
  return out.join('\n') + '\n';
}

/** Parse `key=value key="quoted value" key={a b c} flag` into a map (keys case-preserved). */
export function parseKeyValues(line: string, lineNo: number): Map<string, string> {
  const out = new Map<string, string>();
  let i = 0;
  const L = line.length;
  const readToken = (): string => {
    if (line[i] === '"') {
      i++;
      let v = '';
      while (i < L && line[i] !== '"') {
        if (line[i] === '\\' && i + 1 < L) {
          i++;
          v += line[i] === 'n' ? '\n' : line[i];
        } else v += line[i];
        i++;
      }
      if (i >= L) throw new FormatError(F, 'unterminated quoted value in the comment line', lineNo);
      i++;
      return v;
    }
    if (line[i] === '{') {
      const end = line.indexOf('}', i);
      if (end < 0) throw new FormatError(F, 'unterminated {…} value in the comment line', lineNo);
      const v = line.slice(i + 1, end);
      i = end + 1;
      return v;
    }
    const start = i;
    while (i < L && !/[\s=]/.test(line[i])) i++;
    return line.slice(start, i);
  };
  while (i < L) {
    while (i < L && /\s/.test(line[i])) i++;
    if (i >= L) break;
    const key = readToken();
    while (i < L && line[i] === ' ') i++;
    if (line[i] === '=') {
      i++;
      while (i < L && line[i] === ' ') i++;
      out.set(key, readToken());
    } else {
      out.set(key, 'T');
    }
  }
  return out;
}

interface Column {
  name: string;
  type: 'S' | 'R' | 'I' | 'L';
  count: number;
}

function parseProperties(v: string, lineNo: number): Column[] {
  const parts = v.split(':');
  if (parts.length % 3 !== 0) throw new FormatError(F, `Properties="${v}" is not name:type:count triples`, lineNo);
  const cols: Column[] = [];
  for (let k = 0; k < parts.length; k += 3) {
    const type = parts[k + 1].toUpperCase();
    const count = Number(parts[k + 2]);
    if (!['S', 'R', 'I', 'L'].includes(type) || !Number.isInteger(count) || count < 1) {
      throw new FormatError(F, `Properties entry "${parts.slice(k, k + 3).join(':')}" needs a type S/R/I/L and a count ≥ 1`, lineNo);
    }
    cols.push({ name: parts[k], type: type as Column['type'], count });
  }
  return cols;
}

/**
 * Read the first frame of an extended XYZ file. Understands Lattice, pbc, Properties (species or Z,
 * pos, site, occupancy, perp; other columns are skipped) and our engine/params keys.
 */
export function readExtxyz(text: string): Structure {
  const lines = splitLines(text);
  let first = 0;
  while (first < lines.length && lines[first].trim() === '') first++;
  if (first >= lines.length) throw new FormatError(F, 'the file is empty');
  const countTok = lines[first].trim();
  if (!/^\d+$/.test(countTok)) throw new FormatError(F, `expected the number of atoms, found "${countTok}"`, first + 1);
  const n = Number(countTok);
  const headNo = first + 2;
  if (first + 1 >= lines.length) throw new FormatError(F, 'missing comment line', headNo);
  const kv = parseKeyValues(lines[first + 1], headNo);
  const get = (k: string) => {
    for (const [key, v] of kv) if (key.toLowerCase() === k.toLowerCase()) return v;
    return undefined;
  };
  const cols = parseProperties(get('Properties') ?? 'species:S:1:pos:R:3', headNo);
  const pbcText = get('pbc');
  const lattice = get('Lattice');
  let cell: Cell | undefined;
  if (lattice !== undefined) {
    const v = lattice.trim().split(/\s+/).map(parseNumber);
    if (v.length !== 9 || !v.every(Number.isFinite)) throw new FormatError(F, 'Lattice must hold 9 numbers', headNo);
    cell = [
      [v[0], v[1], v[2]],
      [v[3], v[4], v[5]],
      [v[6], v[7], v[8]],
    ];
  }
  const periodic = pbcText === undefined ? cell !== undefined : /T/i.test(pbcText);
  if (periodic && !cell) throw new FormatError(F, 'pbc is true but no Lattice is given', headNo);

  const available = lines.length - (first + 2);
  if (available < n) throw new FormatError(F, `the count line says ${n} atoms but only ${Math.max(0, available)} atom lines follow`, lines.length + 1);
  const width = cols.reduce((a, c) => a + c.count, 0);
  const positions = new Float64Array(3 * n);
  const species = new Uint16Array(n);
  const has = (name: string) => cols.some((c) => c.name === name);
  if (!has('pos')) throw new FormatError(F, 'Properties has no pos column', headNo);
  if (!has('species') && !has('Z')) throw new FormatError(F, 'Properties has no species (or Z) column', headNo);
  const siteCol = cols.find((c) => c.name === 'site');
  const perpCol = cols.find((c) => c.name === 'perp');
  const site = siteCol ? new Uint16Array(n) : undefined;
  const occupancy = has('occupancy') ? new Float64Array(n) : undefined;
  const perp = perpCol ? new Float64Array(perpCol.count * n) : undefined;
  const hasSpecies = has('species');
  for (let i = 0; i < n; i++) {
    const ln = first + 3 + i;
    const tok = lines[ln - 1].trim().split(/\s+/);
    if (tok.length !== width) throw new FormatError(F, `expected ${width} columns (${cols.map((c) => c.name).join(', ')}), found ${tok.length}`, ln);
    let j = 0;
    for (const c of cols) {
      const slice = tok.slice(j, j + c.count);
      j += c.count;
      const nums = () =>
        slice.map((t, k) => {
          const v = parseNumber(t);
          if (!Number.isFinite(v)) throw new FormatError(F, `${c.name}${c.count > 1 ? `[${k}]` : ''} "${t}" is not a number`, ln);
          return v;
        });
      if (c.name === 'species' || (c.name === 'Z' && !hasSpecies)) species[i] = parseSpeciesToken(F, slice[0], ln);
      else if (c.name === 'pos') {
        if (c.count !== 3) throw new FormatError(F, 'pos must have 3 components', headNo);
        positions.set(nums(), 3 * i);
      } else if (c.name === 'site' && site) {
        const v = nums()[0];
        if (!Number.isInteger(v) || v < 0 || v > 65535) throw new FormatError(F, `site "${slice[0]}" is not a site index`, ln);
        site[i] = v;
      } else if (c.name === 'occupancy' && occupancy) occupancy[i] = nums()[0];
      else if (c.name === 'perp' && perp) perp.set(nums(), c.count * i);
    }
  }
  const engine = get('engine');
  const paramsText = get('params');
  let params: unknown = { source: 'extxyz', comment: lines[first + 1].trim() };
  if (engine !== undefined && paramsText !== undefined) {
    try {
      params = JSON.parse(paramsText);
    } catch {
      // not our params: keep the description
    }
  }
  const s: Structure = { positions, species, provenance: { engine: engine ?? ENGINE_VERSION, params } };
  if (periodic && cell) s.cell = cell;
  if (site) s.site = site;
  if (occupancy) s.occupancy = occupancy;
  if (perp && perpCol) {
    s.perp = perp;
    s.perpDim = perpCol.count;
  }
  return s;
}
